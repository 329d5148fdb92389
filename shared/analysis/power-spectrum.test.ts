import { describe, expect, it } from 'vitest'
import { DARK_POWER_W, HANN_ENBW_BINS, MAX_SEGMENT, NO_LIGHT, powerSpectrum, SpectrumAccumulator, type PortSpectrum } from './power-spectrum'

const DT_S = 10e-12

/** Envelope √P·g(t)·e^{−i2πδt}: light at carrier + δ under the exp(−iωt) convention of docs/model.md. */
function envelope(n: number, amp: (k: number) => number, offsetHz: number): Float64Array {
  const a = new Float64Array(2 * n)
  for (let k = 0; k < n; k++) {
    const ph = -2 * Math.PI * offsetHz * k * DT_S
    a[2 * k] = amp(k) * Math.cos(ph)
    a[2 * k + 1] = amp(k) * Math.sin(ph)
  }
  return a
}

function spectrum(field: Float64Array, maxSegment?: number): PortSpectrum {
  const s = powerSpectrum(field, DT_S, { maxSegment })
  if (s.kind !== 'spectrum') throw new Error('expected light')
  return s
}

const wPerHz = (dbmPerGHz: number) => 10 ** ((dbmPerGHz - 120) / 10)
const integral = (s: PortSpectrum) => s.psdDbmPerGHz.reduce((acc, v) => acc + wPerHz(v) * s.binHz, 0)
const argmax = (v: Float64Array) => v.reduce((best, x, i) => (x > v[best] ? i : best), 0)

describe('power spectrum of a port trace', () => {
  it('matches the analytic transform of a Gaussian pulse within 1e-3 dB over ±3σ_f', () => {
    // Fourier pair exp(−t²/2σ²) ↔ σ√(2π)·exp(−2π²σ²ν²), i.e. a Gaussian of σ_f = 1/(2πσ) (Bracewell, The Fourier
    // Transform and Its Applications, table of pairs). A pulse shorter than a segment reads its energy spectral
    // density over the record length: S(ν) = P₀·2πσ²·exp(−(ν − δ)²/σ_f²) / (NΔt).
    // The window's effect: our own second-order expansion gives a relative deviation ≈ (4π²/3)(σ/MΔt)²(2u² − 1)
    // at u = (ν − δ)/σ_f, 4e-5 here at u = 3 (0.0002 dB), so the comparison tests the estimator, not the window.
    const n = 1 << 16
    const sigmaS = 2 * DT_S
    const p0 = 0.5
    const t0 = 21_000.3
    const deltaHz = 0.05 / DT_S
    const s = spectrum(envelope(n, (k) => Math.sqrt(p0) * Math.exp(-(((k - t0) * DT_S) ** 2) / (2 * sigmaS ** 2)), deltaHz))
    const sigmaF = 1 / (2 * Math.PI * sigmaS)
    let checked = 0
    let worst = 0
    s.offsetHz.forEach((nu, j) => {
      const u = (nu - deltaHz) / sigmaF
      if (Math.abs(u) > 3) return
      const exact = (p0 * 2 * Math.PI * sigmaS ** 2 * Math.exp(-(u ** 2))) / (n * DT_S)
      const exactDb = 10 * Math.log10(exact) + 120
      worst = Math.max(worst, Math.abs(s.psdDbmPerGHz[j] - exactDb))
      checked++
    })
    expect(checked).toBeGreaterThan(300)
    expect(worst).toBeLessThan(1e-3)
  })

  it('puts a CW tone in its bin, reading P/RBW with the Hann ENBW of 1.5 resolution cells', () => {
    // Hann window: equivalent noise bandwidth 1.5 cells of 1/(MΔt) (Harris 1978, Proc. IEEE 66, 51, table 1). Light
    // is on at the record's ends, so the segments lie inside it and a tone on a cell centre reads exactly P/RBW.
    const m = 256
    const cellHz = 1 / (m * DT_S)
    const pW = 2e-3
    const s = spectrum(envelope(64 * m, () => Math.sqrt(pW), 37 * cellHz), m)
    expect(s.ends).toBe('inside')
    // Transformed on 4M points (zero-filled): four plotted bins per resolution cell.
    expect(s.offsetHz.length).toBe(4 * m)
    expect(s.binHz).toBeCloseTo(cellHz / 4, 6)
    const j = argmax(s.psdDbmPerGHz)
    expect(j).toBe(2 * m + 4 * 37)
    expect(s.offsetHz[j]).toBeCloseTo(37 * cellHz, 0)
    expect(s.rbwHz).toBeCloseTo(HANN_ENBW_BINS * cellHz, 6)
    expect((wPerHz(s.psdDbmPerGHz[j]) * s.rbwHz) / pW).toBeCloseTo(1, 9)
    // ENBW measured: the integral over the peak height, in cells.
    expect(integral(s) / wPerHz(s.psdDbmPerGHz[j]) / cellHz).toBeCloseTo(1.5, 9)
  })

  it('reads 1.42 dB down half a resolution cell from a tone (Hann scalloping loss)', () => {
    // Scalloping loss of the Hann window 1.42 dB (Harris 1978, Proc. IEEE 66, 51, table 1).
    const m = 256
    const cellHz = 1 / (m * DT_S)
    const s = spectrum(envelope(64 * m, () => 1e-2, -20.5 * cellHz), m)
    const onTone = 10 * Math.log10(1e-4 / s.rbwHz) + 120
    const at = (cells: number) => s.psdDbmPerGHz[Math.round(cells * 4) + 2 * m]
    expect(at(-20.5) - onTone).toBeCloseTo(0, 6)
    expect(at(-20) - onTone).toBeCloseTo(-1.42, 2)
    expect(at(-21) - onTone).toBeCloseTo(-1.42, 2)
  })

  it('shows a wave that is on at the record ends with the Hann line shape, not the spectrum of its truncation', () => {
    // Hann: highest sidelobe −31.5 dB, falling 18 dB per octave (Harris 1978, Proc. IEEE 66, 51, table 1).
    for (const n of [2000, 5000, 1 << 16]) {
      const s = spectrum(envelope(n, () => 1, 2.3e9))
      const j = argmax(s.psdDbmPerGHz)
      const perCell = s.offsetHz.length / s.segmentSamples
      const beyond = (cells: number) => Math.max(...Array.from(s.psdDbmPerGHz).filter((_, i) => Math.abs(i - j) >= cells * perCell)) - s.psdDbmPerGHz[j]
      expect(beyond(3)).toBeLessThan(-31.5)
      expect(beyond(10)).toBeLessThan(-65)
      // Steady light: the window-weighted mean power is the mean power (Parseval).
      expect(s.integratedPowerW / s.meanPowerW).toBeCloseTo(1, 12)
    }
  })

  it('integrates to the trace mean power (Parseval) for pulses with no light at the ends, one of them close to the start', () => {
    // Parseval's theorem for the DFT; exact here because every sample carries the same window weight Σw² = 3/2.
    const n = 50_000
    const a = new Float64Array(2 * n)
    let sum = 0
    for (let k = 0; k < n; k++) {
      const pulse = 3 * Math.exp(-(((k - 1300) / 40) ** 2)) + Math.exp(-(((k - 31_000) / 900) ** 2))
      a[2 * k] = pulse * Math.cos(0.3 * k)
      a[2 * k + 1] = pulse * Math.sin(0.3 * k)
      sum += a[2 * k] ** 2 + a[2 * k + 1] ** 2
    }
    const s = spectrum(a)
    expect(s.ends).toBe('padded')
    expect(s.segmentSamples).toBe(MAX_SEGMENT)
    expect(integral(s) / (sum / n)).toBeCloseTo(1, 9)
    expect(s.integratedPowerW / s.meanPowerW).toBeCloseTo(1, 12)
    expect(s.meanPowerW).toBeCloseTo(sum / n, 12)
  })

  it('reports the weighted power when a pulse sits near an end of a trace that is lit there', () => {
    // A pulse in the first segment-quarter on a CW background is weighted by the rising Hann edge: the
    // spectrum integrates to less than the mean power, and says by how much.
    const n = 20_000
    const s = spectrum(envelope(n, (k) => 0.01 + 3 * Math.exp(-(((k - 30) / 10) ** 2)), 0))
    expect(s.ends).toBe('inside')
    expect(integral(s) / s.integratedPowerW).toBeCloseTo(1, 9)
    expect(s.integratedPowerW / s.meanPowerW).toBeLessThan(0.5)
  })

  it('reports a dark port instead of −∞ dB, and finite values for weak light', () => {
    const dark = powerSpectrum(new Float64Array(2000), DT_S)
    expect(dark).toEqual({ kind: 'dark', message: NO_LIGHT, meanPowerW: 0 })
    expect(powerSpectrum(envelope(1000, () => Math.sqrt(DARK_POWER_W / 10), 0), DT_S).kind).toBe('dark')
    const weak = spectrum(envelope(1000, (k) => (k === 500 ? 1e-10 : 0), 0))
    expect(weak.psdDbmPerGHz.every(Number.isFinite)).toBe(true)
    expect(Math.min(...weak.psdDbmPerGHz)).toBeGreaterThanOrEqual(weak.floorDbmPerGHz)
  })

  it('chooses the longest power-of-two segment that fits (half the record when it is lit at the ends), and pads short records', () => {
    expect(spectrum(envelope(100, () => 1, 0)).segmentSamples).toBe(32)
    expect(spectrum(envelope(100, (k) => Math.exp(-(((k - 50) / 5) ** 2)), 0)).segmentSamples).toBe(64)
    expect(spectrum(envelope(5, () => 1, 0)).segmentSamples).toBe(16)
    expect(spectrum(envelope(1 << 20, () => 1, 0)).offsetHz.length).toBe(MAX_SEGMENT)
  })

  it('gives the same spectrum when accumulated in slices', () => {
    const field = envelope(30_000, (k) => Math.exp(-(((k - 9000) / 300) ** 2)), 1e9)
    const acc = new SpectrumAccumulator(field, DT_S)
    let slices = 0
    while (!acc.advance(3)) slices++
    const sliced = acc.result() as PortSpectrum
    expect(slices).toBeGreaterThan(5)
    expect(Array.from(sliced.psdDbmPerGHz)).toEqual(Array.from(spectrum(field).psdDbmPerGHz))
  })

  it('refuses a non-positive time step and an odd-length complex array', () => {
    expect(() => powerSpectrum(new Float64Array(4), 0)).toThrow(RangeError)
    expect(() => powerSpectrum(new Float64Array(3), DT_S)).toThrow(RangeError)
  })
})
