import { describe, expect, it } from 'vitest'
import { alignByEnergy, alignByPeak, centroidNs, peakTimeNs } from './trace-quick-align'

const grid = (t0: number, stepNs: number, n: number) => Float64Array.from({ length: n }, (_, i) => t0 + i * stepNs)
/** A pulse with a fast rise and a slow tail (so its peak and centroid differ), zero before t = 0. */
const pulse = (t: number) => (t <= 0 ? 0 : (t / 0.4) * Math.exp(1 - t / 0.4))

describe('peakTimeNs and centroidNs', () => {
  it('find the peak of a sampled parabola exactly and the centroid of t·e^{−t/τ} at 2τ', () => {
    // Vertex of a parabola (exact for three samples of one); ∫t²e^{−t/τ}/∫te^{−t/τ} = 2τ (Γ-function moments, common practice).
    const t = grid(0, 0.1, 50)
    expect(peakTimeNs({ timeNs: t, values: Float64Array.from(t, (x) => 5 - (x - 2.037) ** 2) }, 0, 5)).toBeCloseTo(2.037, 12)
    const f = grid(0, 0.001, 40_000)
    expect(centroidNs({ timeNs: f, values: Float64Array.from(f, (x) => x * Math.exp(-x / 0.5)) }, 0, 40)).toBeCloseTo(1, 5)
  })
})

describe('alignByPeak and alignByEnergy', () => {
  // The model on its own grid; the measurement 2.5 × the model 1.234 ns later, on a coarser, offset grid.
  const model = { timeNs: grid(-2, 0.004, 3000), values: Float64Array.from(grid(-2, 0.004, 3000), pulse) }
  const tm = grid(-1, 0.01, 1000)
  const measured = { timeNs: tm, values: Float64Array.from(tm, (x) => 2.5 * pulse(x - 1.234)) }

  it('set the offset as well as the scale of a shifted, scaled copy of the model', () => {
    const byEnergy = alignByEnergy(measured, model, tm[0], tm[tm.length - 1], 0)
    expect(byEnergy).not.toBeNull()
    expect(Math.abs(byEnergy!.offsetNs - 1.234)).toBeLessThan(1e-4)
    expect(Math.abs(byEnergy!.scale - 2.5)).toBeLessThan(1e-3)

    const byPeak = alignByPeak(measured, model, tm[0], tm[tm.length - 1], 0)
    expect(byPeak).not.toBeNull()
    // The sampled peak refined by a parabola: within a tenth of the measurement's 10 ps step.
    expect(Math.abs(byPeak!.offsetNs - 1.234)).toBeLessThan(1e-3)
    expect(Math.abs(byPeak!.scale - 2.5)).toBeLessThan(2.5e-3)
  })

  it('look for the model only where the window falls on it, so a brighter pulse elsewhere is not taken', () => {
    // A second model pulse 10× brighter at 6 ns, outside the window mapped back at the starting offset.
    const t = grid(-2, 0.004, 3000)
    const bright = { timeNs: t, values: Float64Array.from(t, (x) => pulse(x) + 10 * pulse(x - 6)) }
    const m = { timeNs: tm.subarray(0, 400), values: measured.values.subarray(0, 400) }
    const a = alignByPeak(m, bright, m.timeNs[0], m.timeNs[399], 1)
    expect(Math.abs(a!.offsetNs - 1.234)).toBeLessThan(1e-3)
  })

  it('return null when the window holds no signal', () => {
    const zero = { timeNs: tm, values: new Float64Array(tm.length) }
    expect(alignByEnergy(zero, model, tm[0], tm[tm.length - 1], 0)).toBeNull()
    expect(alignByEnergy(measured, model, tm[0], tm[tm.length - 1], 1000)).toBeNull()
  })
})
