// The research variants of the local step (solver/steppers/exchange-variants.ts): each keeps order 2 and the
// photon balance, the exact rotation agrees with the Cayley map to O(β³), the linearised mean cuts the storage
// error but raises the CW steady-state error, and the default variant is today's step bit for bit.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { SimulationRun } from '../../solver/driver'
import { runVariant } from '../../solver/exchange-variant-run'
import { DEFAULT_VARIANT, TRAPEZOID_VARIANT, interactSveaVariant, meanCoefficients, type StepVariant } from '../../solver/steppers/exchange-variants'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44
const VARIANTS: StepVariant[] = [
  { exchange: 'cayley', average: 'trapezoid' },
  { exchange: 'exact', average: 'trapezoid' },
  { exchange: 'cayley', average: 'linear-source' },
  { exchange: 'exact', average: 'linear-source' },
  { exchange: 'cayley', average: 'linearised-source' },
  { exchange: 'exact', average: 'linearised-source' },
  { exchange: 'cayley', average: 'constant-source' },
  { exchange: 'cayley', average: 'trapezoid-linearised' },
]
const name = (v: StepVariant) => `${v.exchange} exchange, ${v.average} b̄`

/** A strong pump pulse meeting a Stokes pulse: coupling strong enough for the exchange error to show. */
function smoothCase(nz: number) {
  return chipConfig({
    windowNs: 3.5,
    grid: { timeStepPs: (0.05 / (VG * nz)) * 1e12, mapRows: 16, mapCols: 16 },
    channels: [{ pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }],
  })
}

/** Max |difference| between a trace and the next finer one (Δt/2), on the coarse samples. */
function diff(a: Float64Array, b: Float64Array) {
  let e = 0
  for (let n = 0; n < Math.min(a.length / 2, b.length / 4); n++) e = Math.max(e, Math.hypot(a[2 * n] - b[4 * n], a[2 * n + 1] - b[4 * n + 1]))
  return e
}

function field(n: number, seed: number) {
  // A small linear congruential stream: reproducible fields, no dependence on the solver's generators.
  let x = seed
  const next = () => ((x = (x * 1103515245 + 12345) % 2147483648) / 2147483648) * 2 - 1
  const arr = () => Float64Array.from({ length: n }, next)
  return { uRe: arr(), uIm: arr(), vRe: arr(), vIm: arr(), bRe: arr(), bIm: arr() }
}

describe('local-step variants', () => {
  it.each(VARIANTS.map((v) => [name(v), v] as const))('%s is second order: halving Δt divides the error by 4 ± 0.2', (_l, v) => {
    // Empirical order of convergence (common practice): successive differences of the Stokes output trace.
    const [a, b, c] = [80, 160, 320].map((nz) => runVariant(smoothCase(nz), v).run.traces[0].stokesOut)
    const ratio = diff(a, b) / diff(b, c)
    expect(ratio).toBeGreaterThan(3.8)
    expect(ratio).toBeLessThan(4.2)
  })

  it.each(VARIANTS.map((v) => [name(v), v] as const))('%s keeps the photon balance to 1e-12 without loss', (_l, v) => {
    // Manley–Rowe (common practice): without loss every pump photon lost is a Stokes photon gained.
    const r = runVariant(smoothCase(80), v)
    expect(r.figures.channels[0].manleyRoweResidual!).toBeLessThan(1e-12)
    // And node by node: the exchange is unitary, so |u|² + |v|² is kept by every local step.
    const f = field(64, 11)
    const before = f.uRe.map((_, j) => f.uRe[j] ** 2 + f.uIm[j] ** 2 + f.vRe[j] ** 2 + f.vIm[j] ** 2)
    interactSveaVariant(f, 0, 63, 0.3, 0.4, 0.99, 0.01, 0.5, v, meanCoefficients(0.99, 0.01, 0.5))
    f.uRe.forEach((_, j) => expect(Math.abs(f.uRe[j] ** 2 + f.uIm[j] ** 2 + f.vRe[j] ** 2 + f.vIm[j] ** 2 - before[j])).toBeLessThan(1e-14 * before[j] + 1e-300))
  })

  it('the exact rotation equals the Cayley map to O(β³): the difference is |β|³/12 of the field', () => {
    // Taylor (common practice): the Cayley map rotates by 2·atan(|β|/2) = |β| − |β|³/12 + O(|β|⁵).
    // With no drive (K = 0) and E = 1, b̄ = b, so β = c·b exactly.
    for (const beta of [0.2, 0.1, 0.05, 0.025]) {
      const run = (exchange: 'cayley' | 'exact') => {
        const f = { uRe: Float64Array.of(0.6), uIm: Float64Array.of(0.2), vRe: Float64Array.of(-0.3), vIm: Float64Array.of(0.5), bRe: Float64Array.of(0.6 * beta), bIm: Float64Array.of(0.8 * beta) }
        interactSveaVariant(f, 0, 0, 0, 0.5, 1, 0, 1e-12, { exchange, average: 'trapezoid' }, null)
        return f
      }
      const a = run('cayley'), b = run('exact')
      const d = Math.hypot(a.uRe[0] - b.uRe[0], a.uIm[0] - b.uIm[0], a.vRe[0] - b.vRe[0], a.vIm[0] - b.vIm[0])
      const norm = Math.hypot(0.6, 0.2, -0.3, 0.5)
      // The two maps differ by a rotation of angle δ = |β|³/12 + O(|β|⁵) on a vector of that norm.
      expect(d / norm / (beta ** 3 / 12)).toBeCloseTo(1, 1)
      expect(Math.abs(d / norm / (beta ** 3 / 12) - 1)).toBeLessThan(beta ** 2)
    }
  })

  it('the linear-source mean coefficients are φ₁, Δt·φ₂, Δt·φ₃ on both sides of the series switch', () => {
    // φ_k(z) = ∫₀¹ e^{(1−s)z} s^{k−1}/(k−1)! ds (common practice, exponential integrators), by Simpson's rule.
    for (const [gh, dh] of [[0.02, 0.01], [0.004, -0.003], [0.3, 0.4]]) {
      const z = [-0.5 * gh, dh]
      const e = Math.exp(z[0])
      const c = meanCoefficients(e * Math.cos(z[1]), e * Math.sin(z[1]), 2)
      const phi = (k: number) => {
        const n = 2000
        let re = 0, im = 0
        for (let i = 0; i <= n; i++) {
          const s = i / n
          const w = (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) / (3 * n)
          const g = s ** (k - 1) / (k === 3 ? 2 : 1)
          const m = Math.exp((1 - s) * z[0]) * g * w
          re += m * Math.cos((1 - s) * z[1])
          im += m * Math.sin((1 - s) * z[1])
        }
        return [re, im]
      }
      const [p1, p2, p3] = [phi(1), phi(2), phi(3)]
      expect(Math.hypot(c.m0[0] - p1[0], c.m0[1] - p1[1])).toBeLessThan(1e-12)
      expect(Math.hypot(c.m1[0] - 2 * p2[0], c.m1[1] - 2 * p2[1])).toBeLessThan(1e-12)
      expect(Math.hypot(c.m2[0] - 2 * p3[0], c.m2[1] - 2 * p3[1])).toBeLessThan(1e-12)
    }
  })

  it('the linearised means of b cut the storage error of the trapezoid mean at least 4 and 6 times at Δt = 2 ps (measured 6.5, 9.8)', () => {
    // Reference: Richardson extrapolation (common practice) of today's second-order step at 0.5 and 0.25 ps.
    const raw = JSON.parse(readFileSync(new URL('../../solver/examples/store-and-retrieve-chalcogenide-rib.json', import.meta.url), 'utf8'))
    const at = (dtPs: number, v: StepVariant) =>
      runVariant(SimulationConfig.parse({ ...raw, grid: { ...raw.grid, timeStepPs: dtPs, mapRows: 16, mapCols: 16 } }), v).figures.channels[0].retrievalEfficiency!
    const f1 = at(0.5, DEFAULT_VARIANT), f2 = at(0.25, DEFAULT_VARIANT)
    const ref = f2 + (f2 - f1) / 3
    const today = Math.abs(at(2, TRAPEZOID_VARIANT) - ref)
    const linearised = Math.abs(at(2, { exchange: 'cayley', average: 'linearised-source' }) - ref)
    // The reference's own error (≈ its step's, 1e-7 relative at most) is far below either.
    expect(Math.abs(f2 - f1) / ref).toBeLessThan(1e-6)
    expect(today / ref).toBeGreaterThan(3e-6)
    expect(today / linearised).toBeGreaterThan(4)
    // The driver's step, the trapezoid mean plus the source's change: measured 9.8.
    expect(today / Math.abs(at(2, DEFAULT_VARIANT) - ref)).toBeGreaterThan(6)
  })

  it("CW small-signal gain with a 200 MHz line: the linearised mean's error is over twice the trapezoid mean's (why it is not the default)", () => {
    // Closed form: undepleted-pump gain exp(G_B P L_eff − αL) (Agrawal, Nonlinear Fiber Optics, ch. 9). In the CW
    // steady state the source at a node does not change in time; the D₁ − D₀ of the local step is the change of
    // u·v* across the cell, and the mean that follows it loses the cancellation of the trapezoid mean's error
    // against the splitting error (docs/numerics.md, "Error constant of the step").
    const alpha = 30 / (10 / Math.LN10), lEff = -Math.expm1(-alpha * 0.05) / alpha
    const exact = Math.exp(300 * 0.05 * lEff - alpha * 0.05)
    const config = chipConfig({
      windowNs: 60,
      waveguide: { lossDbPerM: 30, linewidthMHz: 200 },
      grid: { timeStepPs: (0.05 / (VG * 128)) * 1e12, mapRows: 16, mapCols: 16 },
      channels: [{ pump: { backgroundPowerW: 0.05 }, stokes: { backgroundPowerW: 1e-9 } }],
      options: { errorEstimate: false },
    })
    const err = (v: StepVariant) => {
      const a = runVariant(config, v).run.traces[0].stokesOut
      const n = a.length / 2 - 1
      return Math.abs((a[2 * n] ** 2 + a[2 * n + 1] ** 2) / 1e-9 / exact - 1)
    }
    const trapezoid = err(TRAPEZOID_VARIANT)
    const linearised = err({ exchange: 'cayley', average: 'linearised-source' })
    expect(trapezoid).toBeLessThan(5e-7)
    expect(linearised / trapezoid).toBeGreaterThan(2)
  })

  it("the default variant is the driver's step bit for bit, storage companion and figures included", () => {
    const raw = JSON.parse(readFileSync(new URL('../../solver/examples/store-and-retrieve-chalcogenide-rib.json', import.meta.url), 'utf8'))
    const config = SimulationConfig.parse({ ...raw, grid: { ...raw.grid, mapRows: 16, mapCols: 16 } })
    const grid = chooseGrid(config)
    const today = new SimulationRun(config, grid, { engine: 'ts', threads: 1 })
    today.advance(grid.nt + 1)
    const v = runVariant(config, DEFAULT_VARIANT, grid)
    expect(Array.from(v.run.traces[0].pumpOut)).toEqual(Array.from(today.traces[0].pumpOut))
    expect(Array.from(v.run.traces[0].stokesOut)).toEqual(Array.from(today.traces[0].stokesOut))
    expect(Array.from(v.reference!.traces[0].pumpOut)).toEqual(Array.from(today.referenceTraces![0].pumpOut))
    const mine = v.figures.channels[0], theirs = today.figures(0).channels[0]
    expect(mine.retrievalEfficiency).not.toBeNull()
    expect(mine.retrievalEfficiency).toBe(theirs.retrievalEfficiency)
    expect(mine.retrievedPhaseRad).toBe(theirs.retrievedPhaseRad)
  })
})
