// Pulses cut by the simulated window are refused before queueing, with the fix in the message.
import { describe, expect, it } from 'vitest'
import { SimulationConfig, SimulationConfigBase } from '@shared/physics/simulation-config'
import { outsideFractions, truncationMessage } from '@shared/physics/pulse-truncation'
import { sampleInput } from '@shared/physics/pulse-envelope'
import { simulateSync } from '../../solver/index'
import { CHIP_WAVEGUIDE } from './chip-fixtures'

const data = (centreNs: number, fwhmNs = 2) => ({ shape: 'gaussian' as const, label: 'data', peakPowerW: 0.01, centreNs, fwhmNs, phaseRad: 0, frequencyOffsetMHz: 0 })
const config = (centreNs: number, windowNs = 10) => ({ waveguide: CHIP_WAVEGUIDE, windowNs, channels: [{ pump: { pulses: [data(centreNs)] } }] })
/** Gaussian pulse energy E = P·F·√(π/(4 ln 2)) (closed form of ∫exp(−4 ln2 t²/F²) dt). */
const gaussianEnergyJ = (pW: number, fwhmNs: number) => pW * fwhmNs * 1e-9 * Math.sqrt(Math.PI / (4 * Math.LN2))

describe('pulses cut by the window', () => {
  it('a 2 ns, 10 mW data pulse centred at 1 ns launches only 18.8 pJ of its 21.3 pJ (what the sampling does)', () => {
    const base = SimulationConfigBase.parse(config(1))
    const dtS = 1e-12
    const trace = sampleInput(base.channels[0].pump, Math.round(10e-9 / dtS), dtS)
    let launchedJ = 0
    for (let n = 0; n < trace.length / 2; n++) launchedJ += (trace[2 * n] ** 2 + trace[2 * n + 1] ** 2) * dtS
    expect(gaussianEnergyJ(0.01, 2)).toBeCloseTo(21.29e-12, 13)
    expect(launchedJ).toBeCloseTo(18.75e-12, 13)
    // The shared fraction agrees with what the solver's sampling actually loses.
    expect(outsideFractions(base.channels[0].pump.pulses[0], 10).before).toBeCloseTo(1 - launchedJ / gaussianEnergyJ(0.01, 2), 3)
  })

  it('refuses it on the centre field, saying how much is lost and where the centre or width must go', () => {
    const r = SimulationConfig.safeParse(config(1))
    expect(r.success).toBe(false)
    const issue = r.error!.issues.find((i) => i.path.join('.') === 'channels.0.pump.pulses.0.centreNs')!
    expect(issue.message).toMatch(/^12 % of this pulse's energy falls before t = 0/)
    // ½·erfc(2√ln2·c/F) = 10⁻³ → c = 2.185·F/(2√ln2) = 2.62 ns for F = 2 ns; rounded up so it passes.
    expect(issue.message).toContain('move the centre to ≥ 2.63 ns')
    expect(issue.message).toContain('shorten the FWHM to ≤ 0.762 ns')
    expect(SimulationConfig.safeParse(config(2.63)).success).toBe(true)
    expect(SimulationConfig.safeParse(config(2.6)).success).toBe(false)
  })

  it('applies the same rule at the window end', () => {
    const r = SimulationConfig.safeParse(config(9))
    expect(r.error!.issues[0].message).toMatch(/falls after the window ends at 10 ns.*move the centre to ≤ 7.37 ns/)
  })

  it('the solver refuses the same configuration with the field named', () => {
    const r = simulateSync(config(1) as unknown as SimulationConfig)
    expect(r.status).toBe('failed')
    expect(r.manifest.issues.map((i) => i.path)).toContain('channels.0.pump.pulses.0.centreNs')
  })

  it('measures other shapes by their own energy: sech² closed form and a sampled staircase', () => {
    const sech2 = { ...data(1), shape: 'sech2' as const, phaseRad: 0, frequencyOffsetMHz: 0 }
    // ∫ sech² = tanh: the share before 0 is (1 − tanh(c/T₀))/2 with F = 2 ln(1+√2)·T₀.
    const t0 = 2 / (2 * Math.log(1 + Math.SQRT2))
    expect(outsideFractions(sech2, 10).before).toBeCloseTo((1 - Math.tanh(1 / t0)) / 2, 10)
    // Flat-topped sampled pulse from −0.5 to 1.5 ns with linear edges: energy 1.5 ns·P, of which the ramp from −0.5 to 0 (0.25 ns·P) lies before 0.
    const sampled = { shape: 'sampled' as const, label: 'x', peakPowerW: 1, centreNs: 0.5, phaseRad: 0, frequencyOffsetMHz: 0, sampleIntervalNs: 0.5, powerShape: [0, 1, 1, 1, 0] }
    expect(outsideFractions(sampled, 10).before).toBeCloseTo(0.25 / 1.5, 10)
    // Centre 0.962 ns leaves 0.038 ns of the 0.5 ns ramp outside: 0.038²/(2·0.5)/1.5 = 9.6e-4 ≤ 10⁻³.
    expect(truncationMessage(sampled, 10)).toMatch(/move the centre to ≥ 0\.962 ns/)
  })

  it('leaves the shipped examples and a pulse well inside the window alone', () => {
    expect(truncationMessage(data(5), 10)).toBeNull()
  })
})
