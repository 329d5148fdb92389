import { and, eq } from 'drizzle-orm'
import type { Db } from '../db/client'
import { memberships } from '../db/schema'
import { notFound, forbidden, unauthorized } from '../errors'
import type { AuthContext } from '../modules/auth/auth-context'
import { isUuid } from './ids'

export type Role = 'owner' | 'editor' | 'viewer'

const RANK: Record<Role, number> = { viewer: 1, editor: 2, owner: 3 }

/** owner > editor > viewer: may someone with `role` do what needs `minRole`? */
export function roleAtLeast(role: Role, minRole: Role): boolean {
  return RANK[role] >= RANK[minRole]
}

/** The user's role in the group, or null when not a member (or the id is malformed). */
export async function groupRoleOf(db: Db, userId: string, groupId: string): Promise<Role | null> {
  if (!isUuid(userId) || !isUuid(groupId)) return null
  const [row] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.groupId, groupId)))
  return row?.role ?? null
}

/**
 * The one authorisation check for group-owned things. Callers derive groupId from the resource
 * (never from the client). Not a member → 404, so ids of other groups' things do not leak;
 * a member below minRole → 403; nobody signed in → 401.
 */
export async function requireGroupRole(db: Db, auth: AuthContext | undefined, groupId: string, minRole: Role, what = 'Resource'): Promise<Role> {
  if (!auth) throw unauthorized()
  const role = await groupRoleOf(db, auth.userId, groupId)
  if (!role) throw notFound(what)
  if (!roleAtLeast(role, minRole)) throw forbidden(`This needs the ${minRole} role in the group; you are ${role === 'editor' ? 'an' : 'a'} ${role}`)
  return role
}
