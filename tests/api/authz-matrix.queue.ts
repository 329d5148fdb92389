// Authorisation rows for the service view of the job queue: site administrators only, so every actor of the
// matrix (none of them an admin) is refused, signed in with 403 and anonymous with 401. Columns as in
// authz-matrix.accounts.ts; the admin's own 200 is in queue-activity.test.ts.
import { queueRoutes } from '../../server/modules/queue/queue.routes'
import type { MatrixRow, MatrixRowSet } from './authz-matrix.fixture'

const adminsOnly = { anonymous: 401, viewer: 403, editor: 403, owner: 403, otherOwner: 403, bearer: 403 }

const rows: MatrixRow[] = [
  { route: 'GET /api/queue', method: 'get', path: () => '/api/queue', expect: adminsOnly },
  { route: 'GET /api/queue/activity', method: 'get', path: () => '/api/queue/activity', expect: adminsOnly },
]

export const queueRows: MatrixRowSet = { name: 'queue (admins)', routes: ({ pool }) => [['/queue', queueRoutes({ pool })]], rows }
