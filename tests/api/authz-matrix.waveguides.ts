// Authorisation rows for a group's saved waveguides. Columns as in authz-matrix.accounts.ts: anonymous,
// viewer, editor, owner (of group A), otherOwner (owner of group B only), bearer (an API token of A's owner).
import { WAVEGUIDE_PRESETS } from '@shared/physics/waveguide-presets'
import { Waveguide } from '@shared/physics/waveguide'
import { waveguides } from '../../server/db/schema'
import { waveguidesRoutes } from '../../server/modules/waveguides/waveguides.routes'
import type { MatrixRow, MatrixRowSet } from './authz-matrix.fixture'

/** Group A routes: anonymous 401; outsiders 404 (ids do not leak); members by role. */
const inA = (viewer: number, editor: number, owner: number) => ({ anonymous: 401, viewer, editor, owner, otherOwner: 404, bearer: owner })

const base = WAVEGUIDE_PRESETS[0].waveguide
// A name per actor, so no cell's answer depends on a clash with the fixture's own waveguide.
const wg = (name: string) => ({ ...base, name })

const rows: MatrixRow[] = [
  { route: 'GET /api/waveguides?groupId', method: 'get', path: (f) => `/api/waveguides?groupId=${f.groupA}`, expect: inA(200, 200, 200) },
  {
    route: 'POST /api/waveguides',
    method: 'post',
    path: () => '/api/waveguides',
    body: (f, actor) => ({ groupId: f.groupA, waveguide: wg(`Matrix new ${actor}`) }),
    expect: inA(403, 201, 201),
  },
  { route: 'GET /api/waveguides/:id', method: 'get', path: (f) => `/api/waveguides/${f.extra.waveguideId}`, expect: inA(200, 200, 200) },
  {
    route: 'PUT /api/waveguides/:id',
    method: 'put',
    path: (f) => `/api/waveguides/${f.extra.waveguideId}`,
    body: (_f, actor) => ({ waveguide: wg(`Matrix renamed ${actor}`) }),
    expect: inA(403, 200, 200),
  },
  { route: 'DELETE /api/waveguides/:id', method: 'delete', path: (f) => `/api/waveguides/${f.extra.waveguideId}`, expect: inA(403, 204, 204) },
  { route: 'POST /api/waveguides/:id/duplicate', method: 'post', path: (f) => `/api/waveguides/${f.extra.waveguideId}/duplicate`, expect: inA(403, 201, 201) },
]

export const waveguideRows: MatrixRowSet = {
  name: 'waveguides',
  routes: ({ db }) => [['/waveguides', waveguidesRoutes({ db })]],
  setup: async (db, f) => {
    const [row] = await db
      .insert(waveguides)
      .values({ groupId: f.groupA, name: 'Matrix spool', params: Waveguide.parse(wg('Matrix spool')), createdBy: f.users.owner.id })
      .returning({ id: waveguides.id })
    return { waveguideId: row.id }
  },
  rows,
}
