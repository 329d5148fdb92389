// Authorisation rows for the sensing map of a sweep (read rule of the sweep: group role or share link). Columns
// as in authz-matrix.accounts.ts. The fixture's sweep is a detuning scan with no finished point yet, so a caller
// who passes the read check gets the 422 that says so, and one who does not gets 401 or 404.
import { sweepsRoutes } from '../../server/modules/sweeps/sweeps.routes'
import { insertSweep } from '../../server/modules/sweeps/sweeps.repo'
import { sensingConfig } from '../solver/sensing-fixtures'
import { silentLog } from './helpers'
import type { MatrixRow, MatrixRowSet } from './authz-matrix.fixture'

const inA = (member: number) => ({ anonymous: 401, viewer: member, editor: member, owner: member, otherOwner: 404, bearer: member })

const rows: MatrixRow[] = [{ route: 'GET /api/sweeps/:id/sensing-map', method: 'get', path: (f) => `/api/sweeps/${f.extra.sensingSweepId}/sensing-map`, expect: inA(422) }]

const base = sensingConfig({ lengthM: 20, pumpFwhmNs: 20, pumpPowerW: 0.1, probePowerW: 1e-4, segments: [] }, 0)
const estimate = { points: 0, cellUpdates: 0, expectedSeconds: 0, maxMemoryBytes: 0 }

export const sensingRows: MatrixRowSet = {
  name: 'sensing maps',
  // The read route needs neither the queue nor the feeder.
  routes: ({ db, pool }) => [['/sweeps', sweepsRoutes({ db, pool, log: silentLog, boss: null as never, feeder: { poke: () => undefined } })]],
  setup: async (_db, f) => {
    const id = await insertSweep(
      // insertSweep takes the pool; the fixture's db shares it.
      (_db as unknown as { $client: Parameters<typeof insertSweep>[0] }).$client,
      { groupId: f.groupA, authorId: f.users.owner.id, title: 'Matrix scan', notes: '', baseConfig: base, axes: [{ field: 'detuningMHz', values: { kind: 'linear', start: -40, stop: 40, count: 5 } }], extendWindow: true, estimate } as Parameters<typeof insertSweep>[1],
      [],
    )
    return { sensingSweepId: id }
  },
  rows,
}
