// Turns the fit's covariance and the spectrum's bootstrap into reported figures with 1σ uncertainties.
// τ = 1/γ: σ_τ = σ_γ/γ² (first-order propagation); A = √(a² + b²): σ_A² = gᵀ Σ_ab g with g = (a, b)/A.
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

export function spectralEstimate(line: LineEstimate, boot: BootstrapResult, notes: string[]): SpectralEstimate {
  if (line.decayNs !== null && !boot.decay) notes.push('The spectral decay time is not determined in enough resampled traces to give its uncertainty')
  const f = boot?.frequency
  const d = line.decayNs !== null ? boot?.decay : null
  const A = boot?.amplitude
  return {
    frequencyGHz: line.frequencyGHz - (f?.bias ?? 0),
    frequencyUncertaintyGHz: f?.sd ?? null,
    decayNs: line.decayNs === null ? null : line.decayNs - (d?.bias ?? 0),
    decayUncertaintyNs: d?.sd ?? null,
    amplitude: line.amplitude - (A?.bias ?? 0),
    amplitudeUncertainty: A?.sd ?? null,
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
