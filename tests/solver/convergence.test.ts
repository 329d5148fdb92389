// Empirical order of convergence (common practice for checking a scheme's order): halving Δt must cut
// the error by ≈ 4 for a second-order scheme (docs/numerics.md).
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44

function stokesOut(nz: number, extra: Parameters<typeof chipConfig>[0]) {
  const r = simulateSync(
    chipConfig({
      windowNs: 3.5,
      grid: { timeStepPs: (0.05 / (VG * nz)) * 1e12, mapRows: 16, mapCols: 16 },
      ...extra,
      channels: [{ pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }],
    }),
  )
  expect(r.status).toBe('finished')
  return r.channels[0].stokesOut
}

/** Max |difference| between a trace and the next finer one (Δt/2), on the coarse samples. */
function diff(a: Float64Array, b: Float64Array) {
  let e = 0
  for (let n = 0; n < Math.min(a.length / 2, b.length / 4); n++) e = Math.max(e, Math.hypot(a[2 * n] - b[4 * n], a[2 * n + 1] - b[4 * n + 1]))
  return e
}

describe('grid convergence', () => {
  it.each([
    ['plain SVEA', {}],
    ['with loss and detuning', { detuningMHz: 20, waveguide: { lossDbPerM: 30 } }],
    ['with Kerr', { options: { kerr: true }, waveguide: { kerrN2M2PerW: 1e-17 } }],
    ['with the higher-order acoustic term', { options: { higherOrderAcoustic: true }, waveguide: { brillouinShiftGHz: 1 } }],
  ])('%s is second order: halving Δt divides the error by 4 (3.6–4.4)', (_label, extra) => {
    const [a, b, c] = [40, 80, 160].map((nz) => stokesOut(nz, extra as Parameters<typeof chipConfig>[0]))
    const ratio = diff(a, b) / diff(b, c)
    expect(ratio).toBeGreaterThan(3.6)
    expect(ratio).toBeLessThan(4.4)
  })
})
