import { eq } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { users } from '../../db/schema'
import { isUuid } from '../../policy/ids'
import { sendMail } from './mailer'
import { runFinishedMail } from './templates'

export interface FinishedNotice {
  /** "Run 'SMF-28 pump sweep' succeeded" or the like. */
  title: string
  /** Where to look at it; a path (/runs/…) is made absolute with PUBLIC_URL when that is set. */
  url: string
  /** One or two sentences: status, duration, headline figure. */
  summary: string
}

/**
 * Mails the user that their run or sweep finished, unless they opted out (users.notify_on_finish).
 * Returns whether a mail was sent. Mail trouble is the caller's to log; it must never fail a run.
 */
export async function notifyRunFinished(db: Db, userId: string, notice: FinishedNotice): Promise<boolean> {
  if (!isUuid(userId)) return false
  const [user] = await db.select({ email: users.email, notify: users.notifyOnFinish }).from(users).where(eq(users.id, userId))
  if (!user || !user.notify) return false
  const base = process.env.PUBLIC_URL?.replace(/\/+$/, '') ?? ''
  const url = /^https?:\/\//.test(notice.url) ? notice.url : `${base}${notice.url}`
  await sendMail(runFinishedMail(user.email, { ...notice, url }))
  return true
}
