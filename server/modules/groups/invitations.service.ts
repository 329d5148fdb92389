import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm'
import type { InvitationPreview, InvitationSummary, InviteBody } from '@shared/api/groups'
import type { Db } from '../../db/client'
import { groups, invitations, memberships, users, type Invitation } from '../../db/schema'
import { AppError, conflict, forbidden, notFound } from '../../errors'
import type { Logger } from '../../logger'
import { requireGroupRole, type Role } from '../../policy/access'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import { INVITATION_TTL_MS } from '../auth/auth-options'
import { hashSecretToken, newSecretToken } from '../auth/secret-token'
import { markEmailConfirmed } from '../auth/users.repo'
import { sendMail } from '../mail/mailer'
import { invitationMail } from '../mail/templates'

export const ACCEPT_INVITE_PATH = '/accept-invite'

const pending = () => and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, sql`now()`))
const badInvitation = () => new AppError('invalid_invitation', 404, 'This invitation is not valid any more: it was used, withdrawn or has expired')

function toSummary(i: Invitation): InvitationSummary {
  return { id: i.id, email: i.email, role: i.role, createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() }
}

/**
 * Owners invite an address with a role; the mailed link is the only copy of the token. A newer
 * invitation to the same address replaces any pending one.
 */
export async function invite(
  db: Db,
  log: Logger,
  auth: AuthContext | undefined,
  groupId: string,
  body: InviteBody,
  linkTo: (path: string, token: string) => string,
): Promise<InvitationSummary & { mailed: boolean }> {
  await requireGroupRole(db, auth, groupId, 'owner', 'Group')
  const [member] = await db
    .select({ id: users.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.groupId, groupId), sql`lower(${users.email}) = lower(${body.email})`))
  if (member) throw conflict('That address already belongs to a member of this group')

  const { token, hash } = newSecretToken('inv_')
  const invitation = await db.transaction(async (tx) => {
    await tx
      .update(invitations)
      .set({ revokedAt: sql`now()` })
      .where(and(eq(invitations.groupId, groupId), sql`lower(${invitations.email}) = lower(${body.email})`, pending()))
    const [row] = await tx
      .insert(invitations)
      .values({ groupId, email: body.email, role: body.role, tokenHash: hash, invitedBy: auth!.userId, expiresAt: new Date(Date.now() + INVITATION_TTL_MS) })
      .returning()
    return row
  })

  const [group] = await db.select({ name: groups.name }).from(groups).where(eq(groups.id, groupId))
  const [inviter] = await db.select({ name: users.name }).from(users).where(eq(users.id, auth!.userId))
  let mailed = true
  try {
    await sendMail(invitationMail(body.email, { groupName: group.name, role: body.role, inviter: inviter?.name ?? 'A colleague', link: linkTo(ACCEPT_INVITE_PATH, token) }))
  } catch (err) {
    mailed = false
    log.error({ err }, 'sending an invitation failed')
  }
  return { ...toSummary(invitation), mailed }
}

export async function listPendingInvitations(db: Db, auth: AuthContext | undefined, groupId: string): Promise<InvitationSummary[]> {
  await requireGroupRole(db, auth, groupId, 'owner', 'Group')
  const rows = await db.select().from(invitations).where(and(eq(invitations.groupId, groupId), pending())).orderBy(desc(invitations.createdAt))
  return rows.map(toSummary)
}

export async function withdrawInvitation(db: Db, auth: AuthContext | undefined, groupId: string, invitationId: string): Promise<void> {
  await requireGroupRole(db, auth, groupId, 'owner', 'Group')
  if (!isUuid(invitationId)) throw notFound('Invitation')
  const [row] = await db
    .update(invitations)
    .set({ revokedAt: sql`coalesce(${invitations.revokedAt}, now())` })
    .where(and(eq(invitations.id, invitationId), eq(invitations.groupId, groupId)))
    .returning({ id: invitations.id })
  if (!row) throw notFound('Invitation')
}

async function findPending(db: Db, token: string): Promise<Invitation | null> {
  const [row] = await db.select().from(invitations).where(and(eq(invitations.tokenHash, hashSecretToken(token)), pending()))
  return row ?? null
}

/** What the accept page shows; anyone holding the link may see it. */
export async function previewInvitation(db: Db, token: string): Promise<InvitationPreview> {
  const inv = await findPending(db, token)
  if (!inv) throw badInvitation()
  const [group] = await db.select({ name: groups.name }).from(groups).where(eq(groups.id, inv.groupId))
  const [inviter] = inv.invitedBy ? await db.select({ name: users.name }).from(users).where(eq(users.id, inv.invitedBy)) : []
  return { groupName: group.name, role: inv.role, email: inv.email, expiresAt: inv.expiresAt.toISOString(), invitedBy: inviter?.name ?? null }
}

/**
 * Joins the group. Only the invited address may accept (sign in as it first). Someone already a
 * member keeps their role: an invitation never demotes.
 */
export async function acceptInvitation(db: Db, auth: AuthContext, token: string): Promise<{ groupId: string; role: Role }> {
  const inv = await findPending(db, token)
  if (!inv) throw badInvitation()
  if (inv.email.toLowerCase() !== auth.email.toLowerCase()) {
    throw forbidden(`This invitation was sent to ${inv.email}; sign in with that address to accept it`)
  }
  return db.transaction(async (tx) => {
    const [claimed] = await tx
      .update(invitations)
      .set({ acceptedAt: sql`now()`, acceptedBy: auth.userId })
      .where(and(eq(invitations.id, inv.id), pending()))
      .returning({ id: invitations.id })
    if (!claimed) throw badInvitation()
    await tx.insert(memberships).values({ groupId: inv.groupId, userId: auth.userId, role: inv.role }).onConflictDoNothing()
    const [m] = await tx.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.groupId, inv.groupId), eq(memberships.userId, auth.userId)))
    // The link arrived in that mailbox: the address is proven.
    await markEmailConfirmed(tx as unknown as Db, auth.userId)
    return { groupId: inv.groupId, role: m.role }
  })
}

/**
 * Whether `token` is a pending invitation sent to `email`: the holder of the link read that mailbox,
 * so an account signed up with it through the link needs no separate confirmation.
 */
export async function invitationProvesAddress(db: Db, token: string, email: string): Promise<boolean> {
  const inv = await findPending(db, token)
  return inv !== null && inv.email.trim().toLowerCase() === email.trim().toLowerCase()
}
