import { and, asc, eq, sql } from 'drizzle-orm'
import type { GroupMember } from '@shared/api/groups'
import type { Db } from '../../db/client'
import { memberships, users } from '../../db/schema'
import { AppError, notFound } from '../../errors'
import { requireGroupRole, type Role } from '../../policy/access'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import { notifyRoleChanged } from '../mail/notify-group'

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

const lastOwner = () =>
  new AppError('last_owner', 409, 'A group needs at least one owner: make someone else an owner first')

export async function listMembers(db: Db, auth: AuthContext | undefined, groupId: string): Promise<GroupMember[]> {
  await requireGroupRole(db, auth, groupId, 'viewer', 'Group')
  const rows = await db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.groupId, groupId))
    .orderBy(sql`case ${memberships.role} when 'owner' then 0 when 'editor' then 1 else 2 end`, asc(users.name))
  return rows.map((r) => ({ ...r, joinedAt: r.joinedAt.toISOString() }))
}

/**
 * Locks the group's owner rows for the rest of the transaction, so two owners demoting each other
 * at once cannot leave the group with none.
 */
async function lockOwners(tx: Tx, groupId: string): Promise<string[]> {
  const rows = await tx.execute<{ user_id: string }>(
    sql`select user_id from memberships where group_id = ${groupId} and role = 'owner' for update`,
  )
  return rows.rows.map((r) => r.user_id)
}

async function memberRole(tx: Tx, groupId: string, userId: string): Promise<Role | null> {
  if (!isUuid(userId)) return null
  const [row] = await tx.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.groupId, groupId), eq(memberships.userId, userId)))
  return row?.role ?? null
}

/** Owners change anyone's role, their own included, as long as an owner remains. */
export async function changeRole(db: Db, auth: AuthContext | undefined, groupId: string, userId: string, role: Role): Promise<GroupMember[]> {
  await requireGroupRole(db, auth, groupId, 'owner', 'Group')
  const before = await db.transaction(async (tx) => {
    const owners = await lockOwners(tx, groupId)
    const current = await memberRole(tx, groupId, userId)
    if (!current) throw notFound('Member')
    if (current === 'owner' && role !== 'owner' && owners.length <= 1) throw lastOwner()
    await tx.update(memberships).set({ role }).where(and(eq(memberships.groupId, groupId), eq(memberships.userId, userId)))
    return current
  })
  // The change stands whether or not the notice can be mailed.
  if (before !== role) await notifyRoleChanged(db, { userId, groupId, role, byUserId: auth!.userId }).catch(() => false)
  return listMembers(db, auth, groupId)
}

/** Owners remove members; anyone may remove themselves (leave). The last owner can do neither. */
export async function removeMember(db: Db, auth: AuthContext | undefined, groupId: string, userId: string): Promise<void> {
  const self = auth?.userId === userId
  await requireGroupRole(db, auth, groupId, self ? 'viewer' : 'owner', 'Group')
  await db.transaction(async (tx) => {
    const owners = await lockOwners(tx, groupId)
    const current = await memberRole(tx, groupId, userId)
    if (!current) throw notFound('Member')
    if (current === 'owner' && owners.length <= 1) throw lastOwner()
    await tx.delete(memberships).where(and(eq(memberships.groupId, groupId), eq(memberships.userId, userId)))
  })
}
