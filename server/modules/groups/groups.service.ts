import { randomBytes } from 'node:crypto'
import { and, asc, eq } from 'drizzle-orm'
import type { GroupSummary } from '@shared/api/groups'
import type { Db } from '../../db/client'
import { groups, memberships } from '../../db/schema'
import { notFound } from '../../errors'
import { requireGroupRole, type Role } from '../../policy/access'
import type { AuthContext } from '../auth/auth-context'

function slugOf(name: string): string {
  const base = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40)
  return base || 'group'
}

function toSummary(g: { id: string; name: string; slug: string; createdAt: Date }, role: Role): GroupSummary {
  return { id: g.id, name: g.name, slug: g.slug, role, createdAt: g.createdAt.toISOString() }
}

/** A new group with its creator as the only owner. */
export async function createGroup(db: Db, auth: AuthContext, name: string): Promise<GroupSummary> {
  return db.transaction(async (tx) => {
    let group: typeof groups.$inferSelect | undefined
    // Names repeat across institutions; the slug gets a short random tail when the plain one is taken.
    for (let attempt = 0; !group && attempt < 5; attempt++) {
      const slug = attempt === 0 ? slugOf(name) : `${slugOf(name)}-${randomBytes(3).toString('hex')}`
      ;[group] = await tx.insert(groups).values({ name, slug }).onConflictDoNothing({ target: groups.slug }).returning()
    }
    if (!group) throw new Error('could not find a free slug for the group')
    await tx.insert(memberships).values({ groupId: group.id, userId: auth.userId, role: 'owner' })
    return toSummary(group, 'owner')
  })
}

export async function listMyGroups(db: Db, userId: string): Promise<GroupSummary[]> {
  const rows = await db
    .select({ group: groups, role: memberships.role })
    .from(memberships)
    .innerJoin(groups, eq(groups.id, memberships.groupId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(groups.name))
  return rows.map((r) => toSummary(r.group, r.role))
}

export async function getGroup(db: Db, auth: AuthContext | undefined, groupId: string): Promise<GroupSummary> {
  const role = await requireGroupRole(db, auth, groupId, 'viewer', 'Group')
  const [group] = await db.select().from(groups).where(eq(groups.id, groupId))
  if (!group) throw notFound('Group')
  return toSummary(group, role)
}

export async function renameGroup(db: Db, auth: AuthContext | undefined, groupId: string, name: string): Promise<GroupSummary> {
  const role = await requireGroupRole(db, auth, groupId, 'owner', 'Group')
  const [group] = await db.update(groups).set({ name }).where(and(eq(groups.id, groupId))).returning()
  return toSummary(group, role)
}
