// The world every cell of the authorisation matrix starts from, built fresh per cell so a DELETE
// in one cell cannot change the answer of the next.
import { randomUUID } from 'node:crypto'
import type { Router } from 'express'
import type { Db, Pool } from '../../server/db/client'
import { invitations, shareLinks } from '../../server/db/schema'
import { newSecretToken } from '../../server/modules/auth/secret-token'
import { registerShareable } from '../../server/modules/shares'
import { addMember, apiToken, createGroup, createUser, sessionCookie, uniqueEmail, type TestUser } from './auth-helpers'

export const ACTORS = ['anonymous', 'viewer', 'editor', 'owner', 'otherOwner', 'bearer'] as const
export type Actor = (typeof ACTORS)[number]

export interface Fixture {
  /** The group under test: owner, editor, viewer, plus `extra` (a second viewer to act upon). */
  groupA: string
  /** Another group, owned by otherOwner, who has no role in A. */
  groupB: string
  users: { owner: TestUser; editor: TestUser; viewer: TestUser; otherOwner: TestUser; extra: TestUser }
  /** An API token of A's owner: the `bearer` actor. */
  ownerToken: { id: string; token: string }
  invitation: { id: string; token: string }
  /** A resource of type 'matrix-probe' in group A and a live share link to it. */
  probeId: string
  share: { id: string; token: string }
  /** Whatever a row set's setup() adds (run ids and the like). */
  extra: Record<string, string>
}

/** The user id an actor stands for (anonymous: none). */
export function actorUserId(f: Fixture, actor: Actor): string | undefined {
  if (actor === 'anonymous') return undefined
  if (actor === 'bearer') return f.users.owner.id
  return f.users[actor].id
}

export interface MatrixRow {
  /** Shown in the test name, e.g. 'PATCH /api/groups/:id'. */
  route: string
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  path: (f: Fixture, actor: Actor) => string
  body?: (f: Fixture, actor: Actor) => object
  expect: Record<Actor, number>
}

/** A module's rows, with the routers it needs mounted and the rows it adds to the fixture. */
export interface MatrixRowSet {
  name: string
  routes?: (deps: { db: Db; pool: Pool }) => Array<[string, Router]>
  setup?: (db: Db, f: Fixture) => Promise<Record<string, string>>
  rows: MatrixRow[]
}

// Resources of this type live in memory: id → group.
const probes = new Map<string, string>()
registerShareable('matrix-probe', { groupOf: async (_db, id) => probes.get(id) ?? null })

export async function buildFixture(db: Db, sets: MatrixRowSet[]): Promise<Fixture> {
  const [groupA, groupB] = [await createGroup(db, 'Matrix group A'), await createGroup(db, 'Matrix group B')]
  const users = {
    owner: await createUser(db, { email: uniqueEmail('m-owner') }),
    editor: await createUser(db, { email: uniqueEmail('m-editor') }),
    viewer: await createUser(db, { email: uniqueEmail('m-viewer') }),
    otherOwner: await createUser(db, { email: uniqueEmail('m-other') }),
    extra: await createUser(db, { email: uniqueEmail('m-extra') }),
  }
  await addMember(db, groupA, users.owner.id, 'owner')
  await addMember(db, groupA, users.editor.id, 'editor')
  await addMember(db, groupA, users.viewer.id, 'viewer')
  await addMember(db, groupA, users.extra.id, 'viewer')
  await addMember(db, groupB, users.otherOwner.id, 'owner')

  const inv = newSecretToken('inv_')
  const [invitation] = await db
    .insert(invitations)
    .values({ groupId: groupA, email: uniqueEmail('m-invitee'), role: 'viewer', tokenHash: inv.hash, invitedBy: users.owner.id, expiresAt: new Date(Date.now() + 3600_000) })
    .returning({ id: invitations.id })

  const probeId = randomUUID()
  probes.set(probeId, groupA)
  const sh = newSecretToken('shr_')
  const [share] = await db
    .insert(shareLinks)
    .values({ resourceType: 'matrix-probe', resourceId: probeId, groupId: groupA, tokenHash: sh.hash, createdBy: users.owner.id })
    .returning({ id: shareLinks.id })

  const f: Fixture = {
    groupA,
    groupB,
    users,
    ownerToken: await apiToken(db, users.owner.id),
    invitation: { id: invitation.id, token: inv.token },
    probeId,
    share: { id: share.id, token: sh.token },
    extra: {},
  }
  for (const set of sets) if (set.setup) Object.assign(f.extra, await set.setup(db, f))
  return f
}

/** Request headers for an actor: a fresh session cookie, a Bearer token, or nothing. */
export async function headersFor(db: Db, f: Fixture, actor: Actor): Promise<Record<string, string>> {
  if (actor === 'anonymous') return {}
  if (actor === 'bearer') return { Authorization: `Bearer ${f.ownerToken.token}` }
  return { Cookie: await sessionCookie(db, f.users[actor].id) }
}
