// The upload route's parse thread (server/modules/traces/trace-parse-pool.ts): files are parsed off the
// calling thread, in order; a parse that runs past its deadline or out of the thread's heap costs that
// thread, not the process or the next file.
import { threadId } from 'node:worker_threads'
import { afterAll, describe, expect, it } from 'vitest'
import { TraceImportSettings } from '@shared/api/traces'
import { ParseThreadError, TraceParsePool } from '../../server/modules/traces/trace-parse-pool'
import { scopeCsv } from './big-files'

const settings = TraceImportSettings.parse({ name: 'pool', signalColumns: [1] })
const pools: TraceParsePool[] = []
const newPool = (o?: ConstructorParameters<typeof TraceParsePool>[0]) => {
  const p = new TraceParsePool(o)
  pools.push(p)
  return p
}
afterAll(() => Promise.all(pools.map((p) => p.stop())))

describe('the trace parse pool', () => {
  it('parses in a thread of its own and answers each file, in order', async () => {
    const pool = newPool()
    const files = [scopeCsv(5), scopeCsv(700), Buffer.from('no numbers here\n')]

    const answers = await Promise.all(files.map((f) => pool.parse(f, settings)))

    const [a, b, c] = answers
    expect(a.ok && b.ok).toBe(true)
    if (!a.ok || !b.ok || c.ok) throw new Error('unexpected answers')
    expect(a.threadId).not.toBe(threadId)
    expect([a.timeNs.length, b.timeNs.length]).toEqual([5, 700])
    // The header "time (s)" names the unit: sample 699 is at 699 × 0.1 ns.
    expect(b.timeUnit).toBe('s')
    expect(b.timeNs[699]).toBeCloseTo(69.9, 9)
    expect(c).toMatchObject({ parseError: true, message: expect.stringMatching(/^No numeric data found/) })
    expect(pool.answered).toBe(3)
    // The caller keeps its bytes: the thread parsed a copy.
    expect(files[1].length).toBeGreaterThan(0)
  })

  it('stops a parse past its deadline and parses the next file on a fresh thread', async () => {
    const pool = newPool()
    const warm = await pool.parse(scopeCsv(3), settings)

    // 200,000 rows take a good part of a second; one millisecond is far too little.
    const late = await pool.parse(scopeCsv(200_000), settings, { deadlineMs: 1 }).catch((e: unknown) => e)
    const next = await pool.parse(scopeCsv(3), settings)

    expect(late).toBeInstanceOf(ParseThreadError)
    expect((late as ParseThreadError).reason).toBe('deadline')
    if (!warm.ok || !next.ok) throw new Error('the small files were refused')
    expect(next.threadId).not.toBe(warm.threadId)
    expect(next.timeNs.length).toBe(3)
  })

  it("answers a thread that ran out of its heap as the file's memory problem, and this process carries on", async () => {
    // 2 MB of heap is too little for any parse (the thread needs more just to load the parser).
    const pool = newPool({ heapMb: 2 })

    const lost = await pool.parse(scopeCsv(1_000), settings).catch((e: unknown) => e)

    expect(lost).toBeInstanceOf(ParseThreadError)
    expect((lost as ParseThreadError).reason).toBe('memory')
    expect((lost as ParseThreadError).message).toBe('the file needs more than the 2 MB of memory one upload may use')
  })
})
