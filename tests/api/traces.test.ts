// The traces API against the real PostgreSQL: upload (multipart), read back byte for byte, parsed arrays,
// refusals that store nothing, the upload size limit, large files parsed off the event loop, the time
// unit a file does not name, and group roles.
import { createHash } from 'node:crypto'
import { request as httpRequest } from 'node:http'
import type { AddressInfo } from 'node:net'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildTrace, parseTraceFile } from '@shared/analysis/trace-parse'
import { TraceData, TraceDetail, TraceImportSettings, TraceList, TRACE_UPLOAD_LIMIT_BYTES } from '@shared/api/traces'
import { createApp } from '../../server/app'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { traceParsePool } from '../../server/modules/traces/trace-parse-pool'
import { oneLineCsv, scopeCsv } from '../traces/big-files'
import { silentLog, useTestDb } from './helpers'
import { newMember, newUser, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, routes: [['/traces', tracesRoutes({ db })]] })
const corpus = (name: string) => readFileSync(join(__dirname, '../traces/corpus', name))
const malformed = (name: string) => readFileSync(join(__dirname, '../traces/malformed', name))

let editor: Member
let viewer: Member
let outsider: Member

beforeAll(async () => {
  editor = await newMember(db, 'editor')
  viewer = await newMember(db, 'viewer', editor.groupId, 'Mei Okafor')
  outsider = await newMember(db, 'editor', undefined, 'Outside Person')
})

const settingsFor = (groupId: string, extra: Record<string, unknown> = {}) =>
  JSON.stringify({ groupId, name: 'Retrieved pulse, 2 ns storage', timeColumn: 0, timeUnit: 'us', signalColumns: [1], signalUnit: 'mW', ...extra })

const upload = (who: Member, bytes: Buffer, fileName: string, settings: string) =>
  request(app).post('/api/traces').set('Authorization', who.auth).attach('file', bytes, fileName).field('settings', settings)

const tracesInGroup = async (groupId: string) => Number((await pool.query('select count(*) as n from traces where group_id = $1', [groupId])).rows[0].n)

describe('POST /api/traces', () => {
  it('stores a semicolon/decimal-comma file: the original byte for byte and the parsed arrays in W and ns', async () => {
    const bytes = corpus('02-semicolon-decimal-comma.csv')

    const res = await upload(editor, bytes, 'retrieval µs.csv', settingsFor(editor.groupId))

    expect(res.status).toBe(201)
    const trace = TraceDetail.parse(res.body)
    expect(trace).toMatchObject({ sampleCount: 4, startNs: 0, endNs: 3, format: 'delimited', fileName: 'retrieval µs.csv', authorName: 'Tomas Reyes' })
    expect(trace.signals[0]).toMatchObject({ label: 'Leistung [mW]', unit: 'W' })
    const original = await request(app).get(`/api/traces/${trace.id}/original`).set('Authorization', viewer.auth).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
    expect(original.status).toBe(200)
    expect(Buffer.compare(original.body as Buffer, bytes)).toBe(0)
    expect(original.headers['content-disposition']).toContain("filename*=UTF-8''retrieval%20%C2%B5s.csv")
    const data = TraceData.parse((await request(app).get(`/api/traces/${trace.id}/data`).set('Authorization', viewer.auth)).body)
    expect(data.timeNs).toEqual([0, 1, 2, 3])
    data.signals[0].values.forEach((v, i) => expect(v).toBeCloseTo([0.5e-3, 1.25e-3, 2e-3, 0.75e-3][i], 15))
  })

  it('stores an NPY array written by numpy', async () => {
    const res = await upload(editor, corpus('14-columns-f8.npy'), 'scope.npy', settingsFor(editor.groupId, { timeUnit: 'ns', signalUnit: 'arb' }))

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ format: 'npy', sampleCount: 5, endNs: 0.4 })
  })

  it.each([
    ['ragged-rows.csv', /ragged-rows.csv: Line 4 has 2 fields but the data starting at line 2 have 3 columns/],
    ['non-monotonic-time.csv', /Time is not increasing at row 4 \(line 5\)/],
    ['no-numeric-data.csv', /No numeric data found/],
    ['binary-garbage.bin', /not a text file or an NPY array: binary byte/],
    ['truncated.npy', /NPY header promises 80 bytes/],
  ])('refuses %s with 422, says what and where, and stores nothing', async (name, message) => {
    const before = await tracesInGroup(editor.groupId)

    const res = await upload(editor, malformed(name), name, settingsFor(editor.groupId, { timeUnit: 'ns', signalUnit: 'arb' }))

    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('unreadable_trace')
    expect(res.body.error.message).toMatch(message)
    expect(await tracesInGroup(editor.groupId)).toBe(before)
  })

  it('refuses settings that break the shared schema with 400 and field paths, storing nothing', async () => {
    const before = await tracesInGroup(editor.groupId)

    const res = await upload(editor, corpus('09-quoted-crlf.csv'), 'x.csv', settingsFor(editor.groupId, { signalUnit: 'V', signalColumns: [] }))

    expect(res.status).toBe(400)
    const paths = res.body.error.fields.map((f: { path: string }) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['settings.signalColumns', 'settings.responsivityVPerW']))
    expect(await tracesInGroup(editor.groupId)).toBe(before)
  })

  it('answers 400 when no file is attached', async () => {
    const res = await request(app).post('/api/traces').set('Authorization', editor.auth).field('settings', settingsFor(editor.groupId))
    expect(res.status).toBe(400)
    expect(res.body.error.message).toMatch(/No file was sent/)
  })
})

describe('the upload size limit', () => {
  let base: string
  let server: ReturnType<typeof app.listen>
  beforeAll(async () => {
    server = app.listen(0, '127.0.0.1')
    await new Promise((r) => server.once('listening', r))
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  })
  afterAll(() => new Promise<void>((r) => server.close(() => r())))

  /** Sends up to `total` bytes of multipart body; stops at the first response. Returns status, body and bytes sent. */
  function send(total: number, declareLength: boolean): Promise<{ status: number; body: string; sent: number }> {
    return new Promise((resolve, reject) => {
      const boundary = 'halden-boundary'
      const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.csv"\r\nContent-Type: text/csv\r\n\r\n`)
      const headers: Record<string, string> = { 'Content-Type': `multipart/form-data; boundary=${boundary}`, Authorization: editor.auth }
      if (declareLength) headers['Content-Length'] = String(total)
      const req = httpRequest(`${base}/api/traces`, { method: 'POST', headers })
      let sent = 0
      let done = false
      const chunk = Buffer.alloc(256 * 1024, '1,2\n')
      req.on('response', (res) => {
        done = true
        let body = ''
        res.on('data', (c) => (body += c))
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body, sent }))
      })
      req.on('error', (err) => (done ? undefined : reject(err)))
      const pump = () => {
        while (!done && sent < total) {
          const ok = req.write(sent === 0 ? head : chunk)
          sent += sent === 0 ? head.length : chunk.length
          if (!ok) return void req.once('drain', pump)
        }
        if (!done) req.end()
      }
      pump()
    })
  }

  it('refuses a declared 200 MB upload with 413 before reading its body', async () => {
    const r = await send(200 * 1024 * 1024, true)

    expect(r.status).toBe(413)
    expect(JSON.parse(r.body).error.message).toMatch(/larger than the 25 MB upload limit/)
    // The answer came while the client had sent only a small part.
    expect(r.sent).toBeLessThan(50 * 1024 * 1024)
  })

  it('refuses a 200 MB upload of unknown length with 413 once the limit is crossed, storing nothing', async () => {
    const before = await tracesInGroup(editor.groupId)

    const r = await send(200 * 1024 * 1024, false)

    expect(r.status).toBe(413)
    expect(JSON.parse(r.body).error.message).toMatch(/The file is larger than the 25 MB upload limit/)
    expect(r.sent).toBeLessThan(TRACE_UPLOAD_LIMIT_BYTES + 40 * 1024 * 1024)
    expect(await tracesInGroup(editor.groupId)).toBe(before)
  })
})

describe('a file that does not name its time unit', () => {
  // No header: time in µs from 0 to 7.98 in steps of 0.02, read as seconds it would span 8 s.
  const headerless = () => Buffer.from(Array.from({ length: 400 }, (_, i) => `${(i * 0.02).toFixed(2)},${(1e-3 * Math.exp(-(((i - 200) / 40) ** 2))).toExponential(4)}`).join('\n'))
  const settings = (extra: Record<string, unknown>) => JSON.stringify({ groupId: editor.groupId, name: 'Probe pulse', timeColumn: 0, signalColumns: [1], signalUnit: 'W', ...extra })

  it('is refused with 422 naming settings.timeUnit when the upload does not say the unit, storing nothing', async () => {
    const before = await tracesInGroup(editor.groupId)

    const res = await upload(editor, headerless(), 'probe.csv', settings({}))

    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('time_unit_required')
    expect(res.body.error.message).toMatch(/probe.csv: The file does not name the unit of its time column \("Column 1"\): choose the time unit/)
    expect(res.body.error.fields).toEqual([{ path: 'settings.timeUnit', message: expect.stringMatching(/required/) }])
    expect(await tracesInGroup(editor.groupId)).toBe(before)
  })

  it('is stored in the unit the upload gives: 0–7.98 µs is 0–7980 ns', async () => {
    const res = await upload(editor, headerless(), 'probe.csv', settings({ timeUnit: 'us' }))

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ sampleCount: 400, startNs: 0, settings: { timeUnit: 'us' } })
    expect(res.body.endNs).toBeCloseTo(7980, 9)
  })

  it('needs no unit in the upload when the header names it, and stores the header\'s unit', async () => {
    const res = await upload(editor, corpus('02-semicolon-decimal-comma.csv'), 'x.csv', settings({ signalUnit: 'mW' }))

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ startNs: 0, endNs: 3, settings: { timeUnit: 'us' } })
  })
})

describe('large uploads keep the API responsive', () => {
  let base: string
  let server: ReturnType<typeof app.listen>
  beforeAll(async () => {
    server = app.listen(0, '127.0.0.1')
    await new Promise((r) => server.once('listening', r))
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
    // The first request warms up the route and the pool; that pause belongs to the test, not the server.
    await getHealth()
  })
  afterAll(() => new Promise<void>((r) => server.close(() => r())))

  /**
   * GET /api/health on a connection of its own: a kept-alive one that sat idle through the file's
   * generation may be closed by the server just as it is reused.
   */
  function getHealth(): Promise<number> {
    return new Promise((resolve, reject) => {
      httpRequest(`${base}/api/health`, { agent: false }, (res) => {
        res.resume()
        res.on('end', () => resolve(res.statusCode ?? 0))
      })
        .on('error', reject)
        .end()
    })
  }

  /** POSTs a multipart upload over plain node:http, written in 256 kB chunks, so the client adds little work of its own to the event loop. */
  function post(bytes: Buffer, name: string, settings: string): Promise<{ status: number; body: string }> {
    return new Promise((resolve, reject) => {
      const boundary = 'trace-upload-boundary'
      const head = Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="settings"\r\n\r\n${settings}\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\n`,
      )
      const tail = Buffer.from(`\r\n--${boundary}--\r\n`)
      const req = httpRequest(`${base}/api/traces`, {
        method: 'POST',
        agent: false,
        headers: { 'Content-Type': `multipart/form-data; boundary=${boundary}`, 'Content-Length': String(head.length + bytes.length + tail.length), Authorization: editor.auth },
      })
      req.on('response', (res) => {
        let body = ''
        res.on('data', (c) => (body += c))
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body }))
      })
      req.on('error', reject)
      const parts: Buffer[] = [head]
      for (let at = 0; at < bytes.length; at += 256 * 1024) parts.push(bytes.subarray(at, at + 256 * 1024))
      parts.push(tail)
      const pump = () => {
        while (parts.length > 0) if (!req.write(parts.shift())) return void req.once('drain', pump)
        req.end()
      }
      pump()
    })
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]

  /** GET /api/health again and again while `work` is under way, with the time each answer took. */
  async function healthDuring<T>(work: Promise<T>): Promise<{ result: T; latenciesMs: number[] }> {
    let done = false
    const latenciesMs: number[] = []
    const probing = (async () => {
      while (!done || latenciesMs.length < 3) {
        const t0 = performance.now()
        expect(await getHealth()).toBe(200)
        if (!done) latenciesMs.push(performance.now() - t0)
        else break
        await new Promise((r) => setTimeout(r, 20))
      }
    })()
    const result = await work.finally(() => (done = true))
    await probing
    return { result, latenciesMs }
  }

  it('refuses a 20 MB one-line file with 422 naming the line-length limit, while GET /api/health answers within 200 ms', async () => {
    const bytes = oneLineCsv(20 * 1024 * 1024)
    const answeredBefore = traceParsePool.answered
    const before = await tracesInGroup(editor.groupId)

    const { result: res, latenciesMs } = await healthDuring(post(bytes, 'one-line.csv', settingsFor(editor.groupId)))

    expect(res.status).toBe(422)
    const body = JSON.parse(res.body) as { error: { code: string; message: string } }
    expect(body.error.code).toBe('unreadable_trace')
    expect(body.error.message).toMatch(/^one-line.csv: Line 1 is longer than 65,536 characters, the line-length limit for trace files/)
    // The parse ran in the parse thread, not on the event loop that answers the health probes.
    expect(traceParsePool.answered).toBe(answeredBefore + 1)
    expect(latenciesMs.length).toBeGreaterThanOrEqual(1)
    expect(median(latenciesMs)).toBeLessThan(200)
    expect(await tracesInGroup(editor.groupId)).toBe(before)
  })

  it('stores a million-row file (≈21 MB) while the event loop keeps ticking', async () => {
    const bytes = scopeCsv(1_000_000)
    // The baseline: how long this file's parse holds the event loop here and now when it runs on it (about
    // a second on an idle machine, several on a loaded one). An upload parsed on the loop stalls at least
    // that long; one parsed in the parse thread only for the scheduling and copying around it.
    const t0 = performance.now()
    buildTrace(parseTraceFile(bytes), TraceImportSettings.parse({ name: 'baseline', signalColumns: [1] }))
    const onLoopMs = performance.now() - t0
    const answeredBefore = traceParsePool.answered
    // A 10 ms timer on the API's event loop: its longest gap is the longest stall.
    const gaps: number[] = []
    let last = performance.now()
    const ticker = setInterval(() => {
      const now = performance.now()
      gaps.push(now - last)
      last = now
    }, 10)

    const { result: res, latenciesMs } = await healthDuring(post(bytes, 'scope.csv', JSON.stringify({ groupId: editor.groupId, name: 'Scope export', timeColumn: 0, signalColumns: [1], signalUnit: 'W' })))
    clearInterval(ticker)

    expect(res.status).toBe(201)
    const trace = TraceDetail.parse(JSON.parse(res.body))
    expect(trace).toMatchObject({ sampleCount: 1_000_000, startNs: 0, settings: { timeUnit: 's' } })
    // The original is stored whole after the parse thread had its copy.
    expect(trace.byteSize).toBe(bytes.length)
    expect(trace.sha256).toBe(createHash('sha256').update(bytes).digest('hex'))
    const stored = await pool.query('select octet_length(original) as n from traces where id = $1', [trace.id])
    expect(Number(stored.rows[0].n)).toBe(bytes.length)
    expect(trace.endNs).toBeCloseTo(99_999.9, 6)
    expect(traceParsePool.answered).toBe(answeredBefore + 1)
    expect(gaps.length).toBeGreaterThan(10)
    expect(Math.max(...gaps)).toBeLessThan(Math.max(500, onLoopMs / 2))
    expect(median(latenciesMs)).toBeLessThan(200)
  })
})

describe('group roles', () => {
  let traceId: string
  beforeAll(async () => {
    traceId = (await upload(editor, corpus('08-no-header.csv'), 'a.csv', settingsFor(editor.groupId, { timeUnit: 'ns', signalUnit: 'arb' }))).body.id
  })

  it('lets a viewer list and read, but not upload (403) or delete (403)', async () => {
    const list = TraceList.parse((await request(app).get('/api/traces').query({ groupId: editor.groupId }).set('Authorization', viewer.auth)).body)
    expect(list.items.map((t) => t.id)).toContain(traceId)
    expect((await request(app).get(`/api/traces/${traceId}`).set('Authorization', viewer.auth)).status).toBe(200)
    expect((await upload(viewer, corpus('08-no-header.csv'), 'b.csv', settingsFor(editor.groupId, { timeUnit: 'ns' }))).status).toBe(403)
    expect((await request(app).delete(`/api/traces/${traceId}`).set('Authorization', viewer.auth)).status).toBe(403)
  })

  it('hides the trace from non-members (404) and from anonymous callers (401)', async () => {
    for (const path of [`/api/traces/${traceId}`, `/api/traces/${traceId}/data`, `/api/traces/${traceId}/original`]) {
      expect((await request(app).get(path).set('Authorization', outsider.auth)).status).toBe(404)
      expect((await request(app).get(path)).status).toBe(401)
    }
    expect((await request(app).get('/api/traces').query({ groupId: editor.groupId }).set('Authorization', outsider.auth)).status).toBe(404)
    expect((await upload(outsider, corpus('08-no-header.csv'), 'c.csv', settingsFor(editor.groupId, { timeUnit: 'ns' }))).status).toBe(404)
    const stranger = await newUser(db, 'Stranger Danger')
    expect((await request(app).delete(`/api/traces/${traceId}`).set('Authorization', stranger.auth)).status).toBe(404)
  })

  it('lets an editor delete; the trace is then gone', async () => {
    expect((await request(app).delete(`/api/traces/${traceId}`).set('Authorization', editor.auth)).status).toBe(204)
    expect((await request(app).get(`/api/traces/${traceId}`).set('Authorization', editor.auth)).status).toBe(404)
  })
})
