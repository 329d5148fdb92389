/*
 * Uncertainty and bias of the spectral estimate by a residual bootstrap (Efron & Tibshirani, An
 * Introduction to the Bootstrap, 1993, §9.5 regression residuals, §8.6 moving blocks, §10 bias):
 *   y*_b = ŷ + e*_b,   b = 1 … B,
 * ŷ the fitted envelope + damped sine, e*_b the residuals, modified to e_i/√(1 − h_i) (h_i the fit's leverage,
 * which restores the noise the fit absorbed; Davison & Hinkley, Bootstrap Methods and their Application,
 * 1997, §6.2.3) and centred, resampled in moving blocks of length ℓ
 * (Künsch, Ann. Stat. 17, 1217 (1989)) so that correlation between neighbouring samples, from the noise or
 * from the envelope removal, survives the resampling. Each replicate's envelope comes from the joint fit
 * redone on it, so the envelope's trade-off with the ripple is resampled as well. ℓ = twice the first lag at which the residuals'
 * autocorrelation falls below 2/√N (common practice; 2 for white noise). Each y*_b goes through the same
 * envelope removal and spectral estimate θ̂*_b. Then
 *   sd = sd(θ̂*_b),   bias = mean(θ̂*_b) − θ(ŷ),   θ̃ = θ̂ − bias,   σ = √(sd² + bias²),
 * θ(ŷ) being the parameters of the model the replicates were drawn from; the bias is counted in σ as well
 * because the correction rests on ŷ being close to the truth (conservative). The seed is fixed, so the same
 * trace always gives the same figures.
 */
import { spectralLine, type LineEstimate } from './spectral-line'

export const BOOTSTRAP_REPLICATES = 50
const SEED = 0x5eed5
/** Fewer valid replicates than this share: no uncertainty for that quantity. */
const MIN_VALID_SHARE = 0.8

/** mulberry32, a common-practice 32-bit generator: uniform [0, 1). */
function uniform(seed: number): () => number {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6d2b79f5) >>> 0
    let t = s
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

export function blockLength(e: Float64Array): number {
  const n = e.length
  let c0 = 0
  for (let i = 0; i < n; i++) c0 += e[i] * e[i]
  if (!(c0 > 0)) return 1
  const limit = 2 / Math.sqrt(n)
  for (let lag = 1; lag < n / 10; lag++) {
    let c = 0
    for (let i = lag; i < n; i++) c += e[i] * e[i - lag]
    if (c / c0 < limit) return Math.max(1, 2 * lag)
  }
  return Math.max(1, Math.floor(n / 10))
}

export interface BootstrapInput {
  fitted: Float64Array
  residuals: Float64Array
  /** Hat-matrix diagonal of the fit: residuals are divided by √(1 − h_i) before resampling. */
  leverage: Float64Array
  /** Envelope of a resampled trace (the same removal as for the data). */
  envelopeOf: (y: Float64Array) => Float64Array | null
  dtNs: number
  minF: number
  /** Parameters of the model ŷ: what the replicates' estimates should come out as. */
  world: { frequencyGHz: number; decayNs: number | null; amplitude: number }
}

export interface BootstrapResult {
  replicates: number
  frequency: { sd: number; bias: number } | null
  decay: { sd: number; bias: number } | null
  amplitude: { sd: number; bias: number } | null
}

function summary(values: number[], world: number | null, needed: number): { sd: number; bias: number } | null {
  if (values.length < needed || world === null) return null
  const mean = values.reduce((s, v) => s + v, 0) / values.length
  const sd = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1))
  return { sd, bias: mean - world }
}

export function spectralBootstrap(o: BootstrapInput, replicates = BOOTSTRAP_REPLICATES): BootstrapResult {
  const n = o.fitted.length
  const modified = o.residuals.map((v, i) => v / Math.sqrt(Math.max(0.05, 1 - o.leverage[i])))
  const mean = modified.reduce((s, v) => s + v, 0) / n
  const e = modified.map((v) => v - mean)
  const len = Math.min(blockLength(e), n)
  const rand = uniform(SEED)
  const f: number[] = []
  const tau: number[] = []
  const amp: number[] = []
  const y = new Float64Array(n)
  for (let b = 0; b < replicates; b++) {
    for (let i = 0; i < n; ) {
      const start = Math.floor(rand() * (n - len + 1))
      for (let j = 0; j < len && i < n; j++, i++) y[i] = o.fitted[i] + e[start + j]
    }
    const env = o.envelopeOf(y)
    if (!env) continue
    const est: LineEstimate | null = spectralLine(y.map((v, i) => v - env[i]), o.dtNs, o.minF)
    if (!est) continue
    f.push(est.frequencyGHz)
    amp.push(est.amplitude)
    if (est.decayNs !== null) tau.push(est.decayNs)
  }
  const needed = Math.ceil(MIN_VALID_SHARE * replicates)
  return {
    replicates: f.length,
    frequency: summary(f, o.world.frequencyGHz, needed),
    decay: summary(tau, o.world.decayNs, needed),
    amplitude: summary(amp, o.world.amplitude, needed),
  }
}
