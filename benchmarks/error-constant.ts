// Error constant and work–precision of the variants of the local step (solver/steppers/exchange-variants.ts).
// For each case and variant: the observable at Δt, Δt/2, Δt/4, Δt/8; its relative error against a reference
// (Richardson extrapolation R = f(h/2) + (f(h/2) − f(h))/3 of today's step at Δt/8 and Δt/16, or the closed
// form for CW depletion); the constant C of err = C·Δt² (geometric mean of err/Δt² over the grids); the
// observed orders; the Δt that reaches a relative error of 1e-5 by that fit, and the run time there (node-steps
// at that Δt times the measured cost per node-step of the variant). Run: node --import tsx benchmarks/error-constant.ts [--quick]
import os from 'node:os'
import { readFileSync } from 'node:fs'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { brillouinRates } from '@shared/physics/grid-step'
import { runVariant, type VariantResult } from '../solver/exchange-variant-run'
import type { StepVariant } from '../solver/steppers/exchange-variants'
import { exactDepletion } from '../tests/solver/closed-forms'
import { cwDepletionCase, cwWideLineGainCase } from './cases'

const quick = process.argv.includes('--quick')
const TARGET = 1e-5

const VARIANTS: [string, StepVariant][] = [
  ['trapezoid + lin. (today)', { exchange: 'cayley', average: 'trapezoid-linearised' }],
  ['cayley, trapezoid (before)', { exchange: 'cayley', average: 'trapezoid' }],
  ['exact rotation', { exchange: 'exact', average: 'trapezoid' }],
  ['cayley + linear-source b̄', { exchange: 'cayley', average: 'linear-source' }],
  ['exact + linear-source b̄', { exchange: 'exact', average: 'linear-source' }],
  ['cayley + linearised b̄', { exchange: 'cayley', average: 'linearised-source' }],
  ['cayley + held-source b̄', { exchange: 'cayley', average: 'constant-source' }],
]

interface Case {
  name: string
  observable: string
  config: (dtPs: number) => SimulationConfig
  read: (r: VariantResult) => number
  /** Closed-form value, when there is one (else Richardson). */
  exact?: number
  steps: number[]
}

const example = (file: string) => JSON.parse(readFileSync(new URL(`../solver/examples/${file}`, import.meta.url), 'utf8'))
const withStep = (raw: Record<string, unknown>, dtPs: number) =>
  SimulationConfig.parse({ ...raw, grid: { ...(raw.grid as object), timeStepPs: dtPs, mapRows: 16, mapCols: 16 } })
const efficiency = (r: VariantResult) => r.figures.channels[0].retrievalEfficiency!
const stokesOutW = (r: VariantResult) => {
  const a = r.run.traces[0].stokesOut
  const n = a.length / 2 - 1
  return a[2 * n] ** 2 + a[2 * n + 1] ** 2
}

function depletionExact(): number {
  const wg = cwDepletionCase(1).waveguide
  const rates = brillouinRates(wg)
  return exactDepletion(0.5, 1e-3, rates.gainPerWM, wg.lengthM, rates.frequencyRatio).stokesOutW
}

function wideLineGainExact(): number {
  const wg = cwWideLineGainCase(1).waveguide
  const alpha = brillouinRates(wg).alphaPerM
  const lEff = -Math.expm1(-alpha * wg.lengthM) / alpha
  return Math.exp(brillouinRates(wg).gainPerWM * 0.05 * lEff - alpha * wg.lengthM)
}
const stokesGain = (r: VariantResult) => stokesOutW(r) / 1e-9

const storage = example('store-and-retrieve-chalcogenide-rib.json')
const refresh = example('store-refresh-retrieve-chalcogenide-rib.json')
const CASES: Case[] = [
  { name: 'storage', observable: 'retrieval efficiency', config: (dt) => withStep(storage, dt), read: efficiency, steps: [4, 2, 1, 0.5] },
  { name: 'refresh', observable: 'retrieval efficiency after 3 refreshes', config: (dt) => withStep(refresh, dt), read: efficiency, steps: [4, 2, 1, 0.5] },
  { name: 'CW depletion', observable: 'P_s(0) at 150 ns', config: cwDepletionCase, read: stokesOutW, exact: depletionExact(), steps: [16, 8, 4, 2] },
  { name: 'CW gain, 200 MHz line', observable: 'P_s(0)/P_s(L) at 60 ns', config: cwWideLineGainCase, read: stokesGain, exact: wideLineGainExact(), steps: [8, 4, 2, 1] },
]

/**
 * Cost per node-step of each variant: the storage case at 1 ps, the variants interleaved, five rounds, the
 * fastest round of each (a shared machine: the minimum is the least disturbed, and interleaving spreads
 * the load over all variants alike).
 */
function costPerCell(): number[] {
  const c = CASES[0].config(1)
  const best = VARIANTS.map(() => Infinity)
  for (let round = 0; round < (quick ? 3 : 5); round++)
    VARIANTS.forEach(([, v], i) => {
      const r = runVariant(c, v)
      best[i] = Math.min(best[i], r.seconds / r.cellUpdates)
    })
  return best
}

const fmt = (x: number, d = 2) => (x === 0 ? '0' : x.toExponential(d))
const pad = (s: string | number, n: number) => String(s).padStart(n)

console.log(`# Error constant of the local step ${new Date().toISOString()}${quick ? ' (--quick)' : ''}`)
console.log(`node ${process.version}, ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}, load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`)
console.log('TypeScript path, one thread, every variant on the same loop (solver/exchange-variant-run.ts).')
const nsPerCell = costPerCell()
console.log(`\n## Cost per node-step (storage case, Δt = 1 ps, best of interleaved rounds)`)
VARIANTS.forEach(([label], i) => console.log(`${label.padEnd(26)} ${pad((nsPerCell[i] * 1e9).toFixed(1), 6)} ns  ×${(nsPerCell[i] / nsPerCell[0]).toFixed(2)}`))

for (const cs of CASES) {
  const steps = quick ? cs.steps.slice(0, 3) : cs.steps
  let ref = cs.exact
  let refNote = cs.name === 'CW depletion' ? 'closed form (Tang 1966; tests/solver/closed-forms.ts)' : 'closed form exp(G_B P L_eff − αL) (Agrawal ch. 9)'
  if (ref === undefined) {
    const h = steps[steps.length - 1]
    const f1 = cs.read(runVariant(cs.config(h / 2), VARIANTS[0][1]))
    const f2 = cs.read(runVariant(cs.config(h / 4), VARIANTS[0][1]))
    ref = f2 + (f2 - f1) / 3
    refNote = `Richardson of today's step at Δt = ${h / 2} and ${h / 4} ps (their difference ${fmt(Math.abs(f2 - f1) / Math.abs(ref))} rel.)`
  }
  console.log(`\n## ${cs.name}: ${cs.observable}; reference ${ref.toPrecision(10)}, ${refNote}`)
  console.log(`${'variant'.padEnd(26)} ${steps.map((h) => pad(`err@${h}ps`, 10)).join(' ')} ${pad('orders', 16)} ${pad('C (1/ps²)', 10)} ${pad('Δt@1e-5', 9)} ${pad('s @1e-5', 10)}`)
  VARIANTS.forEach(([label, v], i) => {
    const rows = steps.map((h) => {
      const r = runVariant(cs.config(h), v)
      return { h, err: Math.abs(cs.read(r) - ref!) / Math.abs(ref!), cells: r.cellUpdates }
    })
    const orders = rows.slice(1).map((r, k) => Math.log2(rows[k].err / r.err).toFixed(2))
    const C = Math.exp(rows.reduce((a, r) => a + Math.log(r.err / r.h ** 2), 0) / rows.length)
    // Work to reach the target: err = C·Δt² gives Δt, node-steps scale as Δt⁻² from the finest grid, times
    // the measured cost per node-step.
    const f = rows[rows.length - 1]
    const hTarget = Math.sqrt(TARGET / C)
    const sTarget = nsPerCell[i] * f.cells * (f.h / hTarget) ** 2
    console.log(`${label.padEnd(26)} ${rows.map((r) => pad(fmt(r.err), 10)).join(' ')} ${pad(orders.join(' '), 16)} ${pad(fmt(C), 10)} ${pad(hTarget.toPrecision(3), 9)} ${pad(sTarget.toPrecision(2), 10)}`)
  })
}
