// Pulse envelopes shared by the solver (input sampling) and the browser (input preview).
import type { PortInput, Pulse } from './pulse'
import { applySourcePhase } from './source-phase'

const LN2 = Math.LN2
/** sech² power FWHM = 2·ln(1+√2)·T₀. */
const SECH2_FWHM_PER_T0 = 2 * Math.log(1 + Math.SQRT2)
/** A tanh edge (1+tanh(x/τ))/2 rises 10→90 % in 2·atanh(0.8)·τ = ln 9·τ. */
const TANH_RISE_PER_TAU = Math.log(9)

/** Real amplitude profile √(P(t)/P_peak) of a pulse, t in ns. */
export function pulseAmplitude(p: Pulse, tNs: number): number {
  const x = tNs - p.centreNs
  switch (p.shape) {
    case 'gaussian': {
      // A = exp(−x²/2T²), power FWHM = 2√(ln2)·T
      const T = p.fwhmNs / (2 * Math.sqrt(LN2))
      return Math.exp((-x * x) / (2 * T * T))
    }
    case 'sech2': {
      const T0 = p.fwhmNs / SECH2_FWHM_PER_T0
      const y = Math.abs(x / T0)
      return y > 700 ? 0 : 1 / Math.cosh(y)
    }
    case 'superGaussian': {
      // power exp(−(x/T)^(2m)), FWHM = 2T(ln2)^(1/2m)
      const m = p.order
      const T = p.fwhmNs / (2 * Math.pow(LN2, 1 / (2 * m)))
      return Math.exp(-0.5 * Math.pow(Math.abs(x / T), 2 * m))
    }
    case 'rectangular': {
      const tau = p.riseNs / TANH_RISE_PER_TAU
      const h = p.fwhmNs / 2
      const power = 0.25 * (1 + Math.tanh((x + h) / tau)) * (1 - Math.tanh((x - h) / tau))
      return Math.sqrt(Math.max(0, power))
    }
    case 'sampled': {
      const n = p.powerShape.length
      const peak = p.powerShape.reduce((a, b) => Math.max(a, b), 0)
      if (peak <= 0) return 0
      const pos = (x + ((n - 1) * p.sampleIntervalNs) / 2) / p.sampleIntervalNs
      if (pos < 0 || pos > n - 1) return 0
      const i = Math.min(n - 2, Math.floor(pos))
      const f = pos - i
      // Linear interpolation of power, not amplitude: the samples are measured powers.
      return Math.sqrt(((1 - f) * p.powerShape[i] + f * p.powerShape[i + 1]) / peak)
    }
  }
}

/**
 * Interleaved complex trace of one port. The continuous background adds coherently (it is leakage of the
 * same laser through the modulator) with phase 0. A pulse carries e^{i(φ − 2πδ(t − t₀))}: the phase is
 * the carrier phase at the pulse centre, and a spectral offset +δ gives an envelope ∝ e^{−iδt} (docs/model.md, conventions).
 * A frequency modulation or a broadband source multiplies the whole field by its phase factor (source-phase.ts).
 */
export function sampleInput(port: PortInput, nt: number, dtS: number): Float64Array {
  const out = new Float64Array(2 * (nt + 1))
  const bg = Math.sqrt(port.backgroundPowerW)
  const dtNs = dtS * 1e9
  for (let n = 0; n <= nt; n++) out[2 * n] = bg
  for (const p of port.pulses) {
    const amp = Math.sqrt(p.peakPowerW)
    const w = 2 * Math.PI * p.frequencyOffsetMHz * 1e-3 // rad/ns
    for (let n = 0; n <= nt; n++) {
      const tNs = n * dtNs
      const a = amp * pulseAmplitude(p, tNs)
      if (a === 0) continue
      const ph = p.phaseRad - w * (tNs - p.centreNs)
      out[2 * n] += a * Math.cos(ph)
      out[2 * n + 1] += a * Math.sin(ph)
    }
  }
  applySourcePhase(out, dtNs, port.modulation, port.broadband)
  return out
}
