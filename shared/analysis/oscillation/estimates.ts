// Turns the fit's covariance and the spectrum's bootstrap into reported figures with 1σ uncertainties.
// τ = 1/γ: σ_τ = σ_γ/γ² (first-order propagation); A = √(a² + b²): σ_A² = gᵀ Σ_ab g with g = (a, b)/A.
// Spectrum: θ̃ = θ̂ − bias, σ = √(sd² + bias²) from the bootstrap (spectral-bootstrap.ts).
import type { JointFit } from './damped-sine-fit'
import type { BootstrapResult } from './spectral-bootstrap'
import type { LineEstimate } from './spectral-line'
import type { DampedSineEstimate, RippleEstimate, SpectralEstimate } from './oscillation-types'

const sqrtOrNull = (v: number | undefined) => (v !== undefined && v >= 0 && Number.isFinite(v) ? Math.sqrt(v) : null)

export function fitEstimate(fit: JointFit, curve: DampedSineEstimate['curve'], notes: string[]): DampedSineEstimate {
  const { a, b, gamma, cov } = fit
  const A = Math.hypot(a, b)
  const varA = cov ? (a * a * cov[0][0] + 2 * a * b * cov[0][1] + b * b * cov[1][1]) / (A * A) : undefined
  const sG = sqrtOrNull(cov?.[2][2])
  const decays = gamma > 0 && (sG === null || gamma > sG)
  if (!decays) notes.push('The fit sees no decay within the record: the decay time is longer than the record can tell')
  if (!cov) notes.push('The fit’s parameters are not separately determined: no uncertainties')
  return {
    frequencyGHz: fit.frequencyGHz,
    frequencyUncertaintyGHz: sqrtOrNull(cov?.[3][3]),
    decayNs: decays ? 1 / gamma : null,
    decayUncertaintyNs: decays && sG !== null ? sG / (gamma * gamma) : null,
    amplitude: A,
    amplitudeUncertainty: sqrtOrNull(varA),
    phaseRad: Math.atan2(a, b),
    rmsResidual: fit.rmsResidual,
    noiseColourFactor: fit.noiseColourFactor,
    iterations: fit.iterations,
    curve,
  }
}

export function spectralEstimate(line: LineEstimate, boot: BootstrapResult, notes: string[]): SpectralEstimate | null {
  const f = boot.frequency
  if (!f) {
    notes.push('The spectral peak was not found in enough resampled traces to give an uncertainty')
    return null
  }
  const d = line.decayNs !== null ? boot.decay : null
  if (line.decayNs !== null && !d) notes.push('The spectral line width gives no decay time in enough resampled traces to state its uncertainty')
  const A = boot.amplitude
  // The bias correction is only as good as the fitted model the replicates came from: its standard
  // uncertainty is taken as its own size (a conservative choice), added in quadrature to the spread.
  const u = (x: { sd: number; bias: number } | null | undefined) => (x ? Math.hypot(x.sd, x.bias) : null)
  return {
    frequencyGHz: line.frequencyGHz - f.bias,
    frequencyUncertaintyGHz: u(f),
    decayNs: line.decayNs === null || !d ? null : line.decayNs - d.bias,
    decayUncertaintyNs: u(d),
    amplitude: line.amplitude - (A?.bias ?? 0),
    amplitudeUncertainty: u(A),
    bootstrapReplicates: boot.replicates,
  }
}

function agrees(x: number | null, sx: number | null, y: number | null, sy: number | null): boolean | null {
  if (x === null || y === null || sx === null || sy === null) return null
  return Math.abs(x - y) <= 2 * Math.hypot(sx, sy)
}

export function agreement(s: RippleEstimate, f: RippleEstimate) {
  return {
    frequency: agrees(s.frequencyGHz, s.frequencyUncertaintyGHz, f.frequencyGHz, f.frequencyUncertaintyGHz),
    decay: agrees(s.decayNs, s.decayUncertaintyNs, f.decayNs, f.decayUncertaintyNs),
  }
}
