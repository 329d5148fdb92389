import { describe, expect, it } from 'vitest'
import { COMPRESSION_DB, fitLine, fitSmallSignalGainSlope } from './gain-slope-fit'

describe('fitLine', () => {
  it('gives the textbook slope error for a known scatter', () => {
    // y = 1 + 2x with residuals +e, −e, −e, +e at x = 0…3: SSR = 4e², s² = 2e², Σ(x − x̄)² = 5,
    // σ_slope = √(s²/Σ(x − x̄)²) (linear least squares: common practice).
    const e = 0.1
    const f = fitLine([0, 1, 2, 3], [1 + e, 3 - e, 5 - e, 7 + e])
    expect(f.slope).toBeCloseTo(2, 12)
    expect(f.intercept).toBeCloseTo(1, 12)
    expect(f.slopeSigma).toBeCloseTo(Math.sqrt((2 * e * e) / 5), 12)
  })
})

describe('fitSmallSignalGainSlope', () => {
  it('recovers the slope of noise-free linear gain and uses every point', () => {
    // 135.7 dB/W is the small-signal slope of a 50 m silica fibre (g_B = 5e-11 m/W, A_eff = 80 µm²):
    // 10·log10(e)·g_B·L/A_eff (Agrawal, Nonlinear Fiber Optics, ch. 9); −0.04 dB of loss.
    const p = [0.05, 0.1, 0.15, 0.2, 0.25, 0.3]
    const r = fitSmallSignalGainSlope(p, p.map((x) => 135.7 * x - 0.04))
    if (!r.ok) throw new Error(r.reason)
    expect(Math.abs(r.fit.slope - 135.7) / 135.7).toBeLessThan(1e-12)
    expect(r.fit.intercept).toBeCloseTo(-0.04, 10)
    expect(r.fit.points).toBe(6)
    expect(r.fit.saturatedFromW).toBeNull()
  })

  it('stops at the first point compressed by more than 0.5 dB and fits only the points below', () => {
    // Linear to 0.3 W, then the gain flattens (pump depletion): the 0.35 W point sits 0.3 dB low (kept),
    // the 0.4 W point 3 dB low (past the compression threshold: the run ends there).
    const p = [0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.5]
    const g = p.map((x) => 100 * x)
    g[6] -= 0.3
    g[7] -= 3
    g[8] -= 12
    const r = fitSmallSignalGainSlope(p, g)
    if (!r.ok) throw new Error(r.reason)
    expect(r.fit.saturatedFromW).toBe(0.4)
    expect(r.fit.maxPowerUsedW).toBe(0.35)
    expect(r.fit.points).toBe(7)
    expect(COMPRESSION_DB).toBe(0.5)
    // Without the 0.35 W point the slope would be exactly 100; with it, a little lower.
    expect(r.fit.slope).toBeLessThan(100)
    expect(r.fit.slope).toBeGreaterThan(98)
  })

  it('measures compression from the line through the lowest three points, so a slow saturation cannot bend it', () => {
    // Each point 0.4 dB below the one before's trend: a refitted line would follow and keep them all; the fixed
    // reference sees the fifth point 0.8 dB low and stops.
    const p = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6]
    const g = [10, 20, 30, 39.6, 49.2, 58.8]
    const r = fitSmallSignalGainSlope(p, g)
    if (!r.ok) throw new Error(r.reason)
    expect(r.fit.saturatedFromW).toBe(0.5)
    expect(r.fit.points).toBe(4)
  })

  it('takes the points in order of power whatever order they come in', () => {
    const p = [0.3, 0.1, 0.2, 0.05]
    const r = fitSmallSignalGainSlope(p, p.map((x) => 50 * x + 1))
    if (!r.ok) throw new Error(r.reason)
    expect(r.fit.slope).toBeCloseTo(50, 10)
  })

  it('says why it cannot fit two points', () => {
    expect(fitSmallSignalGainSlope([0.1, 0.2], [10, 20])).toEqual({ ok: false, reason: 'needs at least 3 points with a gain (has 2)' })
  })
})
