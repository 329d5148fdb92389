/*
 * Dominant oscillation of a trace: frequency and decay time, two ways side by side.
 *
 * 1. Spectrum (fft.js): the record is put on a uniform grid, its mean (or a moving average of width
 *    smoothNs) removed, Hann-windowed, zero-padded ×4 and transformed. The largest peak above minFrequency
 *    is refined by a parabola through the log magnitudes of three bins (quadratic interpolation; Smith,
 *    Spectral Audio Signal Processing, "Quadratic Interpolation of Spectral Peaks"). The decay time comes
 *    from the peak's full width at half maximum of the unwindowed power spectrum: a damped sinusoid
 *    e^{−t/τ} sin(2πft) has a Lorentzian power line of FWHM 1/(πτ) (in Hz). When that width is not
 *    well above the record's resolution 1/T the decay is reported as unresolved.
 * 2. Damped-sine fit (ml-levenberg-marquardt, analytic Jacobian): y = A e^{−(t−t₀)/τ} sin(2πf(t−t₀) + φ) + c,
 *    started from the spectral frequency with A, φ, c from a linear least-squares solve. Uncertainties from
 *    covariance = s²(JᵀJ)⁻¹.
 * Times in ns, frequencies in GHz.
 */
import FFT from 'fft.js'
import { levenbergMarquardt } from 'ml-levenberg-marquardt'
import { invert, parameterSigmas } from './least-squares'

export interface OscillationOptions {
  /** Part of the record to analyse (ns); the whole record by default. */
  startNs?: number
  endNs?: number
  /** Width of a moving average subtracted first (ns); removes a slow envelope. 0/absent: subtract the mean. */
  smoothNs?: number
  /** Ignore spectral peaks below this (GHz); default 1.5 cycles per record. */
  minFrequencyGHz?: number
}

export interface SpectralEstimate {
  frequencyGHz: number
  /** Half the record's frequency resolution 1/(2T): what the spectrum alone can promise. */
  frequencyUncertaintyGHz: number
  /** From the Lorentzian width; null when the line is no wider than the record's resolution. */
  decayNs: number | null
  linewidthGHz: number
  /** Decimated one-sided magnitude spectrum for drawing. */
  spectrum: { frequencyGHz: number[]; magnitude: number[] }
}

export interface DampedSineEstimate {
  frequencyGHz: number
  frequencyUncertaintyGHz: number | null
  decayNs: number
  decayUncertaintyNs: number | null
  amplitude: number
  amplitudeUncertainty: number | null
  phaseRad: number
  offset: number
  rmsResidual: number
  iterations: number
  /** The fitted curve on the analysed samples, for drawing. */
  curve: { timeNs: number[]; value: number[] }
}

export interface OscillationResult {
  samples: number
  stepNs: number
  startNs: number
  endNs: number
  spectral: SpectralEstimate | null
  fit: DampedSineEstimate | null
  /** Why an estimate is missing, in words. */
  notes: string[]
}

/** Zero-padding factor of the spectrum (interpolates the peak between bins). */
const PAD = 4
/** Drawn spectrum points at most. */
const SPECTRUM_POINTS = 800
/** Most samples analysed; longer records are evenly thinned (keeping frequencies below the new Nyquist). */
const MAX_SAMPLES = 65_536

function nextPow2(n: number): number {
  let p = 2
  while (p < n) p *= 2
  return p
}

/** Linear interpolation of (t, y) on a uniform grid from t0 with step dt and n points. */
function resample(t: ArrayLike<number>, y: ArrayLike<number>, t0: number, dt: number, n: number): Float64Array {
  const out = new Float64Array(n)
  let j = 0
  for (let i = 0; i < n; i++) {
    const ti = t0 + i * dt
    while (j < t.length - 2 && t[j + 1] < ti) j++
    const span = t[j + 1] - t[j]
    const w = span > 0 ? Math.min(1, Math.max(0, (ti - t[j]) / span)) : 0
    out[i] = y[j] * (1 - w) + y[j + 1] * w
  }
  return out
}

function detrend(y: Float64Array, widthSamples: number): Float64Array {
  const n = y.length
  const out = new Float64Array(n)
  if (widthSamples < 2) {
    let mean = 0
    for (let i = 0; i < n; i++) mean += y[i]
    mean /= n
    for (let i = 0; i < n; i++) out[i] = y[i] - mean
    return out
  }
  // Centred moving average by a running sum, the window shrinking at the ends.
  const half = Math.floor(widthSamples / 2)
  const prefix = new Float64Array(n + 1)
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i] + y[i]
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half)
    const b = Math.min(n, i + half + 1)
    out[i] = y[i] - (prefix[b] - prefix[a]) / (b - a)
  }
  return out
}

function powerSpectrum(y: Float64Array, windowed: boolean): { power: Float64Array; size: number } {
  const n = y.length
  const size = nextPow2(n * PAD)
  const input = new Float64Array(size)
  for (let i = 0; i < n; i++) input[i] = windowed ? y[i] * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1))) : y[i]
  const fft = new FFT(size)
  const out = fft.createComplexArray()
  fft.realTransform(out, input)
  const half = size / 2
  const power = new Float64Array(half + 1)
  for (let k = 0; k <= half; k++) power[k] = out[2 * k] ** 2 + out[2 * k + 1] ** 2
  return { power, size }
}

function spectralEstimate(y: Float64Array, dt: number, minF: number): SpectralEstimate | null {
  const n = y.length
  const T = n * dt
  const { power, size } = powerSpectrum(y, true)
  const df = 1 / (size * dt)
  const kMin = Math.max(1, Math.ceil(minF / df))
  let kPeak = -1
  for (let k = kMin; k < power.length - 1; k++) if (kPeak < 0 || power[k] > power[kPeak]) kPeak = k
  if (kPeak < 1 || power[kPeak] <= 0) return null
  const [a, b, c] = [power[kPeak - 1], power[kPeak], power[kPeak + 1]].map((p) => Math.log(Math.max(p, 1e-300)))
  const denom = a - 2 * b + c
  const shift = denom !== 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom)) : 0
  const frequencyGHz = (kPeak + shift) * df

  // Width from the unwindowed spectrum (the Hann window would add its own width).
  const raw = powerSpectrum(y, false).power
  let kr = kPeak
  while (kr > 1 && raw[kr - 1] > raw[kr]) kr--
  while (kr < raw.length - 2 && raw[kr + 1] > raw[kr]) kr++
  const halfMax = raw[kr] / 2
  const edge = (dir: -1 | 1): number | null => {
    for (let k = kr; k > 0 && k < raw.length - 1; k += dir) {
      if (raw[k + dir] < halfMax) return k + (dir * (raw[k] - halfMax)) / (raw[k] - raw[k + dir])
    }
    return null
  }
  const lo = edge(-1)
  const hi = edge(1)
  const linewidthGHz = lo !== null && hi !== null ? (hi - lo) * df : NaN
  // A record of length T alone gives a line ≈ 0.886/T wide; ask for twice the resolution before trusting τ.
  const resolved = Number.isFinite(linewidthGHz) && linewidthGHz > 2 / T
  const step = Math.max(1, Math.floor(power.length / SPECTRUM_POINTS))
  const spectrum = { frequencyGHz: [] as number[], magnitude: [] as number[] }
  for (let k = 0; k < power.length; k += step) {
    spectrum.frequencyGHz.push(k * df)
    spectrum.magnitude.push(Math.sqrt(power[k]) / n)
  }
  return {
    frequencyGHz,
    frequencyUncertaintyGHz: 1 / (2 * T),
    decayNs: resolved ? 1 / (Math.PI * linewidthGHz) : null,
    linewidthGHz: Number.isFinite(linewidthGHz) ? linewidthGHz : 0,
    spectrum,
  }
}

/** For fixed f and τ the model is linear in (a, b, c) of a·e·cos + b·e·sin + c: solve it. */
function linearStart(t: Float64Array, y: Float64Array, f: number, tau: number): { A: number; phi: number; c: number } {
  const cols = [new Float64Array(t.length), new Float64Array(t.length), new Float64Array(t.length).fill(1)]
  for (let i = 0; i < t.length; i++) {
    const e = Math.exp(-t[i] / tau)
    cols[0][i] = e * Math.cos(2 * Math.PI * f * t[i])
    cols[1][i] = e * Math.sin(2 * Math.PI * f * t[i])
  }
  const ata = cols.map((a) => cols.map((b) => a.reduce((s, v, i) => s + v * b[i], 0)))
  const aty = cols.map((a) => a.reduce((s, v, i) => s + v * y[i], 0))
  const inv = invert(ata)
  if (!inv) return { A: 0, phi: 0, c: 0 }
  const [p, q, c] = inv.map((row) => row.reduce((s, v, j) => s + v * aty[j], 0))
  // a cos + b sin = A sin(x + φ) with A cos φ = b, A sin φ = a.
  return { A: Math.hypot(p, q), phi: Math.atan2(p, q), c }
}

function dampedSineFit(t: Float64Array, y: Float64Array, f0: number, tau0: number, startNs: number): DampedSineEstimate | null {
  const n = t.length
  const { A, phi, c } = linearStart(t, y, f0, tau0)
  if (!(A > 0)) return null
  // Parameters [A, γ = 1/τ, f, φ, c]; γ keeps the model smooth as τ → ∞ (an undamped tone).
  const model = (p: number[]) => (x: number) => p[0] * Math.exp(-p[1] * x) * Math.sin(2 * Math.PI * p[2] * x + p[3]) + p[4]
  const jac = (p: number[]) => (x: number) => {
    const e = Math.exp(-p[1] * x)
    const arg = 2 * Math.PI * p[2] * x + p[3]
    const s = Math.sin(arg)
    const co = Math.cos(arg)
    return [e * s, -x * p[0] * e * s, 2 * Math.PI * x * p[0] * e * co, p[0] * e * co, 1]
  }
  const scale = Math.max(1e-300, A)
  const T = t[n - 1]
  const result = levenbergMarquardt({ x: t, y }, model, {
    initialValues: [A, 1 / tau0, f0, phi, c],
    jacobianFunction: jac,
    minValues: [0, -1 / T, f0 / 2, -100, -Infinity],
    maxValues: [Infinity, 1e3 / (t[1] - t[0] || 1), 2 * f0, 100, Infinity],
    damping: 1e-2,
    maxIterations: 200,
    // The library stops once the weighted SSR falls below this; scale it to the data.
    errorTolerance: 1e-14 * scale * scale * n,
  })
  const p = result.parameterValues
  if (!p.every(Number.isFinite)) return null
  const f = model(p)
  let ssr = 0
  const fitted = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    fitted[i] = f(t[i])
    ssr += (y[i] - fitted[i]) ** 2
  }
  const jp = jac(p)
  const columns = Array.from({ length: 5 }, () => new Float64Array(n))
  for (let i = 0; i < n; i++) jp(t[i]).forEach((v, k) => (columns[k][i] = v))
  const [sA, sG, sF] = parameterSigmas(columns, ssr, n)
  const gamma = p[1]
  const step = Math.max(1, Math.floor(n / 2000))
  const curve = { timeNs: [] as number[], value: [] as number[] }
  for (let i = 0; i < n; i += step) (curve.timeNs.push(t[i] + startNs), curve.value.push(fitted[i]))
  return {
    frequencyGHz: p[2],
    frequencyUncertaintyGHz: sF,
    decayNs: 1 / gamma,
    // τ = 1/γ: σ_τ = σ_γ/γ².
    decayUncertaintyNs: sG === null ? null : sG / (gamma * gamma),
    amplitude: p[0],
    amplitudeUncertainty: sA,
    phaseRad: p[3],
    offset: p[4],
    rmsResidual: Math.sqrt(ssr / n),
    iterations: result.iterations,
    curve,
  }
}

export function analyseOscillation(timeNs: ArrayLike<number>, values: ArrayLike<number>, o: OscillationOptions = {}): OscillationResult {
  const notes: string[] = []
  const first = timeNs[0]
  const lastT = timeNs[timeNs.length - 1]
  const startNs = Math.max(first, o.startNs ?? first)
  const endNs = Math.min(lastT, o.endNs ?? lastT)
  let inside = 0
  for (let i = 0; i < timeNs.length; i++) if (timeNs[i] >= startNs && timeNs[i] <= endNs) inside++
  const empty = { samples: inside, stepNs: 0, startNs, endNs, spectral: null, fit: null, notes }
  if (inside < 16 || !(endNs > startNs)) {
    notes.push('Fewer than 16 samples in the window: nothing to analyse')
    return empty
  }
  const n = Math.min(inside, MAX_SAMPLES)
  const dt = (endNs - startNs) / (n - 1)
  const y = detrend(resample(timeNs, values, startNs, dt, n), o.smoothNs ? Math.round(o.smoothNs / dt) : 0)
  const t = Float64Array.from({ length: n }, (_, i) => i * dt)
  const minF = o.minFrequencyGHz ?? 1.5 / (n * dt)
  const spectral = spectralEstimate(y, dt, minF)
  if (!spectral) {
    notes.push('The spectrum has no peak above the lowest frequency analysed')
    return { ...empty, samples: n, stepNs: dt }
  }
  if (spectral.decayNs === null) notes.push('The spectral line is no wider than the record resolution: its width gives no decay time')
  const tau0 = spectral.decayNs ?? (endNs - startNs) / 3
  const fit = dampedSineFit(t, y, spectral.frequencyGHz, tau0, startNs)
  if (!fit) notes.push('The damped-sine fit did not converge')
  return { samples: n, stepNs: dt, startNs, endNs, spectral, fit, notes }
}
