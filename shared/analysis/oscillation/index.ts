/*
 * Ripple on a trace: frequency f, decay time τ and amplitude A of a damped oscillation riding on a pulse,
 * estimated two ways side by side, each with a 1σ uncertainty.
 *
 * 1. Envelope removal (envelope-basis.ts): a smooth curve (cubic B-spline) with dense knots over the
 *    largest pulse (cut-off 4/FWHM by default, or the user's) and sparse knots elsewhere, fitted together
 *    with the ripple so that the ripple is not taken for envelope nor the envelope for ripple.
 * 2. Damped-sine fit (damped-sine-fit.ts): y = envelope + e^{−t/τ}(a cos 2πft + b sin 2πft), least
 *    squares by variable projection and Levenberg–Marquardt; covariance scaled by the noise level at f.
 * 3. Spectrum (spectral-line.ts): of the trace minus the fitted envelope; peak frequency, τ from the
 *    line's half-power width through the exact finite-record line shape, A from the peak height.
 *    Uncertainty and bias by a moving-block residual bootstrap (spectral-bootstrap.ts).
 * The two agree when |θ_spectrum − θ_fit| ≤ 2√(σ_spectrum² + σ_fit²).
 * Times in ns from the start of the analysed window, frequencies in GHz.
 */
import { planEnvelope } from './envelope-basis'
import { fitDampedSine, refitEnvelope } from './damped-sine-fit'
import { envelopeAlone, makeProjector } from './envelope-projection'
import { paddedPower, peakBins, spectralLine, spectrumForDrawing } from './spectral-line'
import { spectralBootstrap } from './spectral-bootstrap'
import { uniformWindow } from './uniform-window'
import { fitEstimate, spectralEstimate, agreement } from './estimates'
import type { OscillationOptions, OscillationResult } from './oscillation-types'

export type * from './oscillation-types'

/** Most samples analysed; longer records are evenly thinned (keeping frequencies below the new Nyquist). */
const MAX_SAMPLES = 16_384
const DRAWN_POINTS = 2000
/** Spectral lines tried as starting points of the fit. */
const FIT_STARTS = 3

function thinned(t: Float64Array, v: ArrayLike<number>, startNs: number) {
  const step = Math.max(1, Math.floor(t.length / DRAWN_POINTS))
  const out = { timeNs: [] as number[], value: [] as number[] }
  for (let i = 0; i < t.length; i += step) (out.timeNs.push(t[i] + startNs), out.value.push(v[i]))
  return out
}

export function analyseOscillation(timeNs: ArrayLike<number>, values: ArrayLike<number>, o: OscillationOptions = {}): OscillationResult {
  const notes: string[] = []
  const w = uniformWindow(timeNs, values, o.startNs, o.endNs, MAX_SAMPLES)
  const empty: OscillationResult = { samples: w.samples, stepNs: w.stepNs, startNs: w.startNs, endNs: w.endNs, envelope: null, ripple: { timeNs: [], value: [] }, spectrum: { frequencyGHz: [], magnitude: [] }, spectral: null, fit: null, agreement: null, notes }
  if (!w.y) {
    notes.push('Fewer than 16 samples in the window: nothing to analyse')
    return empty
  }
  if (w.thinnedFrom) notes.push(`${w.thinnedFrom} samples thinned to ${w.samples}: frequencies above ${(1 / (2 * w.stepNs)).toPrecision(3)} GHz are not seen`)
  const { y, t, stepNs: dt } = w
  const n = y.length
  const plan = planEnvelope(y, dt, o.envelope ?? 'auto', o.envelopeCutoffGHz)
  const minF = o.minFrequencyGHz ?? 1.5 / (n * dt)

  // A first look at the spectrum with the envelope fitted alone gives the fit its starting points: the
  // strongest few lines, so that a ripple the envelope curve partly absorbed is still tried.
  const project = makeProjector(t, plan.basis)
  const start = envelopeAlone(t, plan.basis, y)
  const startRipple = start ? y.map((v, i) => v - start[i]) : null
  const startSpectrum = startRipple ? paddedPower(startRipple, dt) : null
  const starts = startRipple && startSpectrum ? peakBins(startSpectrum, minF, FIT_STARTS).map((k) => spectralLine(startRipple, dt, minF, startSpectrum, k)!) : []
  if (!startRipple || starts.length === 0) {
    notes.push('After envelope removal the spectrum has no peak above the lowest frequency analysed')
    return { ...empty, envelope: plan.removal }
  }
  const outcome = fitDampedSine(t, y, plan.basis, starts.map((s) => ({ frequencyGHz: s.frequencyGHz, gamma: s.gamma ?? 3 / (n * dt) })))
  const fit = typeof outcome === 'string' ? null : outcome
  if (outcome === 'no-ripple') notes.push('No ripple stands out of the noise after envelope removal')
  if (outcome === 'at-limit') notes.push('The damped-sine fit ran to the edge of the frequencies or decay rates this record can show')
  if (outcome === 'singular') notes.push('The damped-sine fit could not separate the ripple from the envelope')
  const ripple = fit ? fit.ripple : startRipple
  const coarse = paddedPower(ripple, dt)
  const line = spectralLine(ripple, dt, minF, coarse)
  if (!line) notes.push('After envelope removal the spectrum has no peak above the lowest frequency analysed')
  if (line && line.decayNs === null) notes.push('The spectral line is no wider than the record allows: its width gives no decay time')

  let boot = null
  if (fit && line) {
    const fitted = fit.envelope.map((v, i) => v + fit.sine[i])
    boot = spectralBootstrap({
      fitted,
      residuals: y.map((v, i) => v - fitted[i]),
      leverage: fit.leverage,
      envelopeOf: (yb) => refitEnvelope(project, yb, { frequencyGHz: fit.frequencyGHz, gamma: fit.gamma }, t[n - 1], dt),
      dtNs: dt,
      minF,
      world: { frequencyGHz: fit.frequencyGHz, decayNs: fit.gamma > 0 ? 1 / fit.gamma : null, amplitude: Math.hypot(fit.a, fit.b) },
    })
  }
  // Without a fit there is no model to resample, so no honest uncertainty: the spectral figures are withheld.
  if (line && !boot) notes.push('Without a damped-sine fit to resample, the spectrum gives no figures with an uncertainty')
  const spectral = line && boot ? spectralEstimate(line, boot, notes) : null
  const fitOut = fit ? fitEstimate(fit, thinned(t, fit.sine, w.startNs), notes) : null
  const agree = spectral && fitOut ? agreement(spectral, fitOut) : null
  if (agree && (agree.frequency === false || agree.decay === false)) notes.push('The spectrum and the fit disagree by more than twice their combined uncertainty: the ripple is not a single damped sine, or the envelope removal needs another cut-off')
  return { ...empty, envelope: plan.removal, ripple: thinned(t, ripple, w.startNs), spectrum: spectrumForDrawing(coarse.power, coarse.dfGHz, n), spectral, fit: fitOut, agreement: agree }
}
