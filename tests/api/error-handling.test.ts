import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Writable } from 'node:stream'
import { Router } from 'express'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { ApiErrorBody } from '@shared/api/api-error'
import { createApp } from '../../server/app'
import { createDb, createPool } from '../../server/db/client'
import { AppError } from '../../server/errors'
import { validate } from '../../server/middleware/validate'

// These routes exist only in this test, to drive the error middleware through real requests.
const Pulse = z.object({ name: z.string().min(1), pulse: z.object({ fwhmNs: z.number().positive() }) })
function probeRoutes(): Router {
  const r = Router()
  r.post('/echo', validate({ body: Pulse }), (req, res) => res.json(req.body))
  r.get('/list', validate({ query: z.object({ limit: z.coerce.number().int().max(100) }) }), (req, res) => res.json(req.query))
  r.get('/pulses/:pulseId/samples/:sampleName', (req, res) => res.json(req.params))
  r.get('/conflict', () => {
    throw new AppError('run_locked', 409, 'This run is already being edited')
  })
  r.get('/boom', async () => {
    await Promise.resolve()
    throw new Error('password for db at /srv/secret.conf rejected')
  })
  return r
}

function captureLog() {
  const lines: Array<Record<string, unknown>> = []
  const stream = new Writable({
    write(chunk, _enc, cb) {
      lines.push(JSON.parse(String(chunk)))
      cb()
    },
  })
  return { log: pino({ level: 'error' }, stream), lines }
}

// The pool is never queried here; pg connects lazily.
const pool = createPool('postgres://postgres@127.0.0.1:1/unused', { max: 1 })
afterAll(() => pool.end())
const { log, lines } = captureLog()
const app = createApp({ pool, db: createDb(pool), log, jsonLimit: '2kb', routes: [['/probe', probeRoutes()]] })

describe('error middleware', () => {
  it('turns a zod failure into 400 invalid_input with one entry per field path', async () => {
    const res = await request(app).post('/api/probe/echo').send({ name: '', pulse: { fwhmNs: -3 } })

    expect(res.status).toBe(400)
    const body = ApiErrorBody.parse(res.body)
    expect(body.error.code).toBe('invalid_input')
    expect(body.error.fields?.map((f) => f.path).sort()).toEqual(['name', 'pulse.fwhmNs'])
    expect(body.error.fields?.every((f) => f.message.length > 0)).toBe(true)
  })

  it('passes a valid body through, parsed', async () => {
    const res = await request(app).post('/api/probe/echo').send({ name: 'SMF-28 spool', pulse: { fwhmNs: 2 }, extra: 1 })

    expect(res.status).toBe(200)
    expect(res.body).toEqual({ name: 'SMF-28 spool', pulse: { fwhmNs: 2 } })
  })

  it('validates the query string too', async () => {
    const bad = await request(app).get('/api/probe/list?limit=500')
    const good = await request(app).get('/api/probe/list?limit=20')

    expect(bad.status).toBe(400)
    expect(bad.body.error.fields[0].path).toBe('limit')
    expect(good.body).toEqual({ limit: 20 })
  })

  it('answers malformed JSON with 400, not 500', async () => {
    const res = await request(app).post('/api/probe/echo').set('Content-Type', 'application/json').send('{"name": ')

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('malformed_json')
  })

  it('answers a body over the limit with 413', async () => {
    const res = await request(app).post('/api/probe/echo').send({ name: 'x'.repeat(4000), pulse: { fwhmNs: 1 } })

    expect(res.status).toBe(413)
    expect(res.body.error.code).toBe('payload_too_large')
  })

  it('answers an unknown API path with a JSON 404', async () => {
    const res = await request(app).get('/api/no-such-thing')

    expect(res.status).toBe(404)
    expect(res.headers['content-type']).toMatch(/application\/json/)
    expect(ApiErrorBody.parse(res.body).error.code).toBe('not_found')
  })

  it('maps an AppError to its own status and code', async () => {
    const res = await request(app).get('/api/probe/conflict')

    expect(res.status).toBe(409)
    expect(res.body.error).toMatchObject({ code: 'run_locked', message: 'This run is already being edited' })
  })

  it('turns an unexpected throw into 500 that leaks nothing but logs the error with the request id', async () => {
    const res = await request(app).get('/api/probe/boom').set('X-Request-Id', 'trace-abc-123')

    expect(res.status).toBe(500)
    const body = ApiErrorBody.parse(res.body)
    expect(body.error.code).toBe('internal')
    expect(body.error.requestId).toBe('trace-abc-123')
    expect(res.headers['x-request-id']).toBe('trace-abc-123')
    expect(res.text).not.toMatch(/secret|password|\.ts:\d+|at .*\(/)
    const logged = lines.find((l) => l.requestId === 'trace-abc-123' && l.msg === 'unhandled error')
    expect(logged).toBeDefined()
    expect(JSON.stringify(logged)).toContain('/srv/secret.conf')
  })

  it('answers malformed percent-encoding in a path parameter with 400 naming that parameter', async () => {
    // %E0%A4%A is a cut-off three-byte UTF-8 sequence; %ED%A0%80 encodes a lone surrogate, which is not UTF-8 at all.
    const cut = await request(app).get('/api/probe/pulses/%E0%A4%A/samples/a')
    const surrogate = await request(app).get('/api/probe/pulses/p1/samples/%ED%A0%80')
    const good = await request(app).get('/api/probe/pulses/p%201/samples/%F0%9F%98%80')

    expect(cut.status).toBe(400)
    expect(ApiErrorBody.parse(cut.body).error.fields?.map((f) => f.path)).toEqual(['pulseId'])
    expect(cut.body.error.code).toBe('invalid_path')
    expect(surrogate.status).toBe(400)
    expect(surrogate.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['sampleName'])
    expect(good.body).toEqual({ pulseId: 'p 1', sampleName: '😀' })
    expect(lines.some((l) => l.msg === 'unhandled error' && JSON.stringify(l).includes('decode'))).toBe(false)
  })

  it('replaces a request id that is unsafe to echo', async () => {
    const res = await request(app).get('/api/no-such-thing').set('X-Request-Id', 'bad id\twith spaces')

    expect(res.body.error.requestId).toMatch(/^[0-9a-f-]{36}$/)
  })
})

describe('serving the built client', () => {
  const dist = mkdtempSync(join(tmpdir(), 'sonoweave-dist-'))
  writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Sonoweave</title><div id="app"></div>')
  writeFileSync(join(dist, 'app.js'), 'console.log(1)')
  afterAll(() => rmSync(dist, { recursive: true, force: true }))
  const withClient = createApp({ pool, db: createDb(pool), log, distDir: dist })

  it('serves files, and the app shell for client-side routes', async () => {
    const file = await request(withClient).get('/app.js')
    const deep = await request(withClient).get('/runs/42/traces')

    expect(file.status).toBe(200)
    expect(file.text).toBe('console.log(1)')
    expect(deep.status).toBe(200)
    expect(deep.text).toContain('<title>Sonoweave</title>')
  })

  it('keeps API 404s as JSON even with the client present', async () => {
    const res = await request(withClient).get('/api/runs-that-do-not-exist')

    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })
})
