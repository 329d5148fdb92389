// One status code per (route, actor). To cover a new module, write a MatrixRowSet beside this file
// (authz-matrix.<module>.ts: its routers, a setup() that adds its resources to the fixture, and its
// rows) and add it to ROW_SETS. Every API route belongs here.
import request from 'supertest'
import { afterAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { stopMailer } from '../../server/modules/mail/mailer'
import { TEST_JWT_SECRET } from './auth-helpers'
import { accountRows } from './authz-matrix.accounts'
import { waveguideRows } from './authz-matrix.waveguides'
import { traceRows } from './authz-matrix.traces'
import { sensingRows } from './authz-matrix.sensing'
import { queueRows } from './authz-matrix.queue'
import { ACTORS, buildFixture, headersFor, type MatrixRowSet } from './authz-matrix.fixture'
import { silentLog, useTestDb } from './helpers'

const ROW_SETS: MatrixRowSet[] = [accountRows, waveguideRows, traceRows, sensingRows, queueRows]

const { db, pool } = useTestDb()
const app = createApp({
  db,
  pool,
  log: silentLog,
  auth: { jwtSecret: TEST_JWT_SECRET },
  routes: ROW_SETS.flatMap((s) => s.routes?.({ db, pool }) ?? []),
})
afterAll(() => stopMailer())

for (const set of ROW_SETS) {
  describe(`authorisation matrix: ${set.name}`, () => {
    for (const row of set.rows) {
      it(row.route, async () => {
        const got: Record<string, number> = {}
        for (const actor of ACTORS) {
          const f = await buildFixture(db, ROW_SETS)
          const req = request(app)[row.method](row.path(f, actor)).set(await headersFor(db, f, actor))
          const res = row.body ? await req.send(row.body(f, actor)) : await req
          got[actor] = res.status
        }
        // Compared whole, so a failure shows every actor's status at once.
        expect(got).toEqual(row.expect)
      })
    }
  })
}
