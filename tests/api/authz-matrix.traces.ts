// Authorisation rows for measured traces (columns as in authz-matrix.accounts.ts). Uploads are multipart
// and covered in traces.test.ts; fits, which need the queue, in fits.test.ts.
import { traces } from '../../server/db/schema'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import type { MatrixRow, MatrixRowSet } from './authz-matrix.fixture'

/** Group A routes: anonymous 401; outsiders 404 (ids do not leak); members by role. */
const inA = (viewer: number, editor: number, owner: number) => ({ anonymous: 401, viewer, editor, owner, otherOwner: 404, bearer: owner })

const rows: MatrixRow[] = [
  { route: 'GET /api/traces?groupId', method: 'get', path: (f) => `/api/traces?groupId=${f.groupA}`, expect: inA(200, 200, 200) },
  { route: 'GET /api/traces/:id', method: 'get', path: (f) => `/api/traces/${f.extra.traceId}`, expect: inA(200, 200, 200) },
  { route: 'GET /api/traces/:id/data', method: 'get', path: (f) => `/api/traces/${f.extra.traceId}/data`, expect: inA(200, 200, 200) },
  { route: 'GET /api/traces/:id/original', method: 'get', path: (f) => `/api/traces/${f.extra.traceId}/original`, expect: inA(200, 200, 200) },
  { route: 'DELETE /api/traces/:id', method: 'delete', path: (f) => `/api/traces/${f.extra.traceId}`, expect: inA(403, 204, 204) },
]

const f64 = (values: number[]) => Buffer.from(Float64Array.from(values).buffer)

export const traceRows: MatrixRowSet = {
  name: 'traces',
  routes: ({ db }) => [['/traces', tracesRoutes({ db })]],
  setup: async (db, f) => {
    const [row] = await db
      .insert(traces)
      .values({
        groupId: f.groupA,
        authorId: f.users.editor.id,
        name: 'Matrix trace',
        fileName: 'matrix.csv',
        contentType: 'text/csv',
        byteSize: 12,
        sha256: '0'.repeat(64),
        format: 'delimited',
        original: Buffer.from('0,1\n1,2\n2,3\n'),
        settings: { name: 'Matrix trace', notes: '', delimiter: 'auto', decimalSeparator: 'auto', timeColumn: 0, timeUnit: 'ns', signalColumns: [1], signalUnit: 'arb', baseline: null },
        columns: [
          { index: 0, name: 'Column 1', unitHint: null },
          { index: 1, name: 'Column 2', unitHint: null },
        ],
        signals: [{ column: 1, label: 'Column 2', unit: 'arb', baseline: 0, peak: 3 }],
        sampleCount: 3,
        startNs: 0,
        endNs: 2,
        timeNs: f64([0, 1, 2]),
        signalData: f64([1, 2, 3]),
      })
      .returning({ id: traces.id })
    return { traceId: row.id }
  },
  rows,
}
