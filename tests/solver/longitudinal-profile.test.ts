// Waveguides whose Brillouin response varies along z: the local shift, linewidth, gain and loss act cell by
// cell, a uniform profile changes no bit, and the grid refuses a feature shorter than two cells.
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { SHIFT_COEFFICIENTS, segmentShiftMHz } from '@shared/physics/longitudinal-profile'
import { FIBRE, probeTrace, sensingConfig } from './sensing-fixtures'

const G_B_PER_WM = FIBRE.gainCoefficientMPerW / 80e-12

/** CW pump and probe on a 2 m fibre, 150 ns (≥ 20/Γ_B after the transit): ln of the probe's gain at the end. */
function cwLnGain(segments: Record<string, number>[], detuningMHz: number, extra: Record<string, number> = {}): number {
  const config = SimulationConfig.parse({
    waveguide: { ...FIBRE, lengthM: 2, ...extra, profile: { segments } },
    channels: [{ pump: { backgroundPowerW: 0.1 }, stokes: { backgroundPowerW: 1e-6 } }],
    detuningMHz,
    windowNs: 150,
    // 100 ps (2 cm): the scheme's second-order error in the off-resonant gain stays below 10⁻⁴.
    grid: { mapRows: 16, mapCols: 16, timeStepPs: 100 },
    options: { errorEstimate: false },
  })
  const { powerW, run } = probeTrace(config)
  expect(run.profile).not.toBeNull()
  return Math.log(powerW[powerW.length - 1] / 1e-6)
}

describe('shift coefficients of silica fibre near 1550 nm', () => {
  it('turn temperature and strain into a shift of about 1 MHz/K and 0.05 MHz/µε', () => {
    // Common practice: ≈ +1 MHz/K (Kurashima et al. 1990, Opt. Lett. 15, 1038, a coefficient of this size) and
    // ≈ +0.05 MHz/µε (Horiguchi, Kurashima & Tateda 1989, IEEE Photon. Technol. Lett. 1, 107); both from memory.
    expect(SHIFT_COEFFICIENTS.mhzPerK).toBeGreaterThan(0.9)
    expect(SHIFT_COEFFICIENTS.mhzPerK).toBeLessThan(1.2)
    expect(SHIFT_COEFFICIENTS.mhzPerMicrostrain).toBeGreaterThan(0.04)
    expect(SHIFT_COEFFICIENTS.mhzPerMicrostrain).toBeLessThan(0.06)
    expect(segmentShiftMHz({ shiftOffsetMHz: 2, temperatureOffsetK: 35, strainMicro: 200 })).toBeCloseTo(2 + 35 * SHIFT_COEFFICIENTS.mhzPerK + 200 * SHIFT_COEFFICIENTS.mhzPerMicrostrain, 12)
  })

  it('a fibre 35 K warmer has its gain peak 35 MHz higher: the Lorentzian of the undepleted closed form', () => {
    // Undepleted pump, α = 0: ln(P_s(0)/P_s(L)) = G_B P L/(1 + (2(Δ − δν)/Δν_B)²) (Agrawal, Nonlinear Fiber Optics, ch. 9).
    const peak = G_B_PER_WM * 0.1 * 2
    const warm = [{ startM: 0, endM: 2, temperatureOffsetK: 35 }]
    expect(cwLnGain(warm, 35)).toBeCloseTo(peak, 3)
    expect(cwLnGain(warm, 0) / peak).toBeCloseTo(1 / (1 + (70 / 30) ** 2), 3)
    const strained = [{ startM: 0, endM: 2, strainMicro: 35 / SHIFT_COEFFICIENTS.mhzPerMicrostrain }]
    expect(cwLnGain(strained, 35)).toBeCloseTo(peak, 3)
  })

  it('local gain coefficient, linewidth and loss act where the segment lies (closed forms)', () => {
    const peak = G_B_PER_WM * 0.1 * 2
    // Half the fibre with twice g_B: ln gain 1.5× (undepleted closed form, ch. 9 of Agrawal).
    expect(cwLnGain([{ startM: 1, endM: 2, gainCoefficientMPerW: 1e-10 }], 0) / peak).toBeCloseTo(1.5, 2)
    // A 15 MHz line everywhere: at Δ = 7.5 MHz, its half width at half maximum, the Lorentzian gives half the peak.
    expect(cwLnGain([{ startM: 0, endM: 2, linewidthMHz: 15 }], 7.5) / peak).toBeCloseTo(0.5, 2)
    // 1 m at 3 dB/m and no pump gain (far detuned): the probe loses 3 dB (Beer–Lambert).
    const lossy = cwLnGain([{ startM: 0.5, endM: 1.5, lossDbPerM: 3 }], 5000)
    // (The gain 5 GHz off the line, G_B P L/(1 + (10⁴/30)²) ≈ 10⁻⁶, is far below the tolerance.)
    expect(lossy).toBeCloseTo(-3 / (10 / Math.LN10), 3)
  })
})

describe('a uniform profile', () => {
  it('gives the same result bit for bit as no profile (pulsed pump, CW probe, with loss)', () => {
    const setup = { lengthM: 20, pumpFwhmNs: 10, pumpPowerW: 0.5, probePowerW: 1e-4, segments: [] }
    const extra = { waveguide: { ...FIBRE, lengthM: 20, lossDbPerM: 0.01 } }
    const plain = probeTrace(sensingConfig(setup, 7, extra))
    const uniform = sensingConfig(setup, 7, extra)
    uniform.waveguide.profile = {
      segments: [
        { startM: 0, endM: 5, shiftOffsetMHz: 0, temperatureOffsetK: 0, strainMicro: 0 },
        { startM: 8, endM: 20, shiftOffsetMHz: 0, temperatureOffsetK: 0, strainMicro: 0, linewidthMHz: FIBRE.linewidthMHz, gainCoefficientMPerW: FIBRE.gainCoefficientMPerW, lossDbPerM: 0.01 },
      ],
    }
    const profiled = probeTrace(uniform)
    expect(plain.run.profile).toBeNull()
    expect(profiled.run.profile).not.toBeNull()
    expect(profiled.powerW.length).toBe(plain.powerW.length)
    expect(Buffer.from(profiled.run.traces[0].stokesOut.buffer).equals(Buffer.from(plain.run.traces[0].stokesOut.buffer))).toBe(true)
    expect(Buffer.from(profiled.run.traces[0].pumpOut.buffer).equals(Buffer.from(plain.run.traces[0].pumpOut.buffer))).toBe(true)
    // … and the probe did see the pump: the comparison is not between two empty traces.
    expect(Math.max(...plain.powerW) / plain.powerW[Math.floor(plain.powerW.length / 3)]).toBeGreaterThan(1.01)
  })
})

describe('grid rule of a profile', () => {
  const segments = [
    { startM: 2, endM: 6, shiftOffsetMHz: 10 },
    { startM: 10, endM: 10.4, shiftOffsetMHz: 20 },
  ]
  const setup = { lengthM: 20, pumpFwhmNs: 40, pumpPowerW: 0.1, probePowerW: 1e-4, segments }
  it('the automatic step gives every feature at least two cells', () => {
    const grid = chooseGrid(sensingConfig(setup, 0))
    expect(grid.dzM).toBeLessThanOrEqual(0.2 + 1e-12)
    expect(grid.reasons[0]).toMatch(/segment 2/)
  })
  it('a step too coarse for a segment is refused, naming the segment and the step it needs', () => {
    // Δz = v_g·Δt = 0.3 m > 0.4 m/2: the 0.4 m segment spans 1.3 cells.
    const r = SimulationConfig.safeParse({ ...sensingConfig(setup, 0), grid: { mapRows: 16, mapCols: 16, timeStepPs: 1469 } })
    expect(r.success).toBe(false)
    const msg = r.error!.issues.map((i) => i.message).join(' ')
    expect(msg).toMatch(/segment 2 \(10 m to 10\.4 m\)/)
    expect(msg).toMatch(/step ≤ 979 ps/)
  })
})
