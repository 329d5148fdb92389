// The per-run numerical error estimate: every run is repeated on the grid with twice the step and each
// figure's Richardson estimate err(h) ≈ (f_2h − f_h)/(2^p − 1) is attached (solver/observers/error-estimate.ts).
// Checked against closed forms on grids coarse enough that the discretisation error dominates round-off
// and the model's own approximations: the true error (value − closed form) must lie within a factor 2 of
// the estimate. Then the flag, the reasons for no estimate, the switch and where the estimate is carried.
import { describe, expect, it } from 'vitest'
import { planCoarseRun } from '@shared/physics/error-estimate-plan'
import { numericLeaves, type FigureError, type FigureErrors } from '@shared/physics/figure-error'
import { SimulationManifest, type FiguresOfMerit } from '@shared/physics/simulation-result'
import { errorKey, metricColumns, reduceFigures } from '@shared/analysis/sweep-metrics'
import type { SweepDetail } from '@shared/api/sweeps'
import { chooseGrid } from '@shared/physics/grid-step'
import { estimateResources } from '@shared/physics/resource-estimate'
import { simulate, simulateSync, type SimulationResult } from '../../solver/index'
import { buildRunManifest } from '../../solver/io/manifest'
import { estimateFigureErrors, figureError } from '../../solver/observers/error-estimate'
import { sweepCsv } from '../../server/modules/sweeps/sweep-csv'
import { chipConfig, gaussian, last, powerAt } from './chip-fixtures'
import { exactDepletion, slowLightDelayS } from './closed-forms'
import { mainRunShare, runProgressLabel } from '../../src/components/run/run-progress'

const GB_PER_W_M = 300 // chip waveguide: g_B/A_eff = 3e-10 m/W / 1 µm²
const L_M = 0.05
const GAMMA_B = 2 * Math.PI * 34e6 // Γ_B = 2π·Δν_B (1/s)
/** ω_p/ω_s with ν_B = 7.7 GHz at 1550 nm. */
const FREQ_RATIO = 1 / (1 - (7.7e9 * 1550e-9) / 299_792_458)

const estimateOf = (r: SimulationResult): FigureErrors => {
  expect(r.status).toBe('finished')
  const e = r.manifest.figures!.errorEstimate!
  expect(e.status).toBe('estimated')
  return e
}
/** The signed estimate of f_h − f, from the stored values. */
const signed = (e: FigureErrors, f: FigureError) => (f.coarseValue - f.value) / ((e.coarseTimeStepPs! / e.timeStepPs!) ** e.order - 1)
/** True error over estimated error: within a factor 2 means 0.5 … 2 (same sign). */
const expectWithinFactor2 = (trueErr: number, est: number) => {
  const ratio = trueErr / est
  expect(ratio).toBeGreaterThan(0.5)
  expect(ratio).toBeLessThan(2)
}

describe('Richardson estimate against closed forms: true error within a factor 2 of the estimate', () => {
  it.each([['the automatic', undefined], ['a 10 ps', 10]])('exact lossless CW depletion (Tang 1966): steady P_s(0), %s step', (_label, timeStepPs) => {
    // Source: C. L. Tang, J. Appl. Phys. 37, 2945 (1966): with C = P_p − rP_s constant,
    // P_s(z) = b₀C e^{−G_B C z}/(1 − r b₀ e^{−G_B C z}) (tests/solver/closed-forms.ts).
    const P0 = 0.5, PL = 1e-3
    const exactPs0 = exactDepletion(P0, PL, GB_PER_W_M, L_M, FREQ_RATIO).stokesOutW
    // The figures hold energies over the whole window (turn-on transient included) and a peak that overshoots
    // the steady state, so the closed form is compared with the steady output power, and the estimator is
    // applied to it on exactly the companion grid the run uses (checked equal below).
    const config = chipConfig({ windowNs: 150, grid: { timeStepPs }, channels: [{ pump: { backgroundPowerW: P0 }, stokes: { backgroundPowerW: PL } }] })
    const plan = planCoarseRun(config)
    if (!plan.ok) throw new Error(plan.reason)
    const fine = simulateSync(config)
    const coarse = simulateSync(plan.config)
    const steady = (r: SimulationResult) => powerAt(r.channels[0].stokesOut, last(r.channels[0].stokesOut))
    const f = figureError('steadyStokesOutW', steady(fine), steady(coarse), fine.manifest.grid!.dtS, coarse.manifest.grid!.dtS)
    const e = estimateOf(fine)
    expectWithinFactor2(steady(fine) - exactPs0, signed(e, f))
    expect(Math.abs(steady(fine) - exactPs0)).toBeGreaterThan(1e3 * Number.EPSILON * exactPs0)
    // The in-run companion is this very run: its Stokes output energy is the coarse run's.
    expect(e.figures['channels.0.energyJ.stokesOut'].coarseValue).toBe(coarse.manifest.figures!.channels[0].energyJ.stokesOut)
  })

  it.each([['the automatic', undefined], ['a 20 ps', 20]])('undepleted gain with loss exp(G_B P L_eff − αL) (Agrawal, Nonlinear Fiber Optics, ch. 9): peak Stokes gain, %s step', (_label, timeStepPs) => {
    // Source: Agrawal, Nonlinear Fiber Optics, ch. 9, undepleted-pump solution; L_eff = (1 − e^{−αL})/α.
    // A 1 nW seed keeps depletion (∝ G_B P_s L ≈ 1e-8) far below the discretisation error.
    const alpha = 30 / (10 / Math.LN10) // 0.3 dB/cm in 1/m
    const lEff = -Math.expm1(-alpha * L_M) / alpha
    const exactDb = 10 * Math.log10(Math.exp(GB_PER_W_M * 0.05 * lEff - alpha * L_M))
    const r = simulateSync(
      chipConfig({ windowNs: 150, waveguide: { lossDbPerM: 30 }, grid: { timeStepPs }, channels: [{ pump: { backgroundPowerW: 0.05 }, stokes: { backgroundPowerW: 1e-9 } }] }),
    )
    const e = estimateOf(r)
    const f = e.figures['channels.0.peakStokesGainDb']
    expectWithinFactor2(f.value - exactDb, signed(e, f))
    expect(f.absError).toBeCloseTo(Math.abs(signed(e, f)), 15)
  })

  it.each([['the automatic', undefined], ['a 20 ps', 20]])('slow-light delay through H(δ) = exp{(G₀/2)/[1 − 2iδ/Γ_B]} (Agrawal ch. 9): Stokes delay, %s step', (_label, timeStepPs) => {
    // Source: small-signal Brillouin transfer function H(δ) = exp{(G₀/2)/[1 + 2i(Δ − δ)/Γ_B]} at Δ = 0
    // (Agrawal, Nonlinear Fiber Optics, ch. 9; slow light: Okawachi et al., PRL 94, 153902 (2005)). The centroid
    // delay of a pulse is the group delay −dφ/dδ = (G₀/Γ_B)(1 − x²)/(1 + x²)², x = 2δ/Γ_B, averaged over the
    // output spectrum |E(δ)|²|H|², |E|² ∝ e^{−δ²T²} for an amplitude e^{−t²/2T²} (tests/solver/closed-forms.ts).
    const P = 0.2, T = 3e-9
    const exactNs = slowLightDelayS(GB_PER_W_M * P * L_M, GAMMA_B, T) * 1e9
    expect(exactNs).toBeGreaterThan(6)
    // The window leaves the delayed, broadened output (and its e^{−Γ_B t/2} tail) well inside.
    const r = simulateSync(chipConfig({ windowNs: 200, grid: { timeStepPs }, channels: [{ pump: { backgroundPowerW: P }, stokes: { pulses: [gaussian(1e-6, 25, 3)] } }] }))
    const e = estimateOf(r)
    const f = e.figures['channels.0.stokesDelayNs']
    expectWithinFactor2(f.value - exactNs, signed(e, f))
  })

  it('free acoustic decay e^{−Γ_B τ} of a stored grating: no discretisation error, and the estimate says so', () => {
    // Source: free phonon decay at Γ_B (Agrawal ch. 9; Boyd, Nonlinear Optics, §9.3). The scheme advances a
    // free grating by the exact factor e^{−Γ_B Δt/2} per step (solver/steppers/interaction-kernel.ts), so the
    // ratio of retrieved energies after 6 ns and 2 ns carries no grid error of its own: writing and reading
    // are the same in both and cancel. So the factor-2 comparison has nothing to compare; what must hold is that
    // the estimate of the ratio is negligible beside each efficiency's own (≥ 100× smaller) and that the ratio
    // matches the closed form to 1e-6 (what is left is the weak read-out nonlinearity and the window edges).
    const storage = (delayNs: number) =>
      estimateOf(
        simulateSync(
          chipConfig({
            windowNs: 1 + delayNs + 2.5,
            channels: [{ pump: { pulses: [gaussian(1e-5, 1, 0.1, 'data')] }, stokes: { pulses: [gaussian(10, 1, 0.1, 'write'), gaussian(10, 1 + delayNs, 0.1, 'read')] } }],
          }),
        ),
      )
    const a = storage(2), b = storage(6)
    const fa = a.figures['channels.0.retrievalEfficiency'], fb = b.figures['channels.0.retrievalEfficiency']
    const ratio = fb.value / fa.value
    const exact = Math.exp(-GAMMA_B * 4e-9)
    const estRatio = (fb.coarseValue / fa.coarseValue - ratio) / 3
    // The efficiency itself has a grid error to compare with (8.9e-6 with the step-mean that follows the source's
    // change over the step, 3.7e-5 with the trapezoid mean before it; the ratio's estimate is 3.5e-8 with both).
    expect(fa.relError!).toBeGreaterThan(3e-6)
    expect(Math.abs(estRatio / exact)).toBeLessThan(0.01 * fa.relError!)
    expect(Math.abs(ratio / exact - 1)).toBeLessThan(1e-6)
  })
})

describe('flag and suggested step', () => {
  // Pulsed amplifier on a 10 cm chip guide at a coarse 40 ps step.
  const pulsed = (timeStepPs: number) =>
    simulateSync(
      chipConfig({ windowNs: 6, waveguide: { lengthM: 0.1 }, grid: { timeStepPs }, channels: [{ pump: { pulses: [gaussian(0.3, 2, 0.3)] }, stokes: { pulses: [gaussian(1e-3, 2, 0.3)] } }] }),
    )

  it('flags a figure above 1 % with the step that the order-2 scaling puts under 0.1 %, and that step does', () => {
    const coarse = pulsed(40)
    const e = estimateOf(coarse)
    const flagged = Object.entries(e.figures).filter(([, f]) => f.flagged)
    expect(flagged.length).toBeGreaterThan(0)
    for (const [, f] of flagged) {
      expect(f.relError!).toBeGreaterThan(0.01)
      // h_t = h (0.1 % / ε)^{1/2}, rounded down to three digits.
      const h = e.timeStepPs! * Math.sqrt(0.001 / f.relError!)
      expect(f.suggestedTimeStepPs!).toBeLessThanOrEqual(h)
      expect(f.suggestedTimeStepPs!).toBeGreaterThan(0.99 * h)
    }
    for (const f of Object.values(e.figures).filter((x) => !x.flagged)) expect(f.suggestedTimeStepPs).toBeNull()
    expect(coarse.manifest.warnings.find((w) => w.code === 'discretisation-error')?.message).toMatch(/above 1 %.*ps or less brings/)

    const [path, f] = flagged[0]
    const reference = pulsed(0.5).manifest.figures!.errorEstimate!.figures[path].value
    const atSuggested = estimateOf(pulsed(f.suggestedTimeStepPs!)).figures[path]
    expect(atSuggested.flagged).toBe(false)
    expect(atSuggested.relError!).toBeLessThan(0.001)
    expect(Math.abs(atSuggested.value / reference - 1)).toBeLessThan(0.001)
  })

  it('rounds the estimate of a phase across 2π and scales it by a full turn', () => {
    const f = figureError('channels.0.retrievedPhaseRad', 0.01, 2 * Math.PI - 0.01, 1e-12, 2e-12)
    expect(f.absError).toBeCloseTo(0.02 / 3, 12)
    expect(f.relError!).toBeCloseTo(0.02 / 3 / (2 * Math.PI), 12)
  })
})

describe('when there is no estimate', () => {
  it('gives none when the doubled step would resolve the shortest pulse with fewer than 4 steps, and names the step that would', () => {
    const config = (timeStepPs: number) =>
      chipConfig({ windowNs: 3, grid: { timeStepPs }, channels: [{ pump: { pulses: [gaussian(2, 1.2, 0.1)] }, stokes: { pulses: [gaussian(0.01, 1.2, 0.1)] } }] })
    const r = simulateSync(config(24))
    expect(r.status).toBe('finished')
    const e = r.manifest.figures!.errorEstimate!
    expect(e.status).toBe('unavailable')
    expect(e.figures).toEqual({})
    expect(e.cellUpdates).toBe(0)
    const m = /would span only ([\d.]+) steps \(at least 4 are needed\)\. A time step ≤ ([\d.]+) ps makes it available/.exec(e.reason!)
    expect(m).not.toBeNull()
    expect(estimateOf(simulateSync(config(Number(m![2])))).status).toBe('estimated')
  })

  it('gives none when the doubled step would leave fewer than 8 cells along the waveguide', () => {
    const r = simulateSync(chipConfig({ windowNs: 20, grid: { timeStepPs: 60 }, channels: [{ pump: { backgroundPowerW: 0.05 }, stokes: { backgroundPowerW: 1e-6 } }] }))
    expect(r.manifest.figures!.errorEstimate!.status).toBe('unavailable')
    expect(r.manifest.figures!.errorEstimate!.reason).toMatch(/only \d cells along the waveguide/)
  })

  it('gives none for a noise run, whose companion would draw another random field, and says so', () => {
    const r = simulateSync(chipConfig({ windowNs: 20, options: { noise: { enabled: true } }, channels: [{ pump: { backgroundPowerW: 0.05 } }] }))
    const e = r.manifest.figures!.errorEstimate!
    expect(e.status).toBe('unavailable')
    expect(e.reason).toMatch(/thermal noise.*different random field/)
    expect(e.cellUpdates).toBe(0)
  })

  it('gives no estimate to a figure that is null in either run', () => {
    const r = simulateSync(chipConfig({ windowNs: 20, channels: [{ pump: { backgroundPowerW: 0.05 }, stokes: { backgroundPowerW: 1e-6 } }] }))
    const figures = r.manifest.figures!
    expect(figures.channels[0].retrievalEfficiency).toBeNull()
    expect(Object.keys(estimateOf(r).figures)).not.toContain('channels.0.retrievalEfficiency')
    const coarse: FiguresOfMerit = { ...figures, channels: [{ ...figures.channels[0], reflectivity: null }] }
    const e = estimateFigureErrors(figures, coarse, 1e-12, 2e-12)
    expect(e.figures['channels.0.reflectivity']).toBeUndefined()
    expect(e.figures['channels.0.energyJ.pumpOut']).toBeDefined()
    // Settings and the scheme's own photon-balance check are not figures.
    expect(Object.keys(e.figures).some((k) => /wallTimeS|cellUpdatesPerS|manleyRowe|\.channel$/.test(k))).toBe(false)
  })

  it('gives no estimate to window settings: the retrieval window, an energy window’s bounds and anchor', () => {
    const r = simulateSync(chipConfig({ windowNs: 20, channels: [{ pump: { backgroundPowerW: 0.05 } }] }))
    const base = r.manifest.figures!
    const win = { arrivalNs: 7.5, fwhmNs: 1.2, startNs: 5.1, endNs: 9.9 }
    const figures: FiguresOfMerit = {
      ...base,
      channels: [{ ...base.channels[0], readWindowNs: [win.startNs, win.endNs], retrievalWindow: win }],
      windows: [{ label: 'echo', port: 'pumpOut', startNs: win.startNs, endNs: win.endNs, anchor: { pulse: 'read', arrivalNs: 7.5, fwhmNs: 1.2 }, energyJPerChannel: [1e-12], energyJ: 1e-12, notDetermined: null }],
    }
    const coarse: FiguresOfMerit = { ...figures, windows: [{ ...figures.windows[0], energyJ: 1.1e-12 }] }
    const keys = Object.keys(estimateFigureErrors(figures, coarse, 1e-12, 2e-12).figures)
    expect(keys).toContain('windows.0.energyJ')
    expect(keys.filter((k) => /arrivalNs|fwhmNs|startNs|endNs|readWindowNs|retrievalWindow|anchor/.test(k))).toEqual([])
    // The keys themselves are settings wherever they sit, so a window added later is skipped too.
    expect([...numericLeaves({ window: { arrivalNs: 1, fwhmNs: 2, energyJ: 3 } }).keys()]).toEqual(['window.energyJ'])
  })
})

describe('the companion run', () => {
  const cw = (errorEstimate: boolean) =>
    chipConfig({ windowNs: 40, options: { errorEstimate }, channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }] })

  it('costs about a quarter of the run, as the resource estimate says, and progress covers both runs up to 1', () => {
    const fractions: number[] = []
    const r = simulateSync(cw(true), { onProgress: (f) => fractions.push(f) })
    const e = estimateOf(r)
    expect(e.cellUpdates / r.manifest.counters.cellUpdates).toBeGreaterThan(0.2)
    expect(e.cellUpdates / r.manifest.counters.cellUpdates).toBeLessThan(0.3)
    const est = estimateResources(cw(true), chooseGrid(cw(true)))
    expect(est.errorEstimate!.cellUpdates).toBe(e.cellUpdates)
    expect(est.cellUpdates).toBe(r.manifest.counters.cellUpdates + e.cellUpdates)
    for (let i = 1; i < fractions.length; i++) expect(fractions[i]).toBeGreaterThanOrEqual(fractions[i - 1])
    expect(fractions.at(-1)).toBe(1)
    // The run itself ends at its cost share (≈ 0.8), and the companion's reports fill the rest.
    const share = r.manifest.counters.cellUpdates / (r.manifest.counters.cellUpdates + e.cellUpdates)
    expect(fractions).toContain(share)
    expect(fractions.filter((f) => f > share).length).toBeGreaterThan(10)
    // The run page reads the same share from the configuration to tell the companion's progress from the run's.
    expect(mainRunShare(cw(true))).toBeCloseTo(share, 12)
    expect(runProgressLabel(share, 512, 512, mainRunShare(cw(true)))).toBe(`${Math.round(100 * share)} % · computing the error estimate`)
    expect(mainRunShare(cw(false))).toBe(1)
  })

  it('is not run when switched off: no companion node-steps, progress is the run’s own', () => {
    const fractions: number[] = []
    const r = simulateSync(cw(false), { onProgress: (f) => fractions.push(f) })
    const e = r.manifest.figures!.errorEstimate!
    expect(e).toMatchObject({ status: 'off', cellUpdates: 0, coarseTimeStepPs: null, figures: {} })
    expect(e.reason).toMatch(/switched off/)
    expect(fractions.at(-1)).toBe(1)
    expect(estimateResources(cw(false), chooseGrid(cw(false))).cellUpdates).toBe(r.manifest.counters.cellUpdates)
  })

  it('stops the whole run when stopped during the companion', () => {
    let past = false
    const r = simulateSync(cw(true), { onProgress: (f) => (past ||= f > 0.9), shouldAbort: () => past })
    expect(r.status).toBe('aborted')
    expect(r.manifest.figures).toBeNull()
  })

  it('gives the same estimate from simulate() as from simulateSync()', async () => {
    const a = await simulate(cw(true))
    expect(a.manifest.figures!.errorEstimate).toEqual(simulateSync(cw(true)).manifest.figures!.errorEstimate)
  })
})

describe('where the estimate is carried', () => {
  const config = chipConfig({ windowNs: 20, energyWindows: [{ label: 'late', port: 'stokesOut', startNs: 10, endNs: 20 }], channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }] })
  const r = simulateSync(config)
  const e = estimateOf(r)

  it('keeps it through the manifest schema and in the downloaded run manifest', () => {
    expect(SimulationManifest.parse(JSON.parse(JSON.stringify(r.manifest))).figures!.errorEstimate).toEqual(e)
    const zipManifest = JSON.parse(JSON.stringify(buildRunManifest(r.manifest, config, estimateResources(config, chooseGrid(config)), { startedAt: '', finishedAt: '', wallTimeS: 0 })))
    expect(zipManifest.figures.errorEstimate.figures['channels.0.reflectivity']).toEqual(e.figures['channels.0.reflectivity'])
    expect(zipManifest.figures.errorEstimate.figures['windows.0.energyJ'].absError).toBeGreaterThan(0)
    expect(zipManifest.estimate.errorEstimate.cellUpdates).toBe(e.cellUpdates)
  })

  it('puts an error column beside every figure of the sweep CSV', () => {
    const columns = metricColumns(config)
    const values = reduceFigures(r.manifest.figures, columns)
    expect(values[errorKey('reflectivity')]).toBe(e.figures['channels.0.reflectivity'].absError)
    expect(values[errorKey('stokesOutEnergyJ')]).toBe(e.figures['channels.0.energyJ.stokesOut'].absError)
    expect(values[errorKey('window:late')]).toBe(e.figures['windows.0.energyJ'].absError)
    // Every column has its error entry; the photon-balance check (the scheme's own round-off) has none.
    for (const c of columns) expect(values).toHaveProperty([errorKey(c.key)])
    expect(values[errorKey('manleyRoweResidual')]).toBeNull()
    const detail = { axes: [], metrics: columns, points: [{ index: 0, values: [], status: 'succeeded', runId: 'r', metrics: values }] } as unknown as SweepDetail
    const [header, row] = sweepCsv(detail).trimEnd().split('\r\n').map((l) => l.split(','))
    const refl = columns.find((c) => c.key === 'reflectivity')!
    const at = header.indexOf(`${refl.label} estimated error (${refl.unit})`)
    expect(at).toBeGreaterThan(0)
    expect(header[at - 1]).toBe(`${refl.label} (${refl.unit})`)
    expect(Number(row[at])).toBe(e.figures['channels.0.reflectivity'].absError)
    expect(Number(row[at - 1])).toBe(r.manifest.figures!.channels[0].reflectivity)
  })
})
