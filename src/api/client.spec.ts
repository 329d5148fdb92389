// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { api, ApiError, apiRequest } from './client'
import { fakeFetch } from '@/test-utils/mount'

afterEach(() => vi.unstubAllGlobals())

describe('apiRequest', () => {
  it('turns the error envelope of a 400 into an ApiError with code, status, message and field paths', async () => {
    const { fn } = fakeFetch({
      'POST /api/runs': {
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Some fields are invalid.',
            fields: [{ path: 'pump.peakPowerW', message: 'Must be positive' }],
            requestId: 'req-7',
          },
        },
      },
    })
    vi.stubGlobal('fetch', fn)

    const err = await api.post('/runs', { pump: { peakPowerW: -1 } }).catch((e: unknown) => e)

    expect(err).toBeInstanceOf(ApiError)
    const e = err as ApiError
    expect(e.status).toBe(400)
    expect(e.code).toBe('validation_failed')
    expect(e.message).toBe('Some fields are invalid.')
    expect(e.fields).toEqual([{ path: 'pump.peakPowerW', message: 'Must be positive' }])
    expect(e.fieldMessage('pump.peakPowerW')).toBe('Must be positive')
    expect(e.fieldMessage('stokes.peakPowerW')).toBeUndefined()
    expect(e.requestId).toBe('req-7')
  })

  it('marks a 401 as unauthenticated', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/me': { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first.' } } } }).fn)

    const e = (await api.get('/me').catch((x: unknown) => x)) as ApiError

    expect(e.isUnauthenticated).toBe(true)
    expect(e.message).toBe('Sign in first.')
    expect(e.fields).toEqual([])
  })

  it('gives a readable error when a failure carries no envelope (e.g. an HTML 502 from a proxy)', async () => {
    vi.stubGlobal('fetch', async () => new Response('<html>Bad gateway</html>', { status: 502 }))

    const e = (await api.get('/health').catch((x: unknown) => x)) as ApiError

    expect(e).toBeInstanceOf(ApiError)
    expect(e.status).toBe(502)
    expect(e.code).toBe('http_502')
    expect(e.message).toMatch(/not reachable/)
  })

  it('reports a network failure as status 0, code "network"', async () => {
    vi.stubGlobal('fetch', async () => {
      throw new TypeError('Failed to fetch')
    })

    const e = (await api.get('/health').catch((x: unknown) => x)) as ApiError

    expect(e.status).toBe(0)
    expect(e.code).toBe('network')
    expect(e.message).toContain('Failed to fetch')
  })

  it('sends JSON to the same origin with credentials and query parameters', async () => {
    const { fn, calls } = fakeFetch({ 'POST /api/runs': { status: 201, body: { id: 'r1' } } })
    vi.stubGlobal('fetch', fn)

    const out = await apiRequest('/runs', { method: 'POST', body: { title: 'Store and retrieve' }, query: { dryRun: true, skip: undefined } })

    expect(out).toEqual({ id: 'r1' })
    expect(calls[0]!.url).toBe('/api/runs?dryRun=true')
    expect(calls[0]!.init?.credentials).toBe('include')
    expect((calls[0]!.init?.headers as Record<string, string>)['Content-Type']).toBe('application/json')
    expect(calls[0]!.init?.body).toBe('{"title":"Store and retrieve"}')
  })

  it('rejects a response that does not match the schema with code "bad_response"', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { body: { ok: 'yes' } } }).fn)

    const e = (await api.get('/health', { schema: z.object({ ok: z.boolean() }) }).catch((x: unknown) => x)) as ApiError

    expect(e.code).toBe('bad_response')
  })

  it('treats a status listed in acceptStatus as an answer, not an error', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { status: 503, body: { ok: false } } }).fn)

    await expect(api.get('/health', { acceptStatus: [503] })).resolves.toEqual({ ok: false })
  })
})
