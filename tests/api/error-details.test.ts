// The error envelope carries what services know beyond the message under `details`, in the shape
// shared/api/api-error.ts declares per code: the reasons of a refused run, where a trace file is broken, a quota.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { Router } from 'express'
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBody, ERROR_DETAILS } from '@shared/api/api-error'
import { createApp } from '../../server/app'
import { AppError } from '../../server/errors'
import { QuotaExceeded } from '../../server/modules/quotas/quota-check'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('error_details'))
let app: ReturnType<typeof createApp>
let editor: Member

function probeRoutes(): Router {
  const r = Router()
  r.get('/quota', () => {
    throw new QuotaExceeded(429, 'quota_runs_in_flight', 'You have 3 runs in flight, the most allowed', { scope: 'user', limit: 3, used: 3, freesAt: new Date('2026-01-02T03:04:05Z') })
  })
  r.get('/fields-only', () => {
    throw new AppError('invalid_input', 400, 'Some fields are not valid', { fields: [{ path: 'lengthM', message: 'must be positive' }] })
  })
  return r
}

beforeAll(async () => {
  const { routes } = await setup
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ['/traces', tracesRoutes({ db })], ['/probe', probeRoutes()]] })
  editor = await newMember(db, 'editor')
})

describe('error details', () => {
  it('sends the reasons of a run over the limits under details, shaped as declared for over_limit', async () => {
    const res = await request(app).post('/api/runs').set('Authorization', editor.auth).send({ groupId: editor.groupId, title: 'too big', config: chipRun(1000, 0.1) })

    expect(res.status).toBe(422)
    const { error } = ApiErrorBody.parse(res.body)
    const details = ERROR_DETAILS.over_limit.parse(error.details)
    expect(details.reasons.join(' ')).toMatch(/over the limit of 2\.00e\+10/)
  })

  it('sends the line of a broken trace file under details.where', async () => {
    const bytes = readFileSync(join(__dirname, '../traces/malformed', 'ragged-rows.csv'))
    const settings = JSON.stringify({ groupId: editor.groupId, name: 'x', timeColumn: 0, timeUnit: 'ns', signalColumns: [1], signalUnit: 'arb' })

    const res = await request(app).post('/api/traces').set('Authorization', editor.auth).attach('file', bytes, 'ragged.csv').field('settings', settings)

    expect(res.status).toBe(422)
    const { error } = ApiErrorBody.parse(res.body)
    // Line 4 of the file has two fields where the others have three.
    expect(ERROR_DETAILS.unreadable_trace.parse(error.details).where.line).toBe(4)
  })

  it('sends a quota with its time as an ISO string', async () => {
    const res = await request(app).get('/api/probe/quota')

    expect(res.status).toBe(429)
    const { error } = ApiErrorBody.parse(res.body)
    expect(ERROR_DETAILS.quota_runs_in_flight.parse(error.details)).toEqual({ quota: { scope: 'user', limit: 3, used: 3, freesAt: '2026-01-02T03:04:05.000Z' } })
  })

  it('keeps fields under fields and sends no empty details', async () => {
    const res = await request(app).get('/api/probe/fields-only')

    expect(res.body.error.fields).toEqual([{ path: 'lengthM', message: 'must be positive' }])
    expect(res.body.error).not.toHaveProperty('details')
  })
})
