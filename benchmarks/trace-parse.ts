// Trace-file parsing on large uploads: the peak memory of a parse (a fresh process per file, so the peak
// is the parse's), and how long the event loop stalls when the file is parsed on it versus in the
// parse thread the upload route uses. Prints figures; never asserts.
//   node --import tsx benchmarks/trace-parse.ts
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { buildTrace, parseTraceFile } from '@shared/analysis/trace-parse'
import { TraceImportSettings } from '@shared/api/traces'
import { TraceParsePool } from '../server/modules/traces/trace-parse-pool'
import { oneLineCsv, scopeCsv } from '../tests/traces/big-files'

const ROOT = fileURLToPath(new URL('..', import.meta.url))
const MB = 1024 * 1024
const settings = TraceImportSettings.parse({ name: 'bench', timeColumn: 0, timeUnit: 's', signalColumns: [1] })

function peakGrowthMb(file: string): { growthMb: number; outcome: string } {
  const out = execFileSync(process.execPath, ['--expose-gc', '--import', 'tsx', 'tests/traces/parse-memory-probe.ts', file], { cwd: ROOT, encoding: 'utf8' })
  const r = JSON.parse(out.trim().split('\n').pop()!) as { rssBefore: number; peakAfter: number; outcome: string }
  return { growthMb: (r.peakAfter - r.rssBefore) / MB, outcome: r.outcome }
}

/** Runs `work` while a 5 ms timer ticks; the longest gap between ticks is the longest stall of the loop. */
async function longestStallMs(work: () => Promise<unknown> | unknown): Promise<{ stallMs: number; wallMs: number }> {
  let last = performance.now()
  let longest = 0
  const timer = setInterval(() => {
    const now = performance.now()
    longest = Math.max(longest, now - last)
    last = now
  }, 5)
  const t0 = performance.now()
  await new Promise((r) => setTimeout(r, 20))
  await work()
  const wallMs = performance.now() - t0 - 20
  await new Promise((r) => setTimeout(r, 20))
  clearInterval(timer)
  return { stallMs: Math.max(longest, performance.now() - last), wallMs }
}

const dir = mkdtempSync(join(tmpdir(), 'trace-bench-'))
const pool = new TraceParsePool()
try {
  await pool.parse(scopeCsv(10), settings) // starts the thread, so its start-up is not counted below
  const cases: Array<[string, Buffer]> = [
    ['one line, no line break, 20 MB', oneLineCsv(20 * MB)],
    ['1e6 rows × 2 columns', scopeCsv(1_000_000)],
  ]
  console.log('| file | size (MB) | outcome | peak RSS growth (MB) | × file | on the event loop: stall (ms) | in the parse thread: stall (ms) / wall (ms) |')
  console.log('|---|---|---|---|---|---|---|')
  for (const [name, bytes] of cases) {
    const file = join(dir, 'trace.csv')
    writeFileSync(file, bytes)
    const mem = peakGrowthMb(file)
    const inline = await longestStallMs(() => {
      try {
        buildTrace(parseTraceFile(bytes), settings)
      } catch {
        /* the refusal is the outcome */
      }
    })
    const threaded = await longestStallMs(() => pool.parse(bytes, settings))
    const size = bytes.length / MB
    console.log(
      `| ${name} | ${size.toFixed(1)} | ${mem.outcome.slice(0, 48)} | ${mem.growthMb.toFixed(0)} | ${(mem.growthMb / size).toFixed(1)} | ${inline.stallMs.toFixed(0)} | ${threaded.stallMs.toFixed(0)} / ${threaded.wallMs.toFixed(0)} |`,
    )
  }
} finally {
  await pool.stop()
  rmSync(dir, { recursive: true, force: true })
}
