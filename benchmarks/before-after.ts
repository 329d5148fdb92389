// `node --import tsx benchmarks/before-after.ts <other checkout>`: the plain cases' throughput of this checkout
// and of another (e.g. a worktree of an earlier commit), interleaved in one session, best of three each, so a
// change can be shown not to slow the old cases. Each measurement runs in its own process with the checkout as
// its working directory (so its own path aliases apply). Prints figures and never asserts.
import { spawnSync } from 'node:child_process'
import { writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { tmpdir } from 'node:os'

const other = resolve(process.argv[2] ?? '')
const here = resolve(import.meta.dirname, '..')
const ROUNDS = 3
const CASES = [
  { label: 'SVEA 2000 × 20000', o: '{}' },
  { label: 'SVEA 8000 × 40000', o: '{}', nz: 8000, nt: 40000 },
  { label: 'higher-order 2000 × 20000', o: '{ higherOrderAcoustic: true }' },
  { label: 'noise 2000 × 20000', o: '{ noise: true }' },
]

const probe = join(tmpdir(), 'sonoweave-before-after.mts')
writeFileSync(
  probe,
  `const { simulateSync } = await import(process.cwd() + '/solver/index.ts')
const { gridCase } = await import(process.cwd() + '/benchmarks/cases.ts')
const [nz, nt, o, engine] = JSON.parse(process.argv[2])
const config = gridCase(nz, nt, o)
const c0 = process.cpuUsage()
const r = simulateSync({ ...config, options: { ...config.options, errorEstimate: false } }, engine ? { engine } : {})
const c1 = process.cpuUsage(c0)
// CPU time of this process, not wall time: on a shared machine the wall clock also counts other people's work.
const s = (c1.user + c1.system) / 1e6
console.log(JSON.stringify({ status: r.status, mcells: r.manifest.counters.cellUpdates / s / 1e6 }))
`,
)

function once(cwd: string, nz: number, nt: number, o: unknown, engine?: string): number {
  const r = spawnSync(process.execPath, ['--import', 'tsx', probe, JSON.stringify([nz, nt, o, engine ?? null])], { cwd, encoding: 'utf8' })
  const line = r.stdout.trim().split('\n').pop() ?? ''
  if (!line.startsWith('{')) throw new Error(`${cwd}: the measurement did not run:\n${r.stderr.slice(-2000)}`)
  const parsed = JSON.parse(line) as { status: string; mcells: number }
  if (parsed.status !== 'finished') throw new Error(`${cwd}: ${line}`)
  return parsed.mcells
}

console.log(`before: ${other}\nafter:  ${here}\nM cell-updates per CPU-second, best of ${ROUNDS}, interleaved`)
console.log(`${'case'.padEnd(28)} ${'before'.padStart(8)} ${'after ts'.padStart(9)} ${'after auto'.padStart(11)} ${'ts/before'.padStart(10)}`)
for (const c of CASES) {
  const nz = c.nz ?? 2000, nt = c.nt ?? 20000
  const o = Function(`return (${c.o})`)()
  const best = { before: 0, ts: 0, auto: 0 }
  for (let i = 0; i < ROUNDS; i++) {
    best.before = Math.max(best.before, once(other, nz, nt, o))
    best.ts = Math.max(best.ts, once(here, nz, nt, o, 'ts'))
    best.auto = Math.max(best.auto, once(here, nz, nt, o, 'auto'))
  }
  console.log(`${c.label.padEnd(28)} ${best.before.toFixed(1).padStart(8)} ${best.ts.toFixed(1).padStart(9)} ${best.auto.toFixed(1).padStart(11)} ${(best.ts / best.before).toFixed(2).padStart(10)}`)
}
