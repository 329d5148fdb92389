// Each figure carries its meaning: only the figures of the run's scheme, energy ratios as fractions on
// every surface, cautions with the real ratio.
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { metricColumns, reduceFigures } from '@shared/analysis/sweep-metrics'
import { describeRatio } from '@shared/physics/laser-safety'
import { deriveQuantities } from '@shared/physics/derived-quantities'
import { runScheme } from '@shared/physics/pulse-roles'
import { simulateSync } from '../../solver/index'
import storageExample from '../../solver/examples/store-and-retrieve-chalcogenide-rib.json'
import { chipConfig, gaussian } from './chip-fixtures'
import { slowLightDelayS } from './closed-forms'

const storage = SimulationConfig.parse(storageExample)
// V5 of the validation set: 2 W pump and 50 mW Stokes pulses, T = 0.3 ns, meeting in the chip.
const amplifier = chipConfig({ windowNs: 12, channels: [{ pump: { pulses: [gaussian(2, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }] })

describe('figures by scheme', () => {
  it('tells a storage run from an amplifier run by the pulse roles', () => {
    expect(runScheme(storage)).toBe('storage')
    expect(runScheme(amplifier)).toBe('amplifier')
  })

  it('a storage run has no reflectivity or peak gain anywhere; an amplifier run has no retrieval figures', () => {
    const s = simulateSync(storage).manifest.figures!
    const cols = metricColumns(storage).map((c) => c.key)
    expect(cols).toContain('retrievalEfficiency')
    expect(cols).toContain('leakThrough')
    expect(cols).not.toContain('reflectivity')
    expect(cols).not.toContain('peakStokesGainDb')
    expect(s.channels[0].reflectivity).toBeNull()
    expect(s.channels[0].peakStokesGainDb).toBeNull()

    const a = simulateSync(amplifier).manifest.figures!
    const aCols = metricColumns(amplifier).map((c) => c.key)
    expect(aCols).toEqual(expect.arrayContaining(['peakStokesGainDb', 'reflectivity', 'stokesDelayNs']))
    expect(aCols).not.toContain('retrievalEfficiency')
    expect(a.channels[0].peakStokesGainDb).toBeGreaterThan(0)
    expect(a.channels[0].retrievalEfficiency).toBeNull()
  })

  it('gives an energy ratio the same unit on the sweep page, in the CSV and in the manifest: a fraction', () => {
    const figures = simulateSync(storage).manifest.figures!
    const cols = metricColumns(storage)
    const eff = cols.find((c) => c.key === 'retrievalEfficiency')!
    expect(eff.unit).toBe('fraction')
    // The sweep value is the manifest's number, not a rescaled copy.
    expect(reduceFigures(figures, cols).retrievalEfficiency).toBe(figures.channels[0].retrievalEfficiency)
    expect(figures.channels[0].retrievalEfficiency).toBeGreaterThan(0.01)
    expect(figures.channels[0].retrievalEfficiency).toBeLessThan(1)
  })
})

describe('cautions state the real ratio', () => {
  it('says the Stokes light is hundreds of times the pump, not "100 % of the pump", in a storage run', () => {
    const r = simulateSync(storage)
    const c = r.manifest.figures!.channels[0]
    const ratio = c.energyJ.stokesOut / c.energyJ.pumpIn
    expect(ratio).toBeGreaterThan(100)
    const w = r.manifest.warnings.find((x) => x.code === 'strong-reflection')!
    expect(w.message).toContain(`${describeRatio(ratio)} the pump energy launched`)
    expect(w.message).toMatch(/is \d{3}× the pump/)
    expect(w.message).not.toContain('100 %')
    // The form's estimate before the run says the same kind of thing.
    const pre = deriveQuantities({ waveguide: storage.waveguide, config: storage }).warnings.find((x) => x.code === 'back-reflection')!
    expect(pre.message).toMatch(/may reach \d+× the pump power/)
  })

  it('writes ratios below 1 as a percentage and from 1 up as a multiple', () => {
    expect(describeRatio(0.35)).toBe('35 % of')
    expect(describeRatio(1.2)).toBe('1.2×')
    expect(describeRatio(986.7)).toBe('987×')
  })
})

describe('pulse figures of an amplifier', () => {
  it('gives the delay and width of a single pulse, and says why not with two pulses or a background under it', () => {
    const one = simulateSync(amplifier).manifest.figures!.channels[0]
    expect(one.stokesDelayNs).toBeGreaterThan(0) // slow light: the amplified Stokes is delayed
    expect(one.pumpOutFwhmNs).toBeGreaterThan(0)
    const two = chipConfig({ windowNs: 12, channels: [{ pump: { pulses: [gaussian(2, 1.5, 0.3), gaussian(2, 6, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }] })
    const f2 = simulateSync(two).manifest.figures!.channels[0]
    expect(f2.pumpDelayNs).toBeNull()
    expect(f2.notDetermined.find((d) => d.figure === 'pumpDelayNs')?.code).toBe('several-pulses')
    const bg = chipConfig({ windowNs: 12, channels: [{ pump: { pulses: [gaussian(2, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)], backgroundPowerW: 0.01 } }] })
    const f3 = simulateSync(bg).manifest.figures!.channels[0]
    expect(f3.stokesDelayNs).toBeNull()
    expect(f3.notDetermined.find((d) => d.figure === 'stokesDelayNs')?.message).toMatch(/continuous background/)
  })

  it('a slow-light delay whose output tail is cut by the run end is not given, and the window it names gives the closed form', () => {
    // Source: small-signal Brillouin transfer function H(δ) = exp{(G₀/2)/[1 − 2iδ/Γ_B]} (Agrawal, Nonlinear Fiber
    // Optics, ch. 9; slow light: Okawachi et al., PRL 94, 153902 (2005)). The centroid delay is the group delay
    // (G₀/Γ_B)(1 − x²)/(1 + x²)², x = 2δ/Γ_B, averaged over the output spectrum e^{−δ²T²}|H|² (tests/solver/closed-forms.ts).
    const P = 0.2, T = 3e-9
    const exactNs = slowLightDelayS(300 * P * 0.05, 2 * Math.PI * 34e6, T) * 1e9
    const run = (windowNs: number) => simulateSync(chipConfig({ windowNs, options: { errorEstimate: false }, channels: [{ pump: { backgroundPowerW: P }, stokes: { pulses: [gaussian(1e-6, 25, 3)] } }] })).manifest.figures!.channels[0]
    // 80 ns holds the input pulse's expected arrival + 2 FWHM (35 ns) but not the e^{−Γ_B t} tail: the centroid came out 1 % low.
    const cut = run(80)
    expect(cut.stokesDelayNs).toBeNull()
    const why = cut.notDetermined.find((d) => d.figure === 'stokesDelayNs')!
    expect(why.code).toBe('window-outside-run')
    expect(why.message).toMatch(/^The Stokes output pulse is still arriving when the run ends at 80 ns \(its power there is 0\.\d+ % of its peak\), so its delay would come out short; lengthen the window to at least \d+ ns\.$/)
    expect(cut.notDetermined.find((d) => d.figure === 'stokesOutFwhmNs')?.code).toBe('window-outside-run')
    const neededNs = Number(/at least (\d+) ns/.exec(why.message)![1])
    expect(neededNs).toBeGreaterThan(80)
    expect(neededNs).toBeLessThan(130)
    const whole = run(neededNs)
    expect(whole.notDetermined).toEqual([])
    expect(Math.abs(whole.stokesDelayNs! / exactNs - 1)).toBeLessThan(2e-3)
  })
})
