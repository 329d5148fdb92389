// CPU seconds per tenth of the 1 km sensing point (long-fibre.ts's fibre), with and without the flush of
// amplitudes below 1e-150 to zero (solver/steppers/subnormal-flush.ts): `node --import tsx
// benchmarks/long-fibre-tenths.ts [--tenths N] [--step-ps Δt]` (Δt: a fixed step instead of the automatic one). The default engine (WebAssembly, one thread) and the profile
// kernel, each with and without the flush, advance tenth by tenth in turn (interleaved, so a change in the
// machine's load falls on all four alike). Prints per tenth: CPU s of each run, the subnormal values left in its
// state, and the load average; at the end whether each pair's port traces agree. Figures only, no assertions.
import { loadavg } from 'node:os'
import { planGrid, SimulationRun } from '../solver/driver'
import { SMALLEST_NORMAL } from '../solver/steppers/subnormal-flush'
import { fibre } from './sensing-fibre'

const arg = process.argv.indexOf('--tenths')
const tenths = arg > 0 ? Number(process.argv[arg + 1]) : 10
const stepArg = process.argv.indexOf('--step-ps')
const step = stepArg > 0 ? { timeStepPs: Number(process.argv[stepArg + 1]) } : {}

function subnormals(run: SimulationRun): number {
  let k = 0
  for (const a of [run.state.uRe, run.state.uIm, run.state.vRe, run.state.vIm, run.state.bRe, run.state.bIm])
    for (let i = 0; i < a.length; i++) if (a[i] !== 0 && Math.abs(a[i]) < SMALLEST_NORMAL) k++
  return k
}

const cases = [
  { name: 'engine, flush', config: fibre(1000, 800, { profile: false, ...step }), flush: true },
  { name: 'engine, none', config: fibre(1000, 800, { profile: false, ...step }), flush: false },
  { name: 'profile, flush', config: fibre(1000, 800, step), flush: true },
  { name: 'profile, none', config: fibre(1000, 800, step), flush: false },
]
const runs = cases.map((c) => new SimulationRun(c.config, planGrid(c.config), { threads: 1, subnormalFlush: c.flush }))
const nt = runs[0].model.nt + 1
console.log(`1 km: ${runs[0].model.nz} cells × ${nt} steps; flush every ${runs[0].flushEvery} steps; ${runs.map((r, i) => `${cases[i].name}: ${r.profile ? 'profile kernel' : `engine ${r.engine}`}`).join(', ')}`)
console.log(`tenth | ${cases.map((c) => `${c.name} CPU s (subnormals)`).join(' | ')} | load average`)
const totals = cases.map(() => 0)
for (let t = 0; t < tenths; t++) {
  const end = Math.round(((t + 1) * nt) / 10)
  const row = runs.map((run, i) => {
    const c0 = process.cpuUsage()
    run.advance(end - run.n)
    const c = process.cpuUsage(c0)
    const s = (c.user + c.system) / 1e6
    totals[i] += s
    return `${s.toFixed(2)} (${subnormals(run)})`
  })
  console.log(`${t + 1} | ${row.join(' | ')} | ${loadavg().map((x) => x.toFixed(2)).join(' ')}`)
}
console.log(`total | ${totals.map((s) => s.toFixed(1)).join(' | ')}`)
for (const [a, b] of [[0, 1], [2, 3]]) {
  let worst = 0, peak = 0
  const t = runs[a].traces[0], u = runs[b].traces[0]
  for (const [x, y] of [[t.pumpOut, u.pumpOut], [t.stokesOut, u.stokesOut]])
    for (let i = 0; i < 2 * runs[a].n; i++) (worst = Math.max(worst, Math.abs(x[i] - y[i]))), (peak = Math.max(peak, Math.abs(y[i])))
  console.log(`${cases[a].name} vs ${cases[b].name}: largest difference of the port traces ${worst.toExponential(2)} √W (peak ${peak.toExponential(2)} √W)`)
}
for (const r of runs) r.close()
