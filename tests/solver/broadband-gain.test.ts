/*
 * A broadband pump: a CW pump whose phase diffuses with Lorentzian linewidth Δν_p amplifies a narrow CW Stokes
 * wave by the Brillouin line convolved with the pump's line, so at the line centre the gain exponent falls by
 * Δν_B/(Δν_B + Δν_p) (Agrawal, Nonlinear Fiber Optics, ch. 9, gain of a pump of finite spectral width; from
 * memory). Small gain (G_B P L = 0.075 on the chip), so the Stokes wave does not pull the pump's phase; the time
 * average of ln(P_out/P_in) over many correlation times and six seeds.
 */
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, powerAt } from './chip-fixtures'

const PUMP_W = 0.005
const STOKES_W = 1e-6
/** Chip: G_B = 300 /(W m), L = 5 cm, Δν_B = 34 MHz (tests/solver/chip-fixtures.ts). */
const NARROW_LN_GAIN = 300 * PUMP_W * 0.05

function meanLnGain(linewidthMHz: number, seed: number): number {
  const r = simulateSync(
    chipConfig({
      windowNs: 6000,
      channels: [{ pump: { backgroundPowerW: PUMP_W, broadband: { linewidthMHz, seed } }, stokes: { backgroundPowerW: STOKES_W } }],
      grid: { mapRows: 16, mapCols: 16 },
      options: { errorEstimate: false },
    }),
  )
  expect(r.status).toBe('finished')
  const out = r.channels[0].stokesOut
  const n = out.length / 2
  // Skip the first 5 %: the guide fills (0.4 ns) and the sound settles (a few phonon lifetimes).
  let sum = 0
  let count = 0
  for (let i = Math.floor(0.05 * n); i < n; i++, count++) sum += Math.log(powerAt(out, i) / STOKES_W)
  return sum / count
}

describe('gain of a broadband pump', () => {
  it.each([34, 102])('a pump of linewidth %s MHz has its gain exponent reduced by Δν_B/(Δν_B + Δν_p) within 6 per cent', (linewidthMHz) => {
    const seeds = [1, 2, 3, 4, 5, 6]
    const mean = seeds.map((s) => meanLnGain(linewidthMHz, s)).reduce((a, b) => a + b, 0) / seeds.length
    const expected = (NARROW_LN_GAIN * 34) / (34 + linewidthMHz)
    expect(Math.abs(mean / expected - 1)).toBeLessThan(0.06)
  })
})
