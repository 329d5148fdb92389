// The whole server (server/index.ts with its embedded worker) on a PostgreSQL cluster of this file's own,
// which is restarted twice: once after a live stream was opened and closed (its listening connection back
// in the pool), once while a stream is open and a run is computing. The server must keep answering, the
// run must finish exactly once, and a stream opened afterwards must still hear about it.
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDb, createPool, type Pool } from '../../server/db/client'
import { migrateDatabase } from '../../server/db/migrate'
import { chipRun, newMember, type Member } from '../api/runs-fixtures'
import { waitFor } from '../jobs/worker-process'
import { freePort, startThrowawayCluster, type ThrowawayCluster } from './throwaway-cluster'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))

let pg: ThrowawayCluster
let pool: Pool
let editor: Member
let server: ChildProcess
let serverOutput = ''
let base: string
let dataDir: string

beforeAll(async () => {
  pg = await startThrowawayCluster()
  await migrateDatabase(pg.url())
  pool = createPool(pg.url(), { max: 2, applicationName: 'sonoweave-test' })
  editor = await newMember(createDb(pool), 'editor')
  dataDir = mkdtempSync(join(tmpdir(), 'sonoweave-restart-data-'))
  const port = await freePort()
  base = `http://127.0.0.1:${port}/api`
  server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: pg.url(), PORT: String(port), HOST: '127.0.0.1', DATA_DIR: dataDir, EMBEDDED_WORKER: 'true', WORKER_COUNT: '1', LOG_LEVEL: 'warn', NODE_ENV: 'test' },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  server.stdout!.on('data', (d) => (serverOutput += d))
  server.stderr!.on('data', (d) => (serverOutput += d))
  await waitFor('the server to listen', async () => {
    if (server.exitCode !== null) throw new Error(`the server exited with ${server.exitCode}:\n${serverOutput}`)
    return serverOutput.includes('Sonoweave is running at')
  }, 120_000)
}, 180_000)

afterAll(async () => {
  if (server && server.exitCode === null && server.signalCode === null) {
    const exited = new Promise((r) => server.once('exit', r))
    server.kill('SIGTERM')
    await exited
  }
  await pool?.end()
  pg?.remove()
  if (dataDir) rmSync(dataDir, { recursive: true, force: true })
})

const api = (path: string, init: RequestInit = {}) =>
  fetch(`${base}${path}`, { ...init, headers: { Authorization: editor.auth, 'Content-Type': 'application/json', ...(init.headers ?? {}) } })

const serverAlive = () => server.exitCode === null && server.signalCode === null

/** Health answers 200 once the server has its database back; a dead server fails at once. */
async function untilHealthy(): Promise<void> {
  await waitFor('the server to report a healthy database', async () => {
    if (!serverAlive()) throw new Error(`the server died:\n${serverOutput}`)
    const res = await fetch(`${base}/health`).catch(() => null)
    return res?.status === 200
  }, 120_000, 250)
}

const runStatus = async (id: string): Promise<string | null> =>
  (await pool.query(`select status from runs where id = $1`, [id]).catch(() => ({ rows: [] as { status: string }[] }))).rows[0]?.status ?? null

interface Stream {
  events: Array<{ event: string; data: { status?: string } }>
  ended: Promise<void>
  close: () => void
}

/** An SSE stream read in the background until the server ends it or close() is called. */
async function openStream(runId: string): Promise<Stream> {
  const ctl = new AbortController()
  const res = await api(`/runs/${runId}/events`, { signal: ctl.signal })
  expect(res.status).toBe(200)
  const events: Stream['events'] = []
  const reader = res.body!.getReader()
  const decoder = new TextDecoder()
  const ended = (async () => {
    let buf = ''
    try {
      for (;;) {
        const { value, done } = await reader.read()
        if (done) return
        buf += decoder.decode(value, { stream: true })
        for (let i = buf.indexOf('\n\n'); i >= 0; i = buf.indexOf('\n\n')) {
          const lines = buf.slice(0, i).split('\n')
          buf = buf.slice(i + 2)
          const event = lines.find((l) => l.startsWith('event: '))?.slice(7)
          const data = lines.find((l) => l.startsWith('data: '))?.slice(6)
          if (event && data) events.push({ event, data: JSON.parse(data) })
        }
      }
    } catch {
      /* closed by us or cut by the server */
    }
  })()
  const close = () => {
    ctl.abort()
    void reader.cancel().catch(() => {})
  }
  return { events, ended, close }
}

describe('a database restart under a running server', () => {
  it('keeps the server answering with closed and open streams, and a running run finishes once', async () => {
    // Long enough (twice the 150 ns run of tests/jobs/worker.test.ts, tens of seconds) to be still computing
    // through both restarts, which take about a second each.
    const submitted = await api('/runs', { method: 'POST', body: JSON.stringify({ groupId: editor.groupId, title: 'Halden rib, through a restart', config: chipRun(300, 0.5) }) })
    expect(submitted.status).toBe(202)
    const run = (await submitted.json()) as { id: string }
    await waitFor('the run to start', async () => (await runStatus(run.id)) === 'running', 120_000)

    // A stream opened and closed: the relay's connection goes back to the pool before the restart.
    const closed = await openStream(run.id)
    await waitFor('the first event', async () => closed.events.length > 0)
    closed.close()
    await closed.ended
    await new Promise((r) => setTimeout(r, 500))
    pg.restart()
    await untilHealthy()

    // A stream open through the restart, with the run still computing.
    const open = await openStream(run.id)
    await waitFor('the first event', async () => open.events.length > 0)
    expect(await runStatus(run.id)).toBe('running')
    pg.restart()
    await untilHealthy()

    await waitFor('the run to finish', async () => {
      const s = await runStatus(run.id)
      return s !== null && !['queued', 'running'].includes(s)
    }, 600_000, 500)
    const { rows } = await pool.query(`select payload->>'status' as status from run_events where run_id = $1 and kind = 'status' order by id`, [run.id])
    const finals = rows.map((r) => r.status).filter((s) => !['queued', 'running'].includes(s))
    expect(finals).toEqual(['succeeded'])
    // A stream opened now replays the run up to its end, and the server ends it there.
    const after = await openStream(run.id)
    await after.ended
    expect(after.events.at(-1)).toMatchObject({ event: 'status', data: { status: 'succeeded' } })
    open.close()
    expect(serverAlive()).toBe(true)
    expect((await fetch(`${base}/health`)).status).toBe(200)
  }, 900_000)
})
