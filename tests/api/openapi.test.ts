// The API description: GET /api/openapi.json is a valid OpenAPI 3.1 document (checked with an independent
// validator of the OpenAPI 3.1 specification's own JSON Schemas), it lists exactly the routes the app mounts
// as server/index.ts composes it, each input schema is zod's rendering of the very schema the route validates
// with, and the Python example in docs/examples submits a run with an API token, follows it, downloads the
// ZIP and reads it with numpy (run where python3 has numpy and requests).
import { execFileSync, spawn } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Router } from 'express'
import { Validator } from '@seriousme/openapi-schema-validator'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { ApiErrorBody } from '@shared/api/api-error'
import { RunCreate } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { startJobService, type JobService } from '../../server/jobs/job-service'
import { fitsRoutes } from '../../server/modules/fits/fits.routes'
import { stopMailer } from '../../server/modules/mail/mailer'
import { queueRoutes } from '../../server/modules/queue/queue.routes'
import { RunEventRelay } from '../../server/modules/runs/run-event-relay'
import { runsRoutes } from '../../server/modules/runs/runs.routes'
import { startSweeps, type SweepsModule } from '../../server/modules/sweeps'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { waveguidesRoutes } from '../../server/modules/waveguides/waveguides.routes'
import { API_OPERATIONS } from '../../server/openapi/operations'
import { key } from '../../server/openapi/registry'
import { mountedApiRoutes } from '../../server/openapi/route-walk'
import { spawnWorker, type WorkerProcess } from '../jobs/worker-process'
import { silentLog, testDatabaseUrl, useTestDb } from './helpers'
import { newMember, queueSchemaFor } from './runs-fixtures'

const { db, pool } = useTestDb()
const ROOT = join(__dirname, '../..')
const schema = queueSchemaFor('openapi')

type Doc = { paths: Record<string, Record<string, Op>>; components: { schemas: Record<string, unknown>; securitySchemes: Record<string, { type: string; in?: string; name?: string; scheme?: string }> } }
type Op = { security: Array<Record<string, string[]>>; parameters: Array<{ name: string; in: string }>; requestBody?: { content: Record<string, { schema: unknown }> }; responses: Record<string, unknown> }

let jobs: JobService
let relay: RunEventRelay
let sweeps: SweepsModule
let server: Server
let base: string
let mounts: string[]
let app: ReturnType<typeof createApp>
let doc: Doc

beforeAll(async () => {
  jobs = await startJobService({ databaseUrl: testDatabaseUrl(), pool, log: silentLog, threads: 0, bossSchema: schema, watchdog: false })
  relay = new RunEventRelay(pool)
  sweeps = await startSweeps({ db, pool, log: silentLog, boss: jobs.boss, mail: false, feedIntervalMs: 60_000 })
  // As server/index.ts mounts them (compared with that file below).
  const routes: Array<[string, Router]> = [
    ['/runs', runsRoutes({ db, pool, log: silentLog, boss: jobs.boss, relay })],
    ['/queue', queueRoutes({ pool })],
    ['/traces', tracesRoutes({ db })],
    ['/fits', fitsRoutes({ db, boss: jobs.boss })],
    ['/sweeps', sweeps.routes],
    ['/waveguides', waveguidesRoutes({ db })],
  ]
  mounts = routes.map(([p]) => p)
  app = createApp({ db, pool, log: silentLog, routes })
  server = app.listen(0, '127.0.0.1')
  await new Promise((r) => server.once('listening', r))
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  const res = await fetch(`${base}/api/openapi.json`)
  expect(res.status).toBe(200)
  doc = (await res.json()) as Doc
})

afterAll(async () => {
  server?.closeAllConnections()
  await new Promise((r) => server?.close(r))
  await sweeps?.stop()
  relay?.close()
  await jobs?.stop()
  await stopMailer()
})

const documented = () => Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}`))
const opOf = (method: string, path: string) => doc.paths[path.replace(/:(\w+)/g, '{$1}')][method.toLowerCase()]
const rendered = (s: z.ZodType) => {
  const { $schema: _ignored, ...rest } = z.toJSONSchema(s, { target: 'draft-2020-12', unrepresentable: 'any', io: 'input' }) as Record<string, unknown>
  return rest
}

describe('GET /api/openapi.json', () => {
  it('is a valid OpenAPI 3.1 document, served without signing in', async () => {
    const result = await new Validator().validate(doc as unknown as Record<string, unknown>)
    expect(result.errors ?? []).toEqual([])
    expect(result.valid).toBe(true)
    expect((doc as unknown as { openapi: string }).openapi).toBe('3.1.0')
  })

  it('documents every route the app mounts, and no route it does not', () => {
    const mounted = mountedApiRoutes(app).map((r) => `${r.method} ${r.path}`).sort()
    expect(mounted.length).toBeGreaterThan(60)
    expect(documented().sort()).toEqual(mounted)
    expect(API_OPERATIONS.map(key).sort()).toEqual(mounted)
  })

  it('is built from the app server/index.ts composes', () => {
    const index = readFileSync(join(ROOT, 'server/index.ts'), 'utf8')
    const indexMounts = [...index.matchAll(/\[\s*'(\/[a-z-]+)'\s*,/g)].map((m) => m[1]).sort()
    expect(indexMounts).toEqual([...mounts].sort())
  })

  it("renders each route's input with zod from the very schema the route validates with", () => {
    const withSchemas = mountedApiRoutes(app).filter((r) => r.schemas.body || r.schemas.query)
    // The walk sees validate()'s schemas (otherwise this check would pass vacuously).
    expect(withSchemas.length).toBeGreaterThan(25)
    for (const r of withSchemas) {
      const entry = API_OPERATIONS.find((o) => key(o) === `${r.method} ${r.path}`)!
      if (entry.body) expect(entry.body, `${r.method} ${r.path} body`).toBe(r.schemas.body)
      if (entry.query) expect(entry.query, `${r.method} ${r.path} query`).toBe(r.schemas.query)
      const op = opOf(r.method, r.path)
      if (r.schemas.body) {
        const schema = op.requestBody!.content['application/json'].schema as { $ref?: string }
        const json = schema.$ref ? doc.components.schemas[schema.$ref.split('/').pop()!] : schema
        expect(json, `${r.method} ${r.path} body`).toEqual(rendered(r.schemas.body))
      }
      if (r.schemas.query) {
        const props = Object.keys((rendered(r.schemas.query) as { properties?: object }).properties ?? {})
        expect(op.parameters.filter((p) => p.in === 'query').map((p) => p.name), `${r.method} ${r.path} query`).toEqual(expect.arrayContaining(props))
      }
    }
    // A schema of the route's own (not in shared/) is taken from the mounted route as well.
    expect(opOf('PATCH', '/api/admin/users/:id').requestBody).toBeDefined()
    expect(doc.components.schemas.RunCreate).toEqual(rendered(RunCreate))
  })

  it('describes the error envelope and the three ways to authenticate', () => {
    const { $schema: _ignored, ...envelope } = z.toJSONSchema(ApiErrorBody, { target: 'draft-2020-12', unrepresentable: 'any' }) as Record<string, unknown>
    expect(doc.components.schemas.ApiErrorBody).toEqual(envelope)
    const s = doc.components.securitySchemes
    expect(s.bearerToken).toMatchObject({ type: 'http', scheme: 'bearer' })
    expect(s.sessionCookie).toMatchObject({ type: 'apiKey', in: 'cookie' })
    expect(s.shareToken).toMatchObject({ type: 'apiKey', in: 'query', name: 'share' })
    // Share links open the read routes of runs and sweeps, and nothing that writes.
    expect(opOf('GET', '/api/runs/:id/download').security).toContainEqual({ shareToken: [] })
    expect(opOf('GET', '/api/runs/:id/download').parameters.map((p) => p.name)).toContain('share')
    expect(opOf('POST', '/api/runs').security).toEqual([{ sessionCookie: [] }, { bearerToken: [] }])
    expect(opOf('GET', '/api/health').security).toEqual([])
    for (const ops of Object.values(doc.paths)) for (const op of Object.values(ops)) expect(op.responses['4XX']).toEqual({ $ref: '#/components/responses/Error' })
  })
})

function hasPythonWithNumpy(): boolean {
  try {
    execFileSync('python3', ['-c', 'import numpy, requests'], { stdio: 'ignore' })
    return true
  } catch {
    return false
  }
}
const PYTHON = hasPythonWithNumpy()
const PYTHON_TEST = 'submits a run with an API token, follows its events, downloads the ZIP and reads it with numpy'

describe('docs/examples/submit_run.py', () => {
  let worker: WorkerProcess | undefined
  afterAll(async () => worker?.stop())

  it.skipIf(!PYTHON)(PYTHON ? PYTHON_TEST : `${PYTHON_TEST} — skipped: python3 with numpy and requests is not installed here`, async () => {
    worker = await spawnWorker(schema)
    const member = await newMember(db, 'editor')
    const dir = mkdtempSync(join(tmpdir(), 'sonoweave-example-'))
    try {
      const summaryPath = join(dir, 'summary.json')
      const { code, output } = await new Promise<{ code: number | null; output: string }>((resolve) => {
        const child = spawn('python3', [join(ROOT, 'docs/examples/submit_run.py'), '--url', base, '--summary', summaryPath], {
          env: { ...process.env, SONOWEAVE_TOKEN: member.auth.replace(/^Bearer /, ''), SONOWEAVE_GROUP: '' },
          stdio: ['ignore', 'pipe', 'pipe'],
        })
        let out = ''
        child.stdout.on('data', (d) => (out += d))
        child.stderr.on('data', (d) => (out += d))
        child.on('exit', (c) => resolve({ code: c, output: out }))
      })
      expect(code, output).toBe(0)
      expect(output).toMatch(/status succeeded/)
      const summary = JSON.parse(readFileSync(summaryPath, 'utf8'))
      expect(summary.status).toBe('succeeded')

      // numpy's reading of the ZIP's NPY file (an implementation of the format outside this project) agrees
      // with the same array served as JSON by the API.
      const res = await fetch(`${base}/api/runs/${summary.runId}/arrays/ch1_stokes_out?format=json`, { headers: { Authorization: member.auth } })
      expect(res.status).toBe(200)
      const served = (await res.json()) as { shape: number[]; re: number[]; im: number[] }
      expect(summary.stokesOutDtype).toBe('complex128')
      expect(summary.stokesOutShape).toEqual(served.shape)
      expect(summary.stokesOutFirst).toEqual([served.re[0], served.im[0]])
      const peakW = Math.max(...served.re.map((re, i) => re * re + served.im[i] * served.im[i]))
      expect(summary.stokesOutPeakPowerW).toBeCloseTo(peakW, 15)
      expect(summary.arrays).toContain('time_ns')
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  }, 180_000)
})

describe('README', () => {
  it('quotes the Python example only with lines that are in docs/examples/submit_run.py', () => {
    const readme = readFileSync(join(ROOT, 'README.md'), 'utf8')
    const section = readme.slice(readme.indexOf('## The API for scripts'))
    const block = /```python\n([\s\S]*?)```/.exec(section)?.[1]
    expect(block, 'a python block in the README section').toBeTruthy()
    const script = new Set(readFileSync(join(ROOT, 'docs/examples/submit_run.py'), 'utf8').split('\n').map((l) => l.trim()))
    for (const line of block!.split('\n').map((l) => l.trim()).filter(Boolean)) expect(script.has(line), line).toBe(true)
  })
})
