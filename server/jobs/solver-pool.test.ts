// The pool's thread bookkeeping, with a stand-in thread that speaks solver-thread.ts's messages but
// computes nothing (each run busy-waits for `ms`): reuse, abort, terminate after the grace period, crashes.
// The real solver thread is exercised end to end by tests/jobs/worker.test.ts.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { afterAll, afterEach, describe, expect, it } from 'vitest'
import { SolverPool, type RunMessage } from './solver-pool'

const dir = mkdtempSync(join(tmpdir(), 'solver-pool-'))
const threadFile = join(dir, 'stand-in-thread.mjs')
writeFileSync(
  threadFile,
  `import { parentPort, threadId, workerData } from 'node:worker_threads'
const flag = new Int32Array(workerData.abortFlag)
parentPort.on('message', ({ seq, config }) => {
  if (config.mode === 'crash') throw new Error('stand-in crashed')
  if (config.mode === 'exit') process.exit(3)
  parentPort.postMessage({ type: 'progress', seq, fraction: 0.5 })
  const t0 = Date.now()
  let aborted = false
  while (Date.now() - t0 < config.ms) {
    if (!config.ignoreAbort && Atomics.load(flag, 0) !== 0) { aborted = true; break }
  }
  const x = new Float64Array([threadId])
  parentPort.postMessage({ type: 'result', seq, status: aborted ? 'aborted' : 'finished', message: '', manifest: null, arrays: { x } }, [x.buffer])
})
parentPort.postMessage({ type: 'ready' })
`,
)

type StandIn = { ms?: number; mode?: 'crash' | 'exit'; ignoreAbort?: boolean }
const pools: SolverPool[] = []
function newPool(size = 1): SolverPool {
  const p = new SolverPool({ size, abortGraceMs: 200, threadFile: pathToFileURL(threadFile).href })
  pools.push(p)
  return p
}
const run = (p: SolverPool, c: StandIn, onMessage: (m: RunMessage) => void = () => {}) => p.run({ ms: 0, ...c } as never, onMessage)
const threadOf = async (r: ReturnType<typeof run>) => (await r.result)!.arrays.x[0]

afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.close()))
})
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('solver pool', () => {
  it('computes consecutive runs on the same kept thread and passes progress on', async () => {
    const pool = newPool()
    await pool.warm()
    const seen: RunMessage[] = []
    const first = await threadOf(run(pool, { ms: 5 }, (m) => seen.push(m)))
    const second = await threadOf(run(pool, { ms: 5 }))
    expect(second).toBe(first)
    expect(seen.map((m) => m.type)).toEqual(['progress'])
    expect(pool.busy()).toBe(0)
  })

  it('stops a run that honours the abort flag and keeps its thread for the next run', async () => {
    const pool = newPool()
    await pool.warm()
    const r = run(pool, { ms: 10_000 })
    await new Promise((ok) => setTimeout(ok, 100))
    r.abort()
    const stopped = await r.result
    expect(stopped?.status).toBe('aborted')
    const before = stopped!.arrays.x[0]
    expect(await threadOf(run(pool, { ms: 1 }))).toBe(before)
  })

  it('terminates a thread that ignores the flag after the grace period and replaces it', async () => {
    const pool = newPool()
    await pool.warm()
    const first = await threadOf(run(pool, { ms: 1 }))
    const r = run(pool, { ms: 10_000, ignoreAbort: true })
    await new Promise((ok) => setTimeout(ok, 100))
    const t0 = Date.now()
    r.abort()
    expect(await r.result).toBeNull()
    expect(Date.now() - t0).toBeLessThan(2_000)
    const next = await threadOf(run(pool, { ms: 1 }))
    expect(next).not.toBe(first)
  })

  it('rejects the run of a thread that crashes, and the next run gets a fresh thread', async () => {
    const pool = newPool()
    await expect(run(pool, { mode: 'crash' }).result).rejects.toThrow('stand-in crashed')
    expect(await threadOf(run(pool, { ms: 1 }))).toBeGreaterThan(0)
  })

  it('ends the run of a thread that exits without a result (the watchdog retries such a run)', async () => {
    const pool = newPool()
    expect(await run(pool, { mode: 'exit' }).result).toBeNull()
    expect(await threadOf(run(pool, { ms: 1 }))).toBeGreaterThan(0)
  })

  it('queues a run while every thread is busy; an aborted queued run ends at once without a thread', async () => {
    const pool = newPool(1)
    const busy = run(pool, { ms: 300 })
    const queued = run(pool, { ms: 1 })
    const dropped = run(pool, { ms: 1 })
    dropped.abort()
    expect(await dropped.result).toBeNull()
    expect(await threadOf(queued)).toBe(await threadOf(busy))
  })

  it('ends runs in hand when closed, and a closed pool takes no more runs', async () => {
    const pool = newPool(1)
    const inHand = run(pool, { ms: 10_000 })
    await pool.close()
    expect(await inHand.result).toBeNull()
    expect(await run(pool, { ms: 1 }).result).toBeNull()
  })
})
