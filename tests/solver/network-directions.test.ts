// A probe at the Stokes frequency launched with the pump (co-propagating) and against it (counter-propagating):
// backward SBS couples only counter-propagating pairs (Agrawal, Nonlinear Fiber Optics, ch. 9; the co-propagating
// probe is phase mismatched by about 2β, Dong et al. 2015), so only the counter-propagating probe sees gain.
import { describe, expect, it } from 'vitest'
import { cw, lastOutPowerW, runNetwork, stepForCells } from './network-fixtures'

const G = 300, L = 0.05
const alphaPerM = 30 / (10 / Math.LN10) // 0.3 dB/cm
const lEff = -Math.expm1(-alphaPerM * L) / alphaPerM

describe('waves in both directions', () => {
  // A 200 MHz linewidth settles the acoustic field (rate Γ/2) well inside the 60 ns window; a 1 nW probe keeps the
  // pump depletion it causes (≈ G_B P_s L ≈ 1e-8) below the checked accuracy.
  const run = (nz: number) =>
    runNetwork({
      windowNs: 60,
      waveguide: { lossDbPerM: 30, linewidthMHz: 200 },
      grid: { timeStepPs: stepForCells(nz) },
      channels: [{ pump: cw(0.05), stokes: cw(1e-9), coProbe: cw(1e-9) }],
    })

  it('co-propagating probe: transmission equals the loss-only e^{−αL} to 1e-12 (no backward gain)', () => {
    const r = run(64)
    expect(Math.abs(lastOutPowerW(r, 'co_probe') / 1e-9 / Math.exp(-alphaPerM * L) - 1)).toBeLessThan(1e-12)
  })

  it('counter-propagating probe: small-signal gain exp(G_B P L_eff − αL) (Agrawal ch. 9), to 1e-6, and to 1e-7 extrapolated in the step', () => {
    const exact = Math.exp(G * 0.05 * lEff - alphaPerM * L)
    const g = [64, 128].map((nz) => lastOutPowerW(run(nz), 'stokes') / 1e-9)
    // Richardson extrapolation with the scheme's order 2.
    const extrapolated = (4 * g[1] - g[0]) / 3
    expect(Math.abs(g[1] / exact - 1)).toBeLessThan(1e-6)
    expect(Math.abs(extrapolated / exact - 1)).toBeLessThan(1e-7)
  })

  it('non-reciprocity: the isolation figure is the ratio of the two transmissions in dB', () => {
    const r = run(64)
    const f = r.manifest.figures!.waves!
    const stokes = f.waves.find((w) => w.key === 'stokes')!
    const co = f.waves.find((w) => w.key === 'co_probe')!
    expect(f.nonReciprocity).not.toBeNull()
    expect(f.nonReciprocity!.counterTransmission).toBe(stokes.transmission)
    expect(f.nonReciprocity!.coTransmission).toBe(co.transmission)
    expect(f.nonReciprocity!.isolationDb).toBeCloseTo(10 * Math.log10(stokes.energyOutJ / stokes.energyInJ / (co.energyOutJ / co.energyInJ)), 10)
    // Over a window that is mostly steady state, the energy ratio approaches the CW gain exp(G_B P L_eff) (Agrawal ch. 9).
    const cwDb = (10 / Math.LN10) * G * 0.05 * lEff
    expect(Math.abs(f.nonReciprocity!.isolationDb - cwDb)).toBeLessThan(0.1 * cwDb)
  })
})
