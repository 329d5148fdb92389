import { describe, expect, it } from 'vitest'
import { chooseGrid } from './grid-step'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import { describeIssuePath } from '../api/issue-path-labels'
import { applySweepValue, fieldProblem, readSweepValue } from './sweep-fields'
import { broadbandCorrelationLengthM, broadbandPeak, correlationFigures } from './correlation-figures'

const waveguide = { name: 'test fibre', lengthM: 20, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.85, linewidthMHz: 25, wavelengthNm: 1550 }
const config = (port: Record<string, unknown>, extra: Partial<SimulationConfigInput> = {}): SimulationConfigInput => ({
  waveguide,
  windowNs: 300,
  channels: [{ pump: { backgroundPowerW: 0.01, ...port }, stokes: { backgroundPowerW: 0.001 } }],
  ...extra,
})

describe('time-step rules of modulated and broadband sources', () => {
  it('picks ten steps per Carson bandwidth 2(Δf + f_m) (Carson 1922, common practice) and names the excursion', () => {
    const g = chooseGrid(SimulationConfig.parse(config({ modulation: { rateMHz: 10, excursionMHz: 990 } })))
    // 1/(10 · 2 · 1000 MHz) = 50 ps, rounded down so that Δz tiles L
    expect(g.dtS).toBeLessThanOrEqual(50e-12)
    expect(g.dtS).toBeGreaterThan(49e-12)
    expect(g.binding.field).toBe('channels.0.pump.modulation.excursionMHz')
  })

  it('picks 2πΔν·Δt ≤ 0.05 rad² for a broadband source', () => {
    const g = chooseGrid(SimulationConfig.parse(config({ broadband: { linewidthMHz: 1000, seed: 4 } })))
    const limitS = 0.05 / (2 * Math.PI * 1e9)
    expect(g.dtS).toBeLessThanOrEqual(limitS)
    expect(g.dtS).toBeGreaterThan(0.98 * limitS)
    expect(g.binding.field).toBe('channels.0.pump.broadband.linewidthMHz')
  })

  it('refuses a set step coarser than two samples per Carson bandwidth, on the time step, stating the limit', () => {
    // 2 · 2(990 + 10) MHz = 4 GHz → at most 250 ps
    const ok = SimulationConfig.safeParse(config({ modulation: { rateMHz: 10, excursionMHz: 990 } }, { grid: { timeStepPs: 250 } }))
    expect(ok.success).toBe(true)
    const bad = SimulationConfig.safeParse(config({ modulation: { rateMHz: 10, excursionMHz: 990 } }, { grid: { timeStepPs: 260 } }))
    expect(bad.success).toBe(false)
    const issue = bad.error!.issues.find((i) => i.path.join('.') === 'grid.timeStepPs')
    expect(issue?.message).toMatch(/at most 250 ps.*Carson bandwidth/)
  })

  it('refuses a set step over which a broadband source diffuses more than 0.5 rad²', () => {
    // 0.5/(2π · 100 MHz) = 796 ps
    const bad = SimulationConfig.safeParse(config({ broadband: { linewidthMHz: 100 } }, { grid: { timeStepPs: 800 } }))
    expect(bad.error?.issues.find((i) => i.path.join('.') === 'grid.timeStepPs')?.message).toMatch(/at most 796 ps/)
    expect(SimulationConfig.safeParse(config({ broadband: { linewidthMHz: 100 } }, { grid: { timeStepPs: 790 } })).success).toBe(true)
  })

  it('refuses a zero modulation rate and names the field in plain words', () => {
    const bad = SimulationConfig.safeParse(config({ modulation: { rateMHz: 0, excursionMHz: 100 } }))
    const issue = bad.error!.issues[0]
    expect(issue.message).toBe('must be above 0')
    expect(describeIssuePath(issue.path, 1)).toBe('Pump, frequency modulation, rate')
  })
})

describe('sweeping the modulation', () => {
  const base = SimulationConfig.parse({
    ...config({ modulation: { rateMHz: 10, excursionMHz: 500 } }),
    channels: [{ pump: { backgroundPowerW: 0.01, modulation: { rateMHz: 10, excursionMHz: 500 } }, stokes: { backgroundPowerW: 0.001, modulation: { rateMHz: 10, excursionMHz: 500, delayNs: 2 } } }],
  })

  it('sets the delay of a broadband Stokes input', () => {
    const bb = SimulationConfig.parse({ ...config({}), channels: [{ pump: { backgroundPowerW: 0.01, broadband: { linewidthMHz: 50, seed: 3 } }, stokes: { backgroundPowerW: 0.001, broadband: { linewidthMHz: 50, seed: 3 } } }] })
    const c = applySweepValue(bb, 'modulationDelayNs', 12)
    expect(c.channels[0].stokes.broadband?.delayNs).toBe(12)
    expect(c.channels[0].pump.broadband?.delayNs).toBe(0)
    expect(fieldProblem(bb, 'modulationDelayNs')).toBeNull()
  })

  it('sets rate and excursion on every modulated input and the delay on the Stokes inputs only', () => {
    const c = applySweepValue(applySweepValue(applySweepValue(base, 'modulationRateMHz', 12), 'modulationExcursionMHz', 700), 'modulationDelayNs', 9)
    expect(c.channels[0].pump.modulation).toEqual({ rateMHz: 12, excursionMHz: 700, delayNs: 0 })
    expect(c.channels[0].stokes.modulation).toEqual({ rateMHz: 12, excursionMHz: 700, delayNs: 9 })
    expect(readSweepValue(c, 'modulationDelayNs')).toBe(9)
    expect(readSweepValue(base, 'modulationRateMHz')).toBe(10)
  })

  it('explains why a configuration without modulation cannot sweep it', () => {
    const plain = SimulationConfig.parse(config({}))
    expect(fieldProblem(plain, 'modulationRateMHz')).toMatch(/no frequency-modulated input/)
    expect(fieldProblem(plain, 'modulationDelayNs')).toMatch(/no modulated or broadband Stokes input/)
    expect(fieldProblem(base, 'modulationDelayNs')).toBeNull()
  })
})

describe('correlation figures shown in the form', () => {
  it('gives d_m = v_g/(2f_m) and Δz = v_g Δν_B/(2π f_m Δf) (Hotate & Hasegawa 2000)', () => {
    // n_g = 1.5: v_g = 199 861 638.7 m/s; f_m = 10 MHz → d_m = 9.993 m; Δν_B = 30 MHz, Δf = 3 GHz → Δz = 3.1809 cm (worked by hand)
    const f = correlationFigures(1.5, 30, 10, 3000)
    expect(f.peakSpacingM).toBeCloseTo(9.99308, 4)
    expect(f.peakWidthM!).toBeCloseTo(0.031809, 6)
    expect(f.widthIsLowerBound).toBe(false)
    expect(correlationFigures(1.5, 30, 20, 3000).widthIsLowerBound).toBe(true)
    expect(correlationFigures(1.5, 30, 10, 0).peakWidthM).toBeNull()
  })

  it('gives a broadband correlation length v_g/(πΔν)', () => {
    // v_g = c/1.5, Δν = 100 MHz: 199 861 638.7/(π · 10⁸) = 0.636179 m
    expect(broadbandCorrelationLengthM(1.5, 100)).toBeCloseTo(0.636179, 5)
  })

  it('gives the shared broadband source\'s peak: FWHM v_g ln 2/(π(Δν_B + 2Δν)) over a floor Δν_B/(Δν_B + 2Δν)', () => {
    // v_g = c/1.5, Δν_B = 30 MHz, Δν = 135 MHz: 199 861 638.7 · 0.693147/(π · 300 MHz) = 0.146989 m; floor 0.1
    const p = broadbandPeak(1.5, 30, 135)
    expect(p.widthM).toBeCloseTo(0.146989, 5)
    expect(p.floor).toBeCloseTo(0.1, 12)
  })
})

describe('limits of a source', () => {
  it('refuses Δf + f_m ≥ ν_B/2, a linewidth above ν_B/10 and a broadband delay longer than the window, on the field at fault', () => {
    // ν_B = 10.85 GHz: Δf + f_m < 5425 MHz, Δν ≤ 1085 MHz
    expect(SimulationConfig.safeParse(config({ modulation: { rateMHz: 10, excursionMHz: 5400 } })).success).toBe(true)
    const wide = SimulationConfig.safeParse(config({ modulation: { rateMHz: 30, excursionMHz: 5400 } }))
    expect(wide.error!.issues.map((i) => i.path.join('.'))).toEqual(['channels.0.pump.modulation.excursionMHz'])
    expect(SimulationConfig.safeParse(config({ broadband: { linewidthMHz: 1085 } })).success).toBe(true)
    const late = SimulationConfig.safeParse(config({ broadband: { linewidthMHz: 100, delayNs: 301 } }))
    expect(late.error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['channels.0.pump.broadband.delayNs', 'The delay must lie within ±300 ns, the simulated window']])
    const broad = SimulationConfig.safeParse(config({ broadband: { linewidthMHz: 1100 } }))
    expect(broad.error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['channels.0.pump.broadband.linewidthMHz', expect.stringMatching(/a tenth of the Brillouin shift \(1085 MHz\)/)]])
  })
})

describe('sources on the further inputs of a channel', () => {
  it('takes a co-propagating probe’s modulation into the grid and its limits', () => {
    const withProbe = (modulation: Record<string, number>) => ({ ...config({}), channels: [{ pump: { backgroundPowerW: 0.01 }, stokes: { backgroundPowerW: 0.001 }, coProbe: { backgroundPowerW: 0.001, modulation } }] })
    const g = chooseGrid(SimulationConfig.parse(withProbe({ rateMHz: 10, excursionMHz: 990 })))
    expect(g.binding.field).toBe('channels.0.coProbe.modulation.excursionMHz')
    const wide = SimulationConfig.safeParse(withProbe({ rateMHz: 30, excursionMHz: 5400 }))
    expect(wide.error!.issues.map((i) => i.path.join('.'))).toEqual(['channels.0.coProbe.modulation.excursionMHz'])
  })
})

describe('channels with modulated inputs', () => {
  it('keeps them ten linewidths plus each spectral half-width apart, on the later channel’s offset', () => {
    // Δν_B = 25 MHz: 250 MHz, plus (990 + 10) MHz of the modulated channel: 1.25 GHz
    const two = (offsetGHz: number) =>
      SimulationConfig.safeParse({
        ...config({}),
        channels: [{ pump: { backgroundPowerW: 0.01, modulation: { rateMHz: 10, excursionMHz: 990 } }, stokes: { backgroundPowerW: 0.001 } }, { offsetGHz, pump: { backgroundPowerW: 0.01 }, stokes: { backgroundPowerW: 0.001 } }],
      })
    expect(two(1.26).success).toBe(true)
    expect(two(1.24).error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['channels.1.offsetGHz', expect.stringMatching(/at least 1\.25 GHz apart/)]])
  })
})
