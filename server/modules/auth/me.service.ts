import { asc, eq } from 'drizzle-orm'
import type { MeResponse, UpdateMeBody } from '@shared/api/auth'
import type { Db } from '../../db/client'
import { groups, memberships, type User } from '../../db/schema'
import { notFound } from '../../errors'
import type { AuthContext } from './auth-context'
import { findUserById, updateUser } from './users.repo'

export function toMeUser(user: User): MeResponse['user'] {
  return {
    id: user.id,
    email: user.email,
    displayName: user.name,
    isAdmin: user.isAdmin,
    emailConfirmed: user.emailConfirmedAt !== null,
    notifyOnFinish: user.notifyOnFinish,
    notifyOnSweepFinish: user.notifyOnSweepFinish,
    notifyOnGroupChange: user.notifyOnGroupChange,
  }
}

export async function loadMe(db: Db, auth: AuthContext): Promise<MeResponse> {
  const user = await findUserById(db, auth.userId)
  if (!user) throw notFound('User')
  const rows = await db
    .select({ groupId: groups.id, groupName: groups.name, groupSlug: groups.slug, role: memberships.role })
    .from(memberships)
    .innerJoin(groups, eq(groups.id, memberships.groupId))
    .where(eq(memberships.userId, user.id))
    .orderBy(asc(groups.name))
  return { user: toMeUser(user), memberships: rows, currentGroupId: rows[0]?.groupId ?? null, via: auth.via }
}

export async function updateMe(db: Db, auth: AuthContext, body: UpdateMeBody): Promise<MeResponse> {
  await updateUser(db, auth.userId, body)
  return loadMe(db, auth)
}
