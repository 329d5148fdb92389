// `node --import tsx benchmarks/option-pairs.ts [rounds]`: option combinations that ran on the general kernel until they
// got flat kernels, against the plain SVEA path of the TypeScript engine, measured side by side in one process. On
// the fixed case (benchmarks/cases.ts, Δt = 1 ps) at 2000 × 20000: two channels (1 GHz apart) with thermal noise (295 K,
// seed 7), two channels with Kerr (n₂ = 1e-17 m²/W) and noise, one channel with the higher-order acoustic term and
// Kerr, and two channels with the higher-order term, each through its flat kernel and through the general kernel
// (forced). Each round runs every case once, in turn, so a change of machine load hits every column alike; a round's
// ratios use that round's own plain rate. Prints every round's M cell-updates/s (a cell-update is one node of one
// channel in one step) and the range of each ratio over the rounds, with the load average; never asserts. Record the
// figures in benchmarks/README.md with the date and load.
import os from 'node:os'
import { simulateSync } from '../solver/index'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { gridCase } from './cases'

const NZ = 2000
const NT = 20000
const rounds = Number(process.argv[2] ?? 3)

/** M cell-updates per second of one run on the TypeScript engine, without the error estimate's companion run. */
function rate(config: SimulationConfig, forceGeneralKernel: boolean): number {
  const t0 = performance.now()
  const r = simulateSync({ ...config, options: { ...config.options, errorEstimate: false } }, { engine: 'ts', threads: 1, forceGeneralKernel })
  const seconds = (performance.now() - t0) / 1000
  if (r.status !== 'finished') throw new Error(`benchmark run ${r.status}: ${r.message}`)
  return r.manifest.counters.cellUpdates / seconds / 1e6
}

const withKerr = (c: SimulationConfig): SimulationConfig => ({ ...c, waveguide: { ...c.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...c.options, kerr: true } })

const CASES: [string, SimulationConfig][] = [
  ['2 ch + noise', gridCase(NZ, NT, { channels: 2, noise: true })],
  ['2 ch + Kerr + noise', withKerr(gridCase(NZ, NT, { channels: 2, noise: true }))],
  ['h-o + Kerr', withKerr(gridCase(NZ, NT, { higherOrderAcoustic: true }))],
  ['2 ch + h-o', gridCase(NZ, NT, { channels: 2, higherOrderAcoustic: true })],
]

const fmt = (x: number) => x.toPrecision(3).padStart(7)
console.log(`# Option pairs against plain ${new Date().toISOString()}; node ${process.version}, ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}`)
console.log(`Nz × Nt = ${NZ} × ${NT}; M cell-updates/s, flat (general) and flat/plain (general/plain)`)
const plain = gridCase(NZ, NT)
rate(plain, false)
const ratios: Record<string, { flat: number[]; general: number[] }> = Object.fromEntries(CASES.map(([name]) => [name, { flat: [], general: [] }]))
for (let r = 0; r < rounds; r++) {
  const p = rate(plain, false)
  const cells = [`round ${r + 1}: plain ${fmt(p)}`]
  for (const [name, config] of CASES) {
    const flat = rate(config, false)
    const general = rate(config, true)
    ratios[name].flat.push(flat / p)
    ratios[name].general.push(general / p)
    cells.push(`${name} ${fmt(flat)} (${fmt(general)}) ${(flat / p).toFixed(2)} (${(general / p).toFixed(2)})`)
  }
  console.log(`${cells.join(' | ')} | load ${os.loadavg()[0].toFixed(2)}`)
}
const range = (v: number[]) => `${Math.min(...v).toFixed(2)}–${Math.max(...v).toFixed(2)}`
for (const [name, v] of Object.entries(ratios)) console.log(`${name}/plain: flat ${range(v.flat)}, general ${range(v.general)}, flat/general ${range(v.flat.map((f, i) => f / v.general[i]))}`)
