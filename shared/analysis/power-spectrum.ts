/*
 * Optical power spectrum of one port trace: a complex envelope a_n = A(nΔt) in √W, n = 0 … N−1, about the
 * port's carrier. Welch's averaged periodogram (Welch 1967, IEEE Trans. Audio Electroacoust. 15, 70) with
 * segments of M samples (a power of two, at most MAX_SEGMENT), hop H = M/4 (75 % overlap), the periodic Hann
 * window w_m = sin²(πm/M) and segment starts t_s:
 *
 *   X_s(ν_k) = Σ_m w_m a_{t_s + m} e^{+i2πkm/P},   ν_k = k/(PΔt),  k = −P/2 … P/2 − 1   (a = 0 outside the record)
 *   S(ν_k)   = Δt Σ_s |X_s(ν_k)|² / W                (W/Hz; shown as dBm/GHz = 10·log10(S) + 120)
 *
 * The sign of the exponent follows the exp(−iωt) convention of docs/model.md: light at carrier + δ has an
 * envelope ∝ e^{−i2πδt}, and lands at ν = +δ. The transform length P = min(4M, MAX_SEGMENT) ≥ M zero-fills
 * short segments, so the curve is sampled every Δν = 1/(PΔt), finer than its resolution; Σ_k S·Δν is unchanged. A tone
 * of power P_t on a resolution cell's centre (ν = j/(MΔt)) reads S = P_t/RBW, where RBW = ENBW/(MΔt) and the Hann
 * window's equivalent noise bandwidth is 1.5 cells (Harris 1978, Proc. IEEE 66, 51, table 1). Where the
 * segments lie depends on the light at the record's ends:
 *
 * - Light at the ends (a CW wave, a background): segments lie inside the record, t_s = sH, M ≤ N/2, and
 *   W = S_count·Σw² = S_count·3M/8 (the usual Welch normalisation). A wave that is on at the ends then shows
 *   the Hann line shape, not the spectrum of its truncation; Σ_k S·Δν is the mean power weighted by Σ_s w²,
 *   exact for steady light, and reported (integratedPowerW) so a pulse near an end is not silently misweighted.
 * - No light at the ends (mean power over the first and last M/4 samples, M the segment this case would use,
 *   below END_DARK_RATIO of the whole record's):
 *   the record is padded with M − H zeros at both ends, t_s = sH − (M − H), M ≤ N, so every sample lies in
 *   four segments and Σ_s w²_{n−sH} = 3/2 for every n (sin⁴ summed over four quarter shifts); W = 3N/2. Then
 *   Parseval holds exactly, Σ_k S(ν_k)·Δν = (1/N) Σ_n |a_n|², and a pulse shorter than a segment reads its
 *   energy spectral density over the record length, S ≈ |Ã(ν)|²/(NΔt).
 */
import FFT from 'fft.js'

/** Longest segment: at most this many points come out, whatever the record length (common practice). */
export const MAX_SEGMENT = 4096
/** Short segments are transformed on this many times their length (zero-filled), at most MAX_SEGMENT points. */
export const ZERO_FILL = 4
/** Shortest segment: shorter records are zero-padded up to it. */
export const MIN_SEGMENT = 16
/** Hann: Σw² M / (Σw)² = (3M/8)·M / (M/2)² (Harris 1978, table 1). */
export const HANN_ENBW_BINS = 1.5
/** Below this mean power (10¹¹ times less than one photon per second at 1550 nm) a port is dark. */
export const DARK_POWER_W = 1e-30
/** Light at the record's ends below this fraction of the mean power (−60 dB) counts as none: the record is padded. */
export const END_DARK_RATIO = 1e-6
/** Values more than this far below the peak are reported at that floor (double-precision FFT noise lies ~290 dB down). */
export const DYNAMIC_RANGE_DB = 200
export const SPECTRUM_WINDOW = 'Hann (periodic)'
export const SPECTRUM_OVERLAP = 0.75

export interface SpectrumOptions {
  /** Longest segment in samples (a power of two); default MAX_SEGMENT. */
  maxSegment?: number
  /** Most output points (a power of two; zero-filled transform up to 4 × the segment); default MAX_SEGMENT. */
  maxPoints?: number
}

export interface PortSpectrum {
  kind: 'spectrum'
  /** Offset from the port's carrier (Hz), negative to positive, bin step Δν = 1/(PΔt). */
  offsetHz: Float64Array
  /** Power spectral density in dBm/GHz, floored at peak − DYNAMIC_RANGE_DB. */
  psdDbmPerGHz: Float64Array
  peakDbmPerGHz: number
  floorDbmPerGHz: number
  binHz: number
  /** Hann ENBW × 1/(MΔt): the resolution, whatever the zero-filling. */
  rbwHz: number
  segmentSamples: number
  segments: number
  /** 'padded': no light at the ends, record zero-padded, every sample weighs the same; 'inside': segments inside the record. */
  ends: 'padded' | 'inside'
  meanPowerW: number
  /** Σ S·Δν: the mean power itself when padded, else the window-weighted mean power. */
  integratedPowerW: number
}
export interface DarkPort {
  kind: 'dark'
  message: string
  meanPowerW: number
}
export type SpectrumResult = PortSpectrum | DarkPort

export const NO_LIGHT = 'No light at this port'

/** Largest power of two ≤ n, within [MIN_SEGMENT, maxSegment]. */
export function segmentLength(samples: number, maxSegment = MAX_SEGMENT): number {
  let m = MIN_SEGMENT
  while (m * 2 <= Math.min(samples, maxSegment)) m *= 2
  return m
}

/** Mean of |a_n|² over samples [from, to). */
function meanPower(field: ArrayLike<number>, from: number, to: number): number {
  let e = 0
  for (let i = 2 * from; i < 2 * to; i++) e += field[i] * field[i]
  return to > from ? e / (to - from) : 0
}

/**
 * Welch accumulation that can run in slices (advance) so a page stays responsive on long traces;
 * powerSpectrum() below runs it in one go.
 */
export class SpectrumAccumulator {
  readonly samples: number
  readonly segmentSamples: number
  readonly segments: number
  readonly meanPowerW: number
  readonly ends: 'padded' | 'inside'
  private readonly hop: number
  private readonly offset: number
  private readonly window: Float64Array
  private readonly fft: FFT
  private readonly input: number[]
  private readonly output: number[]
  private readonly sum: Float64Array
  /** Transform length P (a power of two, M ≤ P ≤ 4M). */
  readonly points: number
  private next = 0

  constructor(
    private readonly field: ArrayLike<number>,
    private readonly dtS: number,
    opts: SpectrumOptions = {},
  ) {
    if (!(dtS > 0) || !Number.isFinite(dtS)) throw new RangeError('The time step must be a positive number')
    if (field.length % 2 !== 0 || field.length === 0) throw new RangeError('A complex trace needs (re, im) pairs')
    const n = (this.samples = field.length / 2)
    this.meanPowerW = meanPower(field, 0, n)
    if (!Number.isFinite(this.meanPowerW)) throw new RangeError('The trace holds values that are not finite numbers')
    const quarter = Math.max(1, segmentLength(n, opts.maxSegment) / 4)
    const endPower = Math.max(meanPower(field, 0, Math.min(n, quarter)), meanPower(field, Math.max(0, n - quarter), n))
    this.ends = n < 2 * MIN_SEGMENT || endPower < END_DARK_RATIO * this.meanPowerW ? 'padded' : 'inside'
    const m = segmentLength(this.ends === 'padded' ? n : n / 2, opts.maxSegment)
    this.segmentSamples = m
    this.hop = m / 4
    if (this.ends === 'padded') {
      // Segment s covers samples sH − (M − H) … sH + H − 1, so sample n lies in segments ⌊n/H⌋ … ⌊n/H⌋ + 3.
      this.offset = -(m - this.hop)
      this.segments = Math.floor((n - 1) / this.hop) + 4
    } else {
      this.offset = 0
      this.segments = Math.floor((n - m) / this.hop) + 1
    }
    this.window = new Float64Array(m)
    for (let j = 0; j < m; j++) this.window[j] = Math.sin((Math.PI * j) / m) ** 2
    // Zero-filled transform on up to 4M points: the curve is drawn between the window's resolution cells
    // (the RBW stays 1.5/(MΔt)); entries past 2M of the input are never written and stay zero.
    this.points = Math.max(m, Math.min(opts.maxPoints ?? MAX_SEGMENT, ZERO_FILL * m))
    this.fft = new FFT(this.points)
    this.input = this.fft.createComplexArray()
    this.output = this.fft.createComplexArray()
    this.sum = new Float64Array(this.points)
  }

  get done(): boolean {
    return this.next >= this.segments || this.meanPowerW < DARK_POWER_W
  }

  /** Fraction of the segments accumulated. */
  get progress(): number {
    return this.done ? 1 : this.next / this.segments
  }

  /** Accumulates up to `count` more segments; true when all are done. */
  advance(count: number): boolean {
    const { segmentSamples: m, hop, window: w, input, output, field, sum } = this
    const end = Math.min(this.segments, this.next + count)
    for (; this.next < end && !this.done; this.next++) {
      const start = this.next * hop + this.offset
      for (let j = 0; j < m; j++) {
        const n = start + j
        const inside = n >= 0 && n < this.samples
        // Conjugated input: the forward transform then gives conj(X_s), whose |·|² is the same.
        input[2 * j] = inside ? w[j] * field[2 * n] : 0
        input[2 * j + 1] = inside ? -w[j] * field[2 * n + 1] : 0
      }
      this.fft.transform(output, input)
      for (let k = 0; k < this.points; k++) sum[k] += output[2 * k] ** 2 + output[2 * k + 1] ** 2
    }
    return this.done
  }

  result(): SpectrumResult {
    if (this.meanPowerW < DARK_POWER_W) return { kind: 'dark', message: NO_LIGHT, meanPowerW: this.meanPowerW }
    if (!this.done) throw new Error('The spectrum is not finished')
    const m = this.segmentSamples
    const p = this.points
    const binHz = 1 / (p * this.dtS)
    const weight = this.ends === 'padded' ? 1.5 * this.samples : (this.segments * 3 * m) / 8
    const scale = this.dtS / weight
    const offsetHz = new Float64Array(p)
    const psd = new Float64Array(p)
    let peak = -Infinity
    let integrated = 0
    for (let j = 0; j < p; j++) {
      // fftshift: bin k = j − P/2 sits at index (k + P) mod P of the transform.
      const k = (j + p / 2) % p
      offsetHz[j] = (j - p / 2) * binHz
      const s = this.sum[k] * scale
      integrated += s * binHz
      psd[j] = s > 0 ? 10 * Math.log10(s) + 120 : -Infinity
      if (psd[j] > peak) peak = psd[j]
    }
    const floor = peak - DYNAMIC_RANGE_DB
    for (let j = 0; j < p; j++) if (!(psd[j] >= floor)) psd[j] = floor
    return {
      kind: 'spectrum',
      offsetHz,
      psdDbmPerGHz: psd,
      peakDbmPerGHz: peak,
      floorDbmPerGHz: floor,
      binHz,
      rbwHz: HANN_ENBW_BINS / (m * this.dtS),
      segmentSamples: m,
      segments: this.segments,
      ends: this.ends,
      meanPowerW: this.meanPowerW,
      integratedPowerW: integrated,
    }
  }
}

/** How the record's ends were treated and, when it matters, how far the integral is from the mean power. */
export function spectrumEndsNote(s: PortSpectrum): string {
  if (s.ends === 'padded') return 'no light at the record ends, which are zero-padded: the spectrum integrates to the mean power'
  const db = 10 * Math.log10(s.integratedPowerW / s.meanPowerW)
  const base = 'light at the record ends, so the segments lie inside it'
  return Math.abs(db) < 0.01 ? base : `${base}; the windows weigh light near the ends less than the rest, so the spectrum integrates to ${db > 0 ? '+' : ''}${db.toFixed(2)} dB of the mean power`
}

/** The whole spectrum at once (solver, tests). */
export function powerSpectrum(field: ArrayLike<number>, dtS: number, opts: SpectrumOptions = {}): SpectrumResult {
  const acc = new SpectrumAccumulator(field, dtS, opts)
  acc.advance(acc.segments)
  return acc.result()
}

/** Segments the page computes per call between clock reads: one 4096-point segment takes 0.07 ms (median, benchmarks/README.md). */
export const SEGMENTS_PER_CALL = 1
