// The job service end to end: the API on the test database, real worker processes taking runs from
// pg-boss, results in PostgreSQL, live events over SSE, cancel, a SIGKILLed worker, and the ZIP.
import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Server } from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { RunBlockEvent, RunDetail } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { RUN_QUEUE } from '../../server/jobs/queues'
import { simulate } from '../../solver/index'
import { silentLog, useTestDb } from '../api/helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from '../api/runs-fixtures'
import { spawnWorker, TEST_STALE_AFTER_S, waitFor, type WorkerProcess } from './worker-process'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('jobs')
const setup = runRoutesForTest(db, pool, schema)
let server: Server
let base: string
let editor: Member
const workers: WorkerProcess[] = []

beforeAll(async () => {
  const { routes } = await setup
  server = createApp({ db, pool, log: silentLog, routes }).listen(0, '127.0.0.1')
  await new Promise((r) => server.once('listening', r))
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`
  editor = await newMember(db, 'editor')
  workers.push(await spawnWorker(schema))
})

afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop()))
  server?.closeAllConnections()
  await new Promise((r) => server?.close(r))
})

const api = (path: string, init: RequestInit = {}) =>
  fetch(`${base}${path}`, { ...init, headers: { Authorization: editor.auth, 'Content-Type': 'application/json', ...(init.headers ?? {}) } })

async function submit(title: string, config: ReturnType<typeof chipRun>): Promise<RunDetail> {
  const res = await api('/runs', { method: 'POST', body: JSON.stringify({ groupId: editor.groupId, title, config }) })
  expect(res.status).toBe(202)
  return RunDetail.parse(await res.json())
}

const runRow = async (id: string) => (await pool.query(`select * from runs where id = $1`, [id])).rows[0]
const untilStatus = (id: string, status: string, timeoutMs = 60_000) =>
  waitFor(`run ${id} to be ${status}`, async () => {
    const r = await runRow(id)
    if (r.status === 'failed' && status !== 'failed') throw new Error(`run failed: ${r.error}`)
    return r.status === status && r
  }, timeoutMs)

interface SseEvent {
  id: number
  event: string
  data: any
}

/** Reads server-sent events until `enough` says stop or the server ends the stream. */
async function readEvents(runId: string, lastEventId: number | null, enough: (events: SseEvent[]) => boolean): Promise<{ events: SseEvent[]; ended: boolean }> {
  const ctl = new AbortController()
  const res = await api(`/runs/${runId}/events`, { signal: ctl.signal, headers: lastEventId === null ? {} : { 'Last-Event-ID': String(lastEventId) } })
  expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/)
  expect(res.headers.get('cache-control')).toBe('no-cache, no-transform')
  const reader = res.body!.getReader()
  const decoder = new TextDecoder()
  const events: SseEvent[] = []
  let buf = ''
  for (;;) {
    const { value, done } = await reader.read()
    if (done) return { events, ended: true }
    buf += decoder.decode(value, { stream: true })
    for (let i = buf.indexOf('\n\n'); i >= 0; i = buf.indexOf('\n\n')) {
      const fields = Object.fromEntries(buf.slice(0, i).split('\n').filter((l) => l && !l.startsWith(':')).map((l) => [l.slice(0, l.indexOf(':')), l.slice(l.indexOf(':') + 2)]))
      buf = buf.slice(i + 2)
      if (fields.data !== undefined) events.push({ id: Number(fields.id), event: fields.event, data: JSON.parse(fields.data) })
    }
    if (enough(events)) {
      ctl.abort()
      return { events, ended: false }
    }
  }
}

async function arrayBytes(runId: string, name: string): Promise<{ bytes: Buffer; headers: Headers }> {
  const res = await api(`/runs/${runId}/arrays/${name}?format=binary`)
  expect(res.status).toBe(200)
  return { bytes: Buffer.from(await res.arrayBuffer()), headers: res.headers }
}

let finishedRunId: string

describe('a run through a real worker process', () => {
  it('goes queued → running → succeeded and stores output traces equal to simulate() bit for bit', async () => {
    const config = chipRun(10, 1)
    const run = await submit('Halden rib, 10 ns', config)

    const done = await untilStatus(run.id, 'succeeded')
    finishedRunId = run.id

    const { rows } = await pool.query(`select payload->>'status' as s from run_events where run_id = $1 and kind = 'status' order by id`, [run.id])
    expect(rows.map((r) => r.s)).toEqual(['queued', 'running', 'succeeded'])
    expect(done.attempt).toBe(1)
    const reference = await simulate(config)
    expect(reference.status).toBe('finished')
    for (const name of ['ch1_stokes_out', 'ch1_pump_out']) {
      const { bytes, headers } = await arrayBytes(run.id, name)
      const ref = reference.arrays[name]
      expect(headers.get('x-dtype')).toBe('<c16')
      expect(headers.get('x-shape')).toBe(String(ref.length / 2))
      expect(bytes.equals(Buffer.from(ref.buffer, ref.byteOffset, ref.byteLength))).toBe(true)
    }
    const detail = RunDetail.parse(await (await api(`/runs/${run.id}`)).json())
    expect(detail.progress).toBe(1)
    expect(detail.figures?.channels[0].energyJ.pumpIn).toBe(reference.manifest.figures?.channels[0].energyJ.pumpIn)
    expect(detail.arrays.map((a) => a.name)).toEqual(reference.manifest.arrays.map((a) => a.name))
  })

  it('serves a small array as JSON on request', async () => {
    const res = await api(`/runs/${finishedRunId}/arrays/z_m?format=json`)
    const body = (await res.json()) as { units: string; data: number[] }

    expect(res.status).toBe(200)
    expect(body.units).toBe('m')
    expect(body.data[0]).toBe(0)
    expect(body.data.at(-1)).toBeCloseTo(0.05, 12)
  })

  it('streams status, progress and map blocks in order; a reconnect with Last-Event-ID loses and repeats nothing', async () => {
    // Long enough (≈2.5e8 cell-updates, several seconds) that two map blocks arrive while the run is still going.
    const run = await submit('Halden rib, 150 ns', chipRun(150, 0.5))

    // First connection: drop it after two map blocks, mid-run.
    const first = await readEvents(run.id, null, (ev) => ev.filter((e) => e.event === 'block').length >= 2)
    const resumeAt = first.events.at(-1)!.id
    const second = await readEvents(run.id, resumeAt, () => false)

    expect(first.ended).toBe(false)
    expect(second.ended).toBe(true)
    const all = [...first.events, ...second.events]
    const { rows } = await pool.query(`select id from run_events where run_id = $1 order by id`, [run.id])
    // A fresh connection starts at the latest queued/running status (the worker may already have the run).
    expect(all[0].event).toBe('status')
    expect(['queued', 'running']).toContain(all[0].data.status)
    expect(all.map((e) => e.id)).toEqual(rows.map((r) => Number(r.id)).filter((id) => id >= all[0].id))
    expect(all.at(-1)).toMatchObject({ event: 'status', data: { status: 'succeeded' } })
    const progress = all.filter((e) => e.event === 'progress').map((e) => e.data.fraction)
    expect(progress.length).toBeGreaterThan(1)
    expect(progress).toEqual([...progress].sort((a, b) => a - b))
    // Blocks tile the map rows in order, and together they are the stored final map, byte for byte.
    const blocks = all.filter((e) => e.event === 'block').map((e) => RunBlockEvent.parse(e.data))
    expect(blocks.map((b) => b.blockIndex)).toEqual(blocks.map((_, i) => i))
    blocks.forEach((b, i) => expect(b.rowStart).toBe(i === 0 ? 0 : blocks[i - 1].rowStart + blocks[i - 1].rowCount))
    const streamed = Buffer.concat(blocks.map((b) => Buffer.from(b.maps.stokesPowerW, 'base64')))
    expect(streamed.equals((await arrayBytes(run.id, 'map_stokes_power_w')).bytes)).toBe(true)
  })

  it('answers a finished run with nothing new with 204 so EventSource stops reconnecting', async () => {
    const { rows } = await pool.query(`select max(id) as id from run_events where run_id = $1`, [finishedRunId])

    const res = await api(`/runs/${finishedRunId}/events`, { headers: { 'Last-Event-ID': String(rows[0].id) } })

    expect(res.status).toBe(204)
  })
})

describe('a run that cannot be computed', () => {
  it('fails terminally with the reason on the run row when its stored config no longer parses', async () => {
    // A row as an older deploy might have left it: valid JSON, not a valid config for this solver.
    const { rows } = await pool.query(
      `insert into runs (group_id, author_id, title, config, config_hash, solver_version) values ($1, $2, 'legacy', '{"windowNs": -3}', 'x', '0.0.1') returning id`,
      [editor.groupId, editor.userId],
    )
    const { jobs } = await setup
    await jobs.boss.send(RUN_QUEUE, { schemaVersion: 1, runId: rows[0].id })

    const failed = await untilStatus(rows[0].id, 'failed')

    expect(failed.attempt).toBe(1)
    expect(failed.error).toMatch(/stored configuration is not valid.*Window length: must be at least 0.0002 ns/)
  })
})

describe('the ZIP download', () => {
  it('opens with unzip and each NPY header matches its manifest entry; traces come as CSV with units', async () => {
    const res = await api(`/runs/${finishedRunId}/download`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/zip')
    const dir = mkdtempSync(join(tmpdir(), 'sonoweave-zip-'))
    try {
      const zipPath = join(dir, 'run.zip')
      writeFileSync(zipPath, Buffer.from(await res.arrayBuffer()))

      expect(execFileSync('unzip', ['-t', zipPath], { encoding: 'utf8' })).toMatch(/No errors detected/)
      const listing = execFileSync('unzip', ['-l', zipPath], { encoding: 'utf8' })
      execFileSync('unzip', ['-q', zipPath, '-d', join(dir, 'x')])

      const manifest = JSON.parse(readFileSync(join(dir, 'x', 'manifest.json'), 'utf8'))
      expect(listing).toMatch(/README\.txt/)
      expect(listing).toMatch(/ch1_traces\.csv/)
      for (const a of manifest.arrays) {
        const npy = readFileSync(join(dir, 'x', a.file))
        // NPY 1.0 (numpy.org/neps/nep-0001-npy-format.html): magic, version, header length, dict literal.
        expect(npy.subarray(0, 8).equals(Buffer.from([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0]))).toBe(true)
        const header = npy.subarray(10, 10 + npy.readUInt16LE(8)).toString('latin1')
        const shape = a.shape.length === 1 ? `(${a.shape[0]},)` : `(${a.shape.join(', ')})`
        expect(header).toContain(`'descr': '${a.npyDescr}'`)
        expect(header).toContain(`'shape': ${shape}`)
        const itemBytes = { '<c16': 16, '<f8': 8, '<f4': 4 }[a.npyDescr as string]!
        expect(npy.length - 10 - npy.readUInt16LE(8)).toBe(a.shape.reduce((p: number, d: number) => p * d, 1) * itemBytes)
      }
      const csv = readFileSync(join(dir, 'x', 'ch1_traces.csv'), 'utf8').split('\n')
      expect(csv[0]).toMatch(/^time \(ns\),ch1_pump_in re \(sqrtW\),ch1_pump_in im \(sqrtW\),ch1_pump_in power \(W\),/)
      expect(csv.filter((l) => l).length - 1).toBe(manifest.arrays.find((a: { name: string }) => a.name === 'time_ns').shape[0])
      expect(readFileSync(join(dir, 'x', 'README.txt'), 'utf8')).toMatch(/ch1_stokes_out\.npy\s+<c16/)
      // The plotting script reads every array with numpy and checks its shape against the manifest.
      expect(listing).toMatch(/plot_run\.py/)
      const check = execFileSync('python3', [join(dir, 'x', 'plot_run.py'), '--check'], { encoding: 'utf8' })
      expect(check).toMatch(new RegExp(`^${manifest.arrays.length} arrays match manifest\\.json; [1-9]\\d* port traces; status finished`))
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})

describe('cancel', () => {
  it('stops a running run and frees its worker thread at once; nothing is stored', async () => {
    const run = await submit('Halden rib, long', chipRun(80, 0.2))
    await waitFor('progress', async () => (await runRow(run.id)).progress > 0.05)
    const workerId = (await runRow(run.id)).worker_id

    const t0 = Date.now()
    const res = await api(`/runs/${run.id}/cancel`, { method: 'POST' })
    const freedAfterMs = await waitFor('the thread to be free', async () => {
      const { rows } = await pool.query(`select busy from workers where id = $1`, [workerId])
      return rows[0]?.busy === 0 && Date.now() - t0
    })
    console.log(`cancel: worker thread free ${freedAfterMs} ms after the cancel request`)

    expect(res.status).toBe(200)
    // The same single-thread worker takes the next run straight away.
    const next = await submit('Halden rib, after cancel', chipRun(10, 1))
    await untilStatus(next.id, 'succeeded')
    const after = await runRow(run.id)
    expect(after.status).toBe('cancelled')
    expect(after.progress).toBeLessThan(1)
    const { rows } = await pool.query(`select count(*)::int as n from run_arrays where run_id = $1`, [run.id])
    expect(rows[0].n).toBe(0)
  }, 240_000)
})

describe('a worker killed with SIGKILL', () => {
  it('has its run finished by a second worker, with exactly one result set stored', async () => {
    workers.push(await spawnWorker(schema))
    const run = await submit('Halden rib, survives a kill', chipRun(60, 0.25))
    await waitFor('progress', async () => (await runRow(run.id)).progress > 0.1)
    const taken = await runRow(run.id)
    const victim = workers.find((w) => taken.worker_id.includes(`:${w.child.pid}:`))!
    expect(victim).toBeDefined()

    const killedAt = Date.now()
    victim.child.kill('SIGKILL')
    const retried = await waitFor('another worker to take the run', async () => {
      const r = await runRow(run.id)
      return r.attempt === 2 && r.status === 'running' && r
    }, 60_000)
    const retriedAfterMs = Date.now() - killedAt
    const done = await untilStatus(run.id, 'succeeded', 180_000)
    console.log(`kill -9: run taken by the other worker ${retriedAfterMs} ms after the kill`)

    expect(retried.worker_id).not.toBe(taken.worker_id)
    expect(done.attempt).toBe(2)
    const arrays = await pool.query(`select attempt, count(*)::int as n from run_arrays where run_id = $1 group by attempt`, [run.id])
    expect(arrays.rows).toEqual([{ attempt: 2, n: done.manifest.arrays.length }])
    const blocks = await pool.query(`select distinct attempt from run_map_blocks where run_id = $1`, [run.id])
    expect(blocks.rows).toEqual([{ attempt: 2 }])
    const statuses = await pool.query(`select payload->>'status' as s, attempt from run_events where run_id = $1 and kind = 'status' order by id`, [run.id])
    expect(statuses.rows).toEqual([
      { s: 'queued', attempt: 0 },
      { s: 'running', attempt: 1 },
      { s: 'queued', attempt: 1 },
      { s: 'running', attempt: 2 },
      { s: 'succeeded', attempt: 2 },
    ])
  }, 240_000)
})

// The interrupted runs are 4× the work of the others (≈ 4e8 node-steps): the WebAssembly engine finishes a
// shorter one before a stop or kill sent at 10 % progress can reach it.
describe('a worker stopped with SIGTERM', () => {
  it('hands its run back to the queue itself, without waiting for the watchdog, and the other worker finishes it', async () => {
    workers.push(await spawnWorker(schema))
    const run = await submit('Halden rib, survives a redeploy', chipRun(60, 0.25))
    await waitFor('progress', async () => (await runRow(run.id)).progress > 0.1)
    const taken = await runRow(run.id)
    const holder = workers.find((w) => taken.worker_id.includes(`:${w.child.pid}:`))!

    const stoppedAt = Date.now()
    await holder.stop()
    const { rows } = await pool.query(`select extract(epoch from created_at) * 1000 as at from run_events where run_id = $1 and kind = 'status' and payload->>'status' = 'queued' and attempt = 1`, [run.id])
    const done = await untilStatus(run.id, 'succeeded', 180_000)

    expect(holder.child.exitCode).toBe(0)
    // Handed back by the stopping worker: the watchdog could not have acted before the heartbeat went stale.
    expect(rows).toHaveLength(1)
    expect(Number(rows[0].at) - stoppedAt).toBeLessThan(TEST_STALE_AFTER_S * 1000)
    expect(done.attempt).toBe(2)
    expect(done.worker_id).not.toBe(taken.worker_id)
  }, 240_000)
})
