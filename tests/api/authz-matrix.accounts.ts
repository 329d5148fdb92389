// Authorisation rows for the accounts routes. Columns: anonymous, viewer, editor, owner (of group
// A), otherOwner (owner of group B only), bearer (an API token of A's owner: owner's rights).
import { uniqueEmail } from './auth-helpers'
import type { MatrixRow, MatrixRowSet } from './authz-matrix.fixture'

const all = (status: number) => ({ anonymous: status, viewer: status, editor: status, owner: status, otherOwner: status, bearer: status })
const signedIn = (status: number) => ({ ...all(status), anonymous: 401 })
/** Group A routes: anonymous 401; outsiders 404 (ids do not leak); members by role. */
const inA = (viewer: number, editor: number, owner: number) => ({ anonymous: 401, viewer, editor, owner, otherOwner: 404, bearer: owner })

const rows: MatrixRow[] = [
  { route: 'GET /api/health', method: 'get', path: () => '/api/health', expect: all(200) },
  { route: 'GET /api/openapi.json', method: 'get', path: () => '/api/openapi.json', expect: all(200) },
  { route: 'GET /api/me', method: 'get', path: () => '/api/me', expect: signedIn(200) },
  { route: 'PATCH /api/me', method: 'patch', path: () => '/api/me', body: () => ({ notifyOnFinish: false }), expect: signedIn(200) },
  // A wrong current password: signed-in callers reach the check (400), anonymous ones do not.
  { route: 'POST /api/me/password', method: 'post', path: () => '/api/me/password', body: () => ({ currentPassword: 'not the password', newPassword: 'a brand new passphrase' }), expect: signedIn(400) },
  { route: 'POST /api/me/email', method: 'post', path: () => '/api/me/email', body: () => ({ currentPassword: 'not the password', newEmail: uniqueEmail('moved') }), expect: signedIn(400) },
  { route: 'POST /api/auth/sign-out', method: 'post', path: () => '/api/auth/sign-out', expect: all(204) },
  { route: 'POST /api/auth/resend-confirmation', method: 'post', path: () => '/api/auth/resend-confirmation', expect: signedIn(202) },

  { route: 'GET /api/groups', method: 'get', path: () => '/api/groups', expect: signedIn(200) },
  { route: 'POST /api/groups', method: 'post', path: () => '/api/groups', body: () => ({ name: 'Matrix spin-off' }), expect: signedIn(201) },
  { route: 'GET /api/groups/:id', method: 'get', path: (f) => `/api/groups/${f.groupA}`, expect: inA(200, 200, 200) },
  { route: 'PATCH /api/groups/:id', method: 'patch', path: (f) => `/api/groups/${f.groupA}`, body: () => ({ name: 'Renamed' }), expect: inA(403, 403, 200) },
  { route: 'GET /api/groups/:id/members', method: 'get', path: (f) => `/api/groups/${f.groupA}/members`, expect: inA(200, 200, 200) },
  {
    route: 'PATCH /api/groups/:id/members/:userId',
    method: 'patch',
    path: (f) => `/api/groups/${f.groupA}/members/${f.users.extra.id}`,
    body: () => ({ role: 'editor' }),
    expect: inA(403, 403, 200),
  },
  { route: 'DELETE /api/groups/:id/members/:userId (someone else)', method: 'delete', path: (f) => `/api/groups/${f.groupA}/members/${f.users.extra.id}`, expect: inA(403, 403, 204) },
  {
    route: 'DELETE /api/groups/:id/members/:userId (oneself: leave)',
    method: 'delete',
    path: (f, actor) => {
      const self = actor === 'anonymous' ? f.users.viewer : actor === 'bearer' ? f.users.owner : f.users[actor]
      return `/api/groups/${f.groupA}/members/${self.id}`
    },
    // The sole owner may not leave (409); otherOwner is not a member of A (404).
    expect: inA(204, 204, 409),
  },
  { route: 'GET /api/groups/:id/invitations', method: 'get', path: (f) => `/api/groups/${f.groupA}/invitations`, expect: inA(403, 403, 200) },
  {
    route: 'POST /api/groups/:id/invitations',
    method: 'post',
    path: (f) => `/api/groups/${f.groupA}/invitations`,
    body: () => ({ email: uniqueEmail('m-new'), role: 'viewer' }),
    expect: inA(403, 403, 201),
  },
  { route: 'DELETE /api/groups/:id/invitations/:invId', method: 'delete', path: (f) => `/api/groups/${f.groupA}/invitations/${f.invitation.id}`, expect: inA(403, 403, 204) },
  { route: 'POST /api/invitations/preview', method: 'post', path: () => '/api/invitations/preview', body: (f) => ({ token: f.invitation.token }), expect: all(200) },
  // Sent to an address none of the actors has.
  { route: 'POST /api/invitations/accept', method: 'post', path: () => '/api/invitations/accept', body: (f) => ({ token: f.invitation.token }), expect: signedIn(403) },

  { route: 'GET /api/tokens', method: 'get', path: () => '/api/tokens', expect: signedIn(200) },
  { route: 'POST /api/tokens', method: 'post', path: () => '/api/tokens', body: () => ({ name: 'matrix' }), expect: signedIn(201) },
  // Only the token's own user may revoke it; for anyone else it does not exist.
  { route: 'DELETE /api/tokens/:id', method: 'delete', path: (f) => `/api/tokens/${f.ownerToken.id}`, expect: { anonymous: 401, viewer: 404, editor: 404, owner: 204, otherOwner: 404, bearer: 204 } },

  { route: 'POST /api/shares', method: 'post', path: () => '/api/shares', body: (f) => ({ resourceType: 'matrix-probe', resourceId: f.probeId }), expect: inA(403, 201, 201) },
  { route: 'GET /api/shares', method: 'get', path: (f) => `/api/shares?resourceType=matrix-probe&resourceId=${f.probeId}`, expect: inA(200, 200, 200) },
  { route: 'DELETE /api/shares/:id', method: 'delete', path: (f) => `/api/shares/${f.share.id}`, expect: inA(403, 200, 200) },

  { route: 'GET /api/admin/users', method: 'get', path: () => '/api/admin/users', expect: { ...signedIn(403) } },
  { route: 'PATCH /api/admin/users/:id', method: 'patch', path: (f) => `/api/admin/users/${f.users.extra.id}`, body: () => ({ isAdmin: true }), expect: signedIn(403) },
  // Held mail carries one-time links: site admins only, in every mode.
  { route: 'GET /api/admin/held-mail', method: 'get', path: () => '/api/admin/held-mail', expect: signedIn(403) },
  { route: 'DELETE /api/admin/held-mail', method: 'delete', path: () => '/api/admin/held-mail', expect: signedIn(403) },
]

export const accountRows: MatrixRowSet = { name: 'accounts', rows }
