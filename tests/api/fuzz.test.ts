// Bounded fuzz of every API route that reads a JSON body or a query: 100 or more distinct hostile variants of a
// valid request per route (tests/api/fuzz-bodies.ts), sent as the group's owner (also a site admin) so
// they get past authorisation into the services, plus hostile path parameters on every route that has
// them. Nothing may answer 5xx, and every 4xx carries the ApiErrorBody envelope; a 400 from validation
// names the fields. The route list below is checked against the mounted routers (and server/index.ts's
// mounts), so a new route cannot be left out.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBody } from '@shared/api/api-error'
import { CHIP_WAVEGUIDE } from '../solver/chip-fixtures'
import { fetchJson, FUZZ_RUN_CONFIG, buildFuzzWorld, type FuzzWorld } from './fuzz-fixture'
import { fieldPaths, mutateBody, mutateQuery, NASTY_PATH_SEGMENTS, plannedBodies, seededRandom, toJsonText } from './fuzz-bodies'
import { mountedApiRoutes } from '../../server/openapi/route-walk'
import { useTestDb } from './helpers'
import { powerSweep, tinySweepBase } from './sweeps-fixtures'

const { db, pool } = useTestDb()

/**
 * Distinct hostile bodies per route (at least: a schema with many fields gets one planned body per field
 * plus MIN_RANDOM_BODIES); queries have fewer knobs, so fewer distinct variants exist; routes whose
 * valid requests cost a bcrypt hash get fewer. Bounded so the file takes about 30 s on a loaded 2-core machine.
 */
const BODY_VARIANTS = 100
const QUERY_VARIANTS = 50
const HASHING_VARIANTS = 30
/** Random bodies beside the planned ones (one per declared field, fuzz-bodies.ts plannedBodies). */
const MIN_RANDOM_BODIES = 30
const SEED = 0x5eed

interface RouteSpec {
  /** A valid request path (ids of the world's resources). */
  path: (w: FuzzWorld) => string
  body?: (w: FuzzWorld) => unknown
  query?: (w: FuzzWorld) => Record<string, string>
  variants?: number
  /** Status of the unmutated request when it is not a 2xx (a bogus token, say); proves the fuzz reaches the service. */
  validStatus?: number
  /** Why the route gets no body/query fuzz (path parameters are still fuzzed). */
  note?: string
}

const fitBody = (w: FuzzWorld) => ({ traceId: w.traceId, runId: w.runId, port: 'stokesOut', timeOffsetNs: { min: -1, max: 1 }, free: { linewidthMHz: { min: 10, max: 60 } } })
const runBody = (w: FuzzWorld) => ({ groupId: w.groupId, title: 'Fuzzed run', notes: 'n', config: FUZZ_RUN_CONFIG })

// Every route under /api. Keys are 'METHOD pattern' as Express mounts them.
const ROUTES: Record<string, RouteSpec> = {
  'GET /api/health': { path: () => '/api/health' },
  'POST /api/auth/sign-up': { path: () => '/api/auth/sign-up', body: () => ({ email: 'fuzz-signup@test.example', password: 'correct horse battery', name: 'Fuzz' }), variants: HASHING_VARIANTS },
  'POST /api/auth/sign-in': { path: () => '/api/auth/sign-in', body: () => ({ email: 'nobody@test.example', password: 'correct horse battery' }), variants: HASHING_VARIANTS, validStatus: 401 },
  'POST /api/auth/sign-out': { path: () => '/api/auth/sign-out', note: 'no input; it would end the session the fuzz uses' },
  'POST /api/auth/confirm-email': { path: () => '/api/auth/confirm-email', body: () => ({ token: 'c'.repeat(43) }), validStatus: 400 },
  'POST /api/auth/resend-confirmation': { path: () => '/api/auth/resend-confirmation', note: 'no input' },
  'POST /api/auth/password-reset/request': { path: () => '/api/auth/password-reset/request', body: () => ({ email: 'nobody@test.example' }) },
  'POST /api/auth/password-reset/complete': { path: () => '/api/auth/password-reset/complete', body: () => ({ token: 'r'.repeat(43), password: 'correct horse battery' }), variants: HASHING_VARIANTS, validStatus: 400 },
  'GET /api/me': { path: () => '/api/me' },
  'GET /api/openapi.json': { path: () => '/api/openapi.json' },
  'PATCH /api/me': { path: () => '/api/me', body: () => ({ name: 'Fuzz Owner', notifyOnFinish: false, notifyOnSweepFinish: true, notifyOnGroupChange: false }) },
  // A wrong current password keeps the account as it is; few variants, as wrong passwords count toward the account's limit.
  'POST /api/me/password': { path: () => '/api/me/password', body: () => ({ currentPassword: 'not the password', newPassword: 'correct horse battery' }), variants: 8, validStatus: 400 },
  'POST /api/me/email': { path: () => '/api/me/email', body: () => ({ currentPassword: 'not the password', newEmail: 'fuzz-moved@test.example' }), variants: 8, validStatus: 400 },
  'GET /api/groups': { path: () => '/api/groups' },
  'POST /api/groups': { path: () => '/api/groups', body: () => ({ name: 'Fuzzed group' }) },
  'GET /api/groups/:groupId': { path: (w) => `/api/groups/${w.groupId}` },
  'PATCH /api/groups/:groupId': { path: (w) => `/api/groups/${w.groupId}`, body: () => ({ name: 'Fuzz group' }) },
  'GET /api/groups/:groupId/members': { path: (w) => `/api/groups/${w.groupId}/members` },
  'PATCH /api/groups/:groupId/members/:userId': { path: (w) => `/api/groups/${w.groupId}/members/${w.extraId}`, body: () => ({ role: 'viewer' }) },
  'DELETE /api/groups/:groupId/members/:userId': { path: (w) => `/api/groups/${w.groupId}/members/${w.extraId}`, note: 'no input' },
  'GET /api/groups/:groupId/invitations': { path: (w) => `/api/groups/${w.groupId}/invitations` },
  'POST /api/groups/:groupId/invitations': { path: (w) => `/api/groups/${w.groupId}/invitations`, body: () => ({ email: 'invitee@test.example', role: 'viewer' }) },
  'DELETE /api/groups/:groupId/invitations/:invitationId': { path: (w) => `/api/groups/${w.groupId}/invitations/${w.invitationId}`, note: 'no input' },
  'POST /api/invitations/preview': { path: () => '/api/invitations/preview', body: (w) => ({ token: w.invitationToken }) },
  'POST /api/invitations/accept': { path: () => '/api/invitations/accept', body: () => ({ token: 'i'.repeat(43) }), validStatus: 404 },
  'GET /api/tokens': { path: () => '/api/tokens' },
  'POST /api/tokens': { path: () => '/api/tokens', body: () => ({ name: 'fuzz script', expiresInDays: 30 }) },
  'DELETE /api/tokens/:id': { path: (w) => `/api/tokens/${w.tokenId}`, note: 'no input' },
  'POST /api/shares': { path: () => '/api/shares', body: (w) => ({ resourceType: 'run', resourceId: w.runId }) },
  'GET /api/shares': { path: () => '/api/shares', query: (w) => ({ resourceType: 'run', resourceId: w.runId }) },
  'DELETE /api/shares/:id': { path: (w) => `/api/shares/${w.shareId}`, note: 'no input' },
  'GET /api/admin/held-mail': { path: () => '/api/admin/held-mail' },
  'DELETE /api/admin/held-mail': { path: () => '/api/admin/held-mail', note: 'no input' },
  'GET /api/admin/users': { path: () => '/api/admin/users' },
  'PATCH /api/admin/users/:id': { path: (w) => `/api/admin/users/${w.extraId}`, body: () => ({ isAdmin: false }) },
  'POST /api/runs': { path: () => '/api/runs', body: runBody },
  'POST /api/runs/estimate': { path: () => '/api/runs/estimate', body: () => ({ config: FUZZ_RUN_CONFIG }) },
  'GET /api/runs/speed': { path: () => '/api/runs/speed' },
  'GET /api/runs': { path: () => '/api/runs', query: (w) => ({ groupId: w.groupId, status: 'succeeded', author: 'me', q: 'amplifier', kind: 'all', sort: 'created_desc', page: '1', pageSize: '20' }) },
  'GET /api/runs/:id': { path: (w) => `/api/runs/${w.runId}` },
  'POST /api/runs/:id/cancel': { path: (w) => `/api/runs/${w.runId}/cancel`, note: 'no input' },
  'POST /api/runs/:id/clone': { path: (w) => `/api/runs/${w.runId}/clone`, body: () => ({ title: 'Fuzzed clone', notes: 'n' }) },
  'GET /api/runs/:id/events': { path: (w) => `/api/runs/${w.runId}/events`, note: 'an event stream, not JSON; ids are fuzzed' },
  'GET /api/runs/:id/arrays/:name': { path: (w) => `/api/runs/${w.runId}/arrays/time_ns`, query: () => ({ maxPoints: '100' }) },
  'GET /api/runs/:id/download': { path: (w) => `/api/runs/${w.runId}/download`, note: 'a ZIP stream; ids are fuzzed' },
  'GET /api/queue': { path: () => '/api/queue' },
  'GET /api/queue/activity': { path: () => '/api/queue/activity' },
  'POST /api/traces': { path: () => '/api/traces', note: 'multipart upload; its fuzz belongs to the upload tests' },
  'GET /api/traces': { path: () => '/api/traces', query: (w) => ({ groupId: w.groupId, q: 'fuzz', page: '1', pageSize: '50' }) },
  'GET /api/traces/:id': { path: (w) => `/api/traces/${w.traceId}` },
  'GET /api/traces/:id/data': { path: (w) => `/api/traces/${w.traceId}/data`, query: () => ({ maxPoints: '100' }) },
  'GET /api/traces/:id/original': { path: (w) => `/api/traces/${w.traceId}/original`, note: 'bytes, not JSON; ids are fuzzed' },
  'DELETE /api/traces/:id': { path: (w) => `/api/traces/${w.traceId}`, note: 'no input' },
  'POST /api/fits': { path: () => '/api/fits', body: fitBody },
  'GET /api/fits': { path: () => '/api/fits', query: (w) => ({ traceId: w.traceId, runId: w.runId }) },
  'GET /api/fits/:id': { path: (w) => `/api/fits/${w.fitId}` },
  'DELETE /api/fits/:id': { path: (w) => `/api/fits/${w.fitId}`, note: 'no input' },
  'POST /api/sweeps/estimate': { path: () => '/api/sweeps/estimate', body: (w) => { const s = powerSweep(w.groupId, 'x', 3, tinySweepBase()); return { baseConfig: s.baseConfig, axes: s.axes } } },
  'POST /api/sweeps': { path: () => '/api/sweeps', body: (w) => powerSweep(w.groupId, 'Fuzzed sweep', 2, tinySweepBase()) },
  'GET /api/sweeps': { path: () => '/api/sweeps', query: (w) => ({ groupId: w.groupId, page: '1', pageSize: '20' }) },
  'GET /api/sweeps/:id': { path: (w) => `/api/sweeps/${w.sweepId}` },
  'POST /api/sweeps/:id/cancel': { path: (w) => `/api/sweeps/${w.sweepId}/cancel`, note: 'no input' },
  'POST /api/sweeps/:id/rerun-failed': { path: (w) => `/api/sweeps/${w.sweepId}/rerun-failed`, note: 'no input' },
  'GET /api/sweeps/:id/download': { path: (w) => `/api/sweeps/${w.sweepId}/download`, query: () => ({ arrays: '0' }), variants: 40 },
  'GET /api/sweeps/:id/sensing-map': { path: (w) => `/api/sweeps/${w.sweepId}/sensing-map`, query: () => ({ format: 'json', noiseRms: '0' }), variants: 40, validStatus: 422 },
  'GET /api/waveguides': { path: () => '/api/waveguides', query: (w) => ({ groupId: w.groupId }) },
  'POST /api/waveguides': { path: () => '/api/waveguides', body: (w) => ({ groupId: w.groupId, waveguide: { ...CHIP_WAVEGUIDE, name: 'Fuzzed rib' }, notes: 'fuzz' }) },
  'GET /api/waveguides/:id': { path: (w) => `/api/waveguides/${w.waveguideId}` },
  'PUT /api/waveguides/:id': { path: (w) => `/api/waveguides/${w.waveguideId}`, body: () => ({ waveguide: CHIP_WAVEGUIDE, notes: 'fuzz' }) },
  'DELETE /api/waveguides/:id': { path: (w) => `/api/waveguides/${w.waveguideId}`, note: 'no input' },
  'POST /api/waveguides/:id/duplicate': { path: (w) => `/api/waveguides/${w.waveguideId}/duplicate`, body: () => ({ name: 'Fuzzed copy' }) },
}

let world: FuzzWorld
beforeAll(async () => {
  world = await buildFuzzWorld(db, pool)
}, 120_000)
afterAll(() => world?.stop())

interface Tally {
  sent: number
  problems: string[]
}

/** Checks one answer: never 5xx; a 4xx in the error envelope, with field paths on validation failures. */
function judge(t: Tally, label: string, status: number, text: string): void {
  t.sent++
  const show = () => `${label} → ${status} ${text.slice(0, 300)}`
  if (status >= 500) return void t.problems.push(show())
  if (status < 400) return
  let body: unknown
  try {
    body = JSON.parse(text)
  } catch {
    return void t.problems.push(`not JSON: ${show()}`)
  }
  const parsed = ApiErrorBody.safeParse(body)
  if (!parsed.success) return void t.problems.push(`not an ApiErrorBody: ${show()}`)
  const e = parsed.data.error
  if ((e.code === 'invalid_input' || e.code === 'invalid_path') && status === 400) {
    if (!e.fields?.length || e.fields.some((f) => typeof f.path !== 'string' || !f.message)) t.problems.push(`400 without field paths: ${show()}`)
  }
}

/** Runs `jobs` a few at a time: the server's pool, not the test, should be the bottleneck. */
async function inParallel(jobs: Array<() => Promise<void>>, width = 6): Promise<void> {
  let next = 0
  await Promise.all(Array.from({ length: width }, async () => {
    while (next < jobs.length) await jobs[next++]()
  }))
}

/** Up to n different values of make(); gives up after 5n tries (a small input space has fewer). */
function distinct(n: number, make: () => string): string[] {
  const seen = new Set<string>()
  for (let i = 0; i < 5 * n && seen.size < n; i++) seen.add(make())
  return [...seen]
}

const counts: Record<string, number> = {}
const keyOf = (r: { method: string; path: string }) => `${r.method} ${r.path}`

describe('API fuzz', () => {
  it('covers every mounted API route, and mounts what server/index.ts mounts', () => {
    const mounted = mountedApiRoutes(world.app).map(keyOf).sort()
    expect(mounted).toEqual(Object.keys(ROUTES).sort())
    const index = readFileSync(join(__dirname, '../../server/index.ts'), 'utf8')
    const indexMounts = [...index.matchAll(/\[\s*'(\/[a-z-]+)'\s*,/g)].map((m) => m[1]).sort()
    expect(indexMounts).toEqual([...world.mounts].sort())
    // Every validated body or query is fuzzed.
    for (const r of mountedApiRoutes(world.app)) {
      if (r.schemas.body) expect(ROUTES[keyOf(r)].body, `${keyOf(r)} validates a body`).toBeDefined()
      if (r.schemas.query) expect(ROUTES[keyOf(r)].query, `${keyOf(r)} validates a query`).toBeDefined()
    }
  })

  for (const [key, spec] of Object.entries(ROUTES)) {
    const [method, pattern] = key.split(' ')
    const params = pattern.split('/').map((s, i) => ({ s, i })).filter((p) => p.s.startsWith(':'))
    if (!spec.body && !spec.query && params.length === 0) continue

    it(`${key}: no hostile request gets a 5xx`, async () => {
      const route = mountedApiRoutes(world.app).find((r) => keyOf(r) === key)!
      const rnd = seededRandom(SEED ^ key.length ^ key.charCodeAt(key.length - 1))
      const tally: Tally = { sent: 0, problems: [] }
      const jobs: Array<() => Promise<void>> = []
      const path = spec.path(world)
      const validQuery = spec.query?.(world)
      const qs = validQuery ? `?${new URLSearchParams(validQuery)}` : ''
      const validBody = spec.body?.(world)
      const bodyText = validBody === undefined ? undefined : JSON.stringify(validBody)

      // The unmutated request first: it must get through authentication and validation into the service.
      // (Not for routes without input: they delete, stream or act, and other routes need the world intact.)
      if (spec.body || spec.query) {
        const valid = await fetchJson(world, method, path + qs, bodyText)
        if (spec.validStatus) expect(valid.status, valid.text).toBe(spec.validStatus)
        else expect(valid.status, valid.text).toBeLessThan(300)
      }

      if (spec.body && route.schemas.body) {
        const paths = fieldPaths(route.schemas.body)
        const planned = spec.variants ? [] : plannedBodies(validBody, paths).map(toJsonText)
        const random = distinct(Math.max(spec.variants ?? BODY_VARIANTS, planned.length + MIN_RANDOM_BODIES) - planned.length, () => toJsonText(mutateBody(validBody, paths, rnd)))
        for (const text of new Set([...planned, ...random])) {
          jobs.push(async () => {
            const res = await fetchJson(world, method, path + qs, text)
            judge(tally, `${key} body ${text.slice(0, 200)}`, res.status, res.text)
          })
        }
      }
      if (spec.query && validQuery) {
        const keys = route.schemas.query ? fieldPaths(route.schemas.query).filter((p) => p.path.length === 1).map((p) => String(p.path[0])) : Object.keys(validQuery)
        for (const q of distinct(Math.min(spec.variants ?? QUERY_VARIANTS, QUERY_VARIANTS), () => mutateQuery(validQuery, keys, rnd))) {
          jobs.push(async () => {
            const res = await fetchJson(world, method, `${path}?${q}`, bodyText)
            judge(tally, `${key} query ?${q.slice(0, 200)}`, res.status, res.text)
          })
        }
      }
      for (const p of params) {
        for (const seg of NASTY_PATH_SEGMENTS) {
          const parts = path.split('/')
          parts[p.i] = seg
          const bad = parts.join('/')
          jobs.push(async () => {
            const res = await fetchJson(world, method, bad + qs, bodyText)
            judge(tally, `${key} path ${bad.slice(0, 200)}`, res.status, res.text)
          })
        }
      }
      await inParallel(jobs)
      counts[key] = tally.sent
      expect(tally.problems.slice(0, 10)).toEqual([])
      expect(tally.sent).toBe(jobs.length)
    }, 180_000)
  }

  it('stores only finite numbers in the estimates of the runs it got accepted', async () => {
    // JSON has no Infinity or NaN: JSON.stringify writes them as null, so a null here is an overflow.
    const { rows } = await pool.query(`select id, estimate from runs where estimate is not null`)
    expect(rows.length).toBeGreaterThan(1)
    for (const { id, estimate: e } of rows) {
      const figures = [e.cells, e.steps, e.timeStepPs, e.cellUpdates, e.expectedSeconds, e.windowNs, e.lengthM, ...Object.values(e.memoryBytes)]
      expect(figures.every((x) => typeof x === 'number' && Number.isFinite(x)), `run ${id}: ${JSON.stringify(e)}`).toBe(true)
    }
    console.log(`fuzz requests per route: ${JSON.stringify(counts)}`)
  })
})
