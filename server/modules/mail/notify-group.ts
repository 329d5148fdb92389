import { eq } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { groups, users } from '../../db/schema'
import { isUuid } from '../../policy/ids'
import { absoluteLink, configuredOrigin } from './mail-links'
import { sendMail } from './mailer'
import { ACCOUNT_PATH } from './notify'
import { roleChangedMail } from './templates'

/**
 * Tells a member that an owner changed their role, unless their setting for group mail is off.
 * Invitations are not covered: their mailed link is the only way to accept, so they always go out.
 */
export async function notifyRoleChanged(db: Db, o: { userId: string; groupId: string; role: string; byUserId: string }, origin = configuredOrigin()): Promise<boolean> {
  if (!isUuid(o.userId) || o.userId === o.byUserId) return false
  const [user] = await db.select({ email: users.email, wants: users.notifyOnGroupChange }).from(users).where(eq(users.id, o.userId))
  if (!user?.wants) return false
  const [group] = await db.select({ name: groups.name }).from(groups).where(eq(groups.id, o.groupId))
  const [by] = await db.select({ name: users.name }).from(users).where(eq(users.id, o.byUserId))
  await sendMail(
    roleChangedMail(user.email, { groupName: group?.name ?? 'a group', role: o.role, by: by?.name ?? 'An owner', groupUrl: absoluteLink('/group', origin), settingsUrl: absoluteLink(ACCOUNT_PATH, origin) }),
  )
  return true
}
