import { describe, expect, it } from 'vitest'
import type { SweepAxis, SweepDetail } from '../api/sweeps'
import { SimulationConfig } from '../physics/simulation-config'
import { sweepAnalyses } from './sweep-fits'

// Invented demo set-ups: a chalcogenide rib storing a data pulse (write at 1 ns, read later) and a 50 m silica
// fibre amplifier with CW pump and Stokes.
const pulse = (label: string, centreNs: number, peakPowerW: number) => ({ shape: 'gaussian', label, peakPowerW, centreNs, fwhmNs: 0.2 })
const EXAMPLES = {
  storage: {
    schemaVersion: 1,
    waveguide: { name: 'Rib', lengthM: 0.07, groupIndex: 2.44, phaseIndex: 2.37, lossDbPerM: 30, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34, wavelengthNm: 1550 },
    channels: [{ pump: { pulses: [pulse('data', 1, 0.01)], backgroundPowerW: 0 }, stokes: { pulses: [pulse('write', 1, 8), pulse('read', 4, 8)], backgroundPowerW: 0 } }],
    detuningMHz: 0,
    windowNs: 9,
    grid: { mapRows: 64, mapCols: 64 },
  },
  amplifier: {
    schemaVersion: 1,
    waveguide: { name: 'SMF', lengthM: 50, groupIndex: 1.468, phaseIndex: 1.45, lossDbPerM: 0.0002, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.852, linewidthMHz: 20, wavelengthNm: 1550 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.3 }, stokes: { pulses: [], backgroundPowerW: 1e-6 } }],
    detuningMHz: 0,
    windowNs: 600,
    grid: { timeStepPs: 200, mapRows: 64, mapCols: 64 },
  },
}
const example = (name: 'storage' | 'amplifier') => SimulationConfig.parse(EXAMPLES[name])

function sweepOf(baseConfig: SimulationConfig, axis: SweepAxis, values: number[], metric: (x: number) => number | null, key: string) {
  const points = values.map((x, index) => ({
    index,
    values: [x],
    runId: '00000000-0000-4000-8000-000000000000',
    status: 'succeeded' as const,
    progress: 1,
    attempt: 1,
    error: null,
    startedAt: null,
    finishedAt: null,
    metrics: { [key]: metric(x) },
  }))
  return { axes: [axis], baseConfig, metrics: [{ key, label: key, unit: '1' }], points } satisfies Pick<SweepDetail, 'axes' | 'baseConfig' | 'metrics' | 'points'>
}

describe('sweepAnalyses', () => {
  it('fits the retrieval efficiency of a read-pulse sweep against the delay after the write pulse', () => {
    // Store and retrieve in a 34 MHz rib: the stored energy decays at Γ_B = 2π·34 MHz, so η(τ) ∝ exp(−Γ_B τ)
    // (docs/model.md, conventions; Agrawal, Nonlinear Fiber Optics, ch. 9). Write pulse at 1 ns.
    const cfg = example('storage')
    const gammaPerNs = 2 * Math.PI * 0.034
    const s = sweepOf(cfg, { field: 'pulseCentreNs', pulseLabel: 'read', values: { kind: 'list', values: [2, 3, 4, 5, 6] } }, [2, 3, 4, 5, 6], (t) => 0.094 * Math.exp(-gammaPerNs * (t - 1)), 'retrievalEfficiency')
    const [a] = sweepAnalyses(s)
    if (a?.kind !== 'lifetime' || !a.result.ok) throw new Error('no lifetime fit')
    expect(a.offsetNs).toBe(1)
    expect(a.result.fit.rate).toBeCloseTo(gammaPerNs, 9)
    // η₀ at τ = 0 (the write time), not at the axis' zero.
    expect(a.result.fit.amplitude).toBeCloseTo(0.094, 9)
    // 1/(2π·34 MHz) = 4.681 ns.
    expect(a.nominalEnergyLifetimeNs).toBeCloseTo(4.6810, 3)
  })

  it('fits against the axis itself when it is the write–read delay', () => {
    const cfg = example('storage')
    const gammaPerNs = 2 * Math.PI * 0.034
    const tau = [1, 2, 3, 4]
    const s = sweepOf(cfg, { field: 'storageDelayNs', values: { kind: 'list', values: tau } }, tau, (t) => 0.08 * Math.exp(-gammaPerNs * t), 'retrievalEfficiency')
    const [a] = sweepAnalyses(s)
    if (a?.kind !== 'lifetime' || !a.result.ok) throw new Error('no lifetime fit')
    expect([a.anchor, a.offsetNs]).toEqual(['axis', 0])
    expect(a.result.fit.rate).toBeCloseTo(gammaPerNs, 9)
    expect(a.result.fit.amplitude).toBeCloseTo(0.08, 9)
  })

  it('offers no lifetime fit when the swept pulse is not the read pulse', () => {
    const cfg = example('storage')
    const s = sweepOf(cfg, { field: 'pulseCentreNs', pulseLabel: 'write', values: { kind: 'list', values: [0.5, 1, 1.5] } }, [0.5, 1, 1.5], () => 0.05, 'retrievalEfficiency')
    expect(sweepAnalyses(s)).toEqual([])
  })

  it('fits the small-signal gain slope of a CW pump-power sweep and states the closed-form slope beside it', () => {
    // 50 m of silica fibre, g_B = 5e-11 m/W, A_eff = 80 µm², 0.0002 dB/m:
    // α = 0.0002/4.343 per m, L_eff = (1 − e^(−αL))/α, slope = 10·log10(e)·g_B·L_eff/A_eff dB/W (Agrawal, ch. 9).
    const cfg = example('amplifier')
    const alpha = 0.0002 / (10 / Math.LN10)
    const lEff = (1 - Math.exp(-alpha * 50)) / alpha
    const closedForm = ((10 / Math.LN10) * 5e-11 * lEff) / 80e-12
    const p = [0.05, 0.1, 0.15, 0.2, 0.25]
    const s = sweepOf(cfg, { field: 'pumpPowerW', values: { kind: 'list', values: p } }, p, (x) => closedForm * x - 0.01, 'peakStokesGainDb')
    const [a] = sweepAnalyses(s)
    if (a?.kind !== 'gainSlope' || !a.result.ok) throw new Error('no gain fit')
    expect(a.nominalSlopeDbPerW).toBeCloseTo(closedForm, 9)
    expect(closedForm).toBeCloseTo(135.6, 1)
    expect(a.result.fit.slope).toBeCloseTo(closedForm, 9)
  })

  it('gives the slope in dB/W for an axis in units of the critical power', () => {
    // P_cr = 21·A_eff/(η g_B L_eff) (Smith 1972): 21·80e-12/(5e-11·L_eff) ≈ 0.673 W for 50 m.
    const cfg = example('amplifier')
    const alpha = 0.0002 / (10 / Math.LN10)
    const lEff = (1 - Math.exp(-alpha * 50)) / alpha
    const pCr = (21 * 80e-12) / (5e-11 * lEff)
    const x = [0.05, 0.1, 0.15, 0.2]
    const s = sweepOf(cfg, { field: 'pumpPowerCritical', values: { kind: 'list', values: x } }, x, (u) => 120 * u * pCr, 'peakStokesGainDb')
    const [a] = sweepAnalyses(s)
    if (a?.kind !== 'gainSlope' || !a.result.ok) throw new Error('no gain fit')
    expect(a.wattsPerAxisUnit).toBeCloseTo(pCr, 9)
    expect(a.result.fit.slope).toBeCloseTo(120, 9)
    expect(a.result.fit.maxPowerUsedW).toBeCloseTo(0.2 * pCr, 12)
  })

  it('leaves out points that did not finish', () => {
    const cfg = example('amplifier')
    const p = [0.05, 0.1, 0.15, 0.2]
    const s = sweepOf(cfg, { field: 'pumpPowerW', values: { kind: 'list', values: p } }, p, (x) => 100 * x, 'peakStokesGainDb')
    s.points[3] = { ...s.points[3], status: 'failed', metrics: { peakStokesGainDb: null } } as never
    const [a] = sweepAnalyses(s)
    if (a?.kind !== 'gainSlope' || !a.result.ok) throw new Error('no gain fit')
    expect(a.result.fit.points).toBe(3)
  })
})
