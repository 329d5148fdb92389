import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { HealthStatus } from '@shared/api/health'
import { createApp } from '../../server/app'
import { createDb, createPool } from '../../server/db/client'
import { APP_VERSION } from '../../server/version'
import { silentLog, testApp } from './helpers'

describe('GET /api/health', () => {
  const app = testApp()

  it('reports the real database up, the queue not configured and the package version', async () => {
    const res = await request(app).get('/api/health')

    expect(res.status).toBe(200)
    expect(HealthStatus.parse(res.body)).toEqual({ ok: true, db: 'ok', queue: 'not-configured', version: APP_VERSION })
    expect(APP_VERSION).toMatch(/^\d+\.\d+\.\d+/)
  })

  it('answers 503 with db down when the database cannot be reached', async () => {
    // Port 1 on loopback: nothing listens there, so the pool's connect is refused.
    const pool = createPool('postgres://postgres@127.0.0.1:1/nothing', { max: 1 })
    const broken = createApp({ pool, db: createDb(pool), log: silentLog })

    const res = await request(broken).get('/api/health')
    await pool.end()

    expect(res.status).toBe(503)
    expect(res.body).toMatchObject({ ok: false, db: 'down', queue: 'not-configured' })
  })

  it('includes a supplied queue check: up, down, or throwing', async () => {
    const up = await request(testApp({ queueCheck: async () => true })).get('/api/health')
    const down = await request(testApp({ queueCheck: async () => false })).get('/api/health')
    const throwing = await request(
      testApp({
        queueCheck: async () => {
          throw new Error('queue schema missing')
        },
      }),
    ).get('/api/health')

    expect([up.status, up.body.queue, up.body.ok]).toEqual([200, 'ok', true])
    expect([down.status, down.body.queue, down.body.ok]).toEqual([503, 'down', false])
    expect([throwing.status, throwing.body.queue]).toEqual([503, 'down'])
  })
})
