// The world the API fuzz test sends its requests into: the app as server/index.ts composes it (queue
// without solver threads, so nothing runs), a group whose owner is also a site admin, and one of every
// resource a route can address (run with arrays, trace, fit, sweep, waveguide, share, token, invitation).
import type { Express, Router } from 'express'
import { createApp } from '../../server/app'
import type { Db, Pool } from '../../server/db/client'
import { invitations, runArrays, runs, traces } from '../../server/db/schema'
import { startJobService } from '../../server/jobs/job-service'
import { newSecretToken } from '../../server/modules/auth/secret-token'
import { fitsRoutes } from '../../server/modules/fits/fits.routes'
import { stopMailer } from '../../server/modules/mail/mailer'
import { queueRoutes } from '../../server/modules/queue/queue.routes'
import { RunEventRelay } from '../../server/modules/runs/run-event-relay'
import { runsRoutes } from '../../server/modules/runs/runs.routes'
import { startSweeps } from '../../server/modules/sweeps'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { waveguidesRoutes } from '../../server/modules/waveguides/waveguides.routes'
import { simulateSync } from '../../solver/index'
import { chipConfig, CHIP_WAVEGUIDE, gaussian } from '../solver/chip-fixtures'
import { addMember, apiToken, createGroup, createUser, sessionCookie, TEST_JWT_SECRET, uniqueEmail } from './auth-helpers'
import { silentLog, testDatabaseUrl } from './helpers'
import { queueSchemaFor } from './runs-fixtures'
import { powerSweep, tinySweepBase } from './sweeps-fixtures'

export interface FuzzWorld {
  app: Express
  /** http://127.0.0.1:port of one listener for the whole file (supertest would open one per request). */
  base: string
  /** Stops the listener, the feeder, the relay and the queue. */
  stop: () => Promise<void>
  /** Mount paths passed to createApp, to compare with server/index.ts. */
  mounts: string[]
  cookie: string
  groupId: string
  ownerId: string
  /** A viewer of the group the owner may act upon. */
  extraId: string
  runId: string
  traceId: string
  fitId: string
  sweepId: string
  waveguideId: string
  shareId: string
  tokenId: string
  invitationId: string
  invitationToken: string
}

// Stokes amplifier on the test chip, 20 ps steps: a few ms per solve, a run whose arrays the fit can use.
export const FUZZ_RUN_CONFIG = chipConfig({
  windowNs: 8,
  channels: [{ pump: { pulses: [], backgroundPowerW: 0.3 }, stokes: { pulses: [gaussian(1e-3, 3, 0.6, 'probe')], backgroundPowerW: 0 } }],
  grid: { timeStepPs: 20, mapRows: 16, mapCols: 16, mapReduction: 'max' },
})

const f64 = (values: number[]) => Buffer.from(Float64Array.from(values).buffer)

async function storedRun(db: Db, groupId: string, authorId: string): Promise<string> {
  const [r] = await db
    .insert(runs)
    .values({ groupId, authorId, title: 'Stokes amplifier', config: FUZZ_RUN_CONFIG, configHash: 'f'.repeat(64), solverVersion: '0.1.0', status: 'succeeded', attempt: 1 })
    .returning({ id: runs.id })
  const result = simulateSync(FUZZ_RUN_CONFIG)
  const rows = result.manifest.arrays
    .filter((a) => a.name === 'time_ns' || a.name.startsWith('ch1_'))
    .map((a) => ({ runId: r.id, attempt: 1, name: a.name, dtype: a.dtype, shape: a.shape, units: a.units, description: a.description, data: Buffer.from(result.arrays[a.name].buffer) }))
  await db.insert(runArrays).values(rows)
  return r.id
}

async function storedTrace(db: Db, groupId: string, authorId: string): Promise<string> {
  const t = Array.from({ length: 81 }, (_, i) => i * 0.1)
  const [row] = await db
    .insert(traces)
    .values({
      groupId,
      authorId,
      name: 'Fuzz trace',
      fileName: 'fuzz.csv',
      contentType: 'text/csv',
      byteSize: 12,
      sha256: '0'.repeat(64),
      format: 'delimited',
      original: Buffer.from('0,1\n1,2\n'),
      settings: { name: 'Fuzz trace', notes: '', delimiter: 'auto', decimalSeparator: 'auto', timeColumn: 0, timeUnit: 'ns', signalColumns: [1], signalUnit: 'W', baseline: null },
      columns: [
        { index: 0, name: 'Column 1', unitHint: null },
        { index: 1, name: 'Column 2', unitHint: null },
      ],
      signals: [{ column: 1, label: 'Column 2', unit: 'W', baseline: 0, peak: 1e-3 }],
      sampleCount: t.length,
      startNs: 0,
      endNs: 8,
      timeNs: f64(t),
      signalData: f64(t.map((x) => 1e-3 * Math.exp(-((x - 3) ** 2) / 0.5))),
    })
    .returning({ id: traces.id })
  return row.id
}

async function created(w: Pick<FuzzWorld, 'base' | 'cookie'>, path: string, body: object): Promise<{ id: string }> {
  const res = await fetchJson(w, 'POST', path, JSON.stringify(body))
  if (res.status >= 300) throw new Error(`fixture ${path} answered ${res.status}: ${res.text.slice(0, 300)}`)
  return JSON.parse(res.text)
}

/** A request to the world's listener as a same-origin browser page would send it. */
export async function fetchJson(w: Pick<FuzzWorld, 'base' | 'cookie'>, method: string, path: string, body?: string): Promise<{ status: number; text: string }> {
  const headers: Record<string, string> = { Cookie: w.cookie, Origin: w.base, Accept: 'application/json' }
  if (body !== undefined) headers['Content-Type'] = 'application/json'
  const res = await fetch(w.base + path, { method, headers, body, redirect: 'manual' })
  return { status: res.status, text: await res.text() }
}

/** Builds the world; call once in beforeAll and world.stop() in a top-level afterAll. */
export async function buildFuzzWorld(db: Db, pool: Pool): Promise<FuzzWorld> {
  const jobs = await startJobService({ databaseUrl: testDatabaseUrl(), pool, log: silentLog, threads: 0, bossSchema: queueSchemaFor('fuzz'), watchdog: false })
  const relay = new RunEventRelay(pool)
  const sweeps = await startSweeps({ db, pool, log: silentLog, boss: jobs.boss, mail: false, feedIntervalMs: 60_000 })
  // As server/index.ts mounts them (checked by the fuzz test against that file).
  const routes: Array<[string, Router]> = [
    ['/runs', runsRoutes({ db, pool, log: silentLog, boss: jobs.boss, relay })],
    ['/queue', queueRoutes({ pool })],
    ['/traces', tracesRoutes({ db })],
    ['/fits', fitsRoutes({ db, boss: jobs.boss })],
    ['/sweeps', sweeps.routes],
    ['/waveguides', waveguidesRoutes({ db })],
  ]
  // Generous limits: the fuzz is about bad input, not about the rate limits.
  const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET, signInFailuresPerMinute: 10_000, mailRequestsPerHour: 10_000 }, routes })

  const server = app.listen(0, '127.0.0.1')
  await new Promise<void>((resolve) => server.once('listening', () => resolve()))
  const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`
  const stop = async () => {
    server.closeAllConnections()
    await new Promise<void>((resolve) => server.close(() => resolve()))
    await sweeps.stop()
    relay.close()
    await jobs.stop()
    await stopMailer()
  }

  const groupId = await createGroup(db, 'Fuzz group')
  const owner = await createUser(db, { email: uniqueEmail('fuzz-owner'), isAdmin: true })
  const extra = await createUser(db, { email: uniqueEmail('fuzz-extra') })
  await addMember(db, groupId, owner.id, 'owner')
  await addMember(db, groupId, extra.id, 'viewer')
  const cookie = await sessionCookie(db, owner.id)
  const w = { base, cookie }

  const runId = await storedRun(db, groupId, owner.id)
  const traceId = await storedTrace(db, groupId, owner.id)
  const fit = await created(w, '/api/fits', { traceId, runId, port: 'stokesOut', timeOffsetNs: { min: -1, max: 1 } })
  const sweep = await created(w, '/api/sweeps', powerSweep(groupId, 'Fuzz sweep', 2, tinySweepBase()))
  const waveguide = await created(w, '/api/waveguides', { groupId, waveguide: CHIP_WAVEGUIDE, notes: 'fuzz' })
  const share = await created(w, '/api/shares', { resourceType: 'run', resourceId: runId })
  const token = await apiToken(db, owner.id)
  const inv = newSecretToken('inv_')
  const [invitation] = await db
    .insert(invitations)
    .values({ groupId, email: uniqueEmail('fuzz-invitee'), role: 'viewer', tokenHash: inv.hash, invitedBy: owner.id, expiresAt: new Date(Date.now() + 3600_000) })
    .returning({ id: invitations.id })

  return {
    app,
    base,
    stop,
    mounts: routes.map(([p]) => p),
    cookie,
    groupId,
    ownerId: owner.id,
    extraId: extra.id,
    runId,
    traceId,
    fitId: fit.id,
    sweepId: sweep.id,
    waveguideId: waveguide.id,
    shareId: share.id,
    tokenId: token.id,
    invitationId: invitation.id,
    invitationToken: inv.token,
  }
}

