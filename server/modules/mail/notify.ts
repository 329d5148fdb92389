import { eq } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { users } from '../../db/schema'
import { isUuid } from '../../policy/ids'
import { absoluteLink, configuredOrigin } from './mail-links'
import { sendMail } from './mailer'
import { runFinishedMail } from './templates'

export interface FinishedNotice {
  /** "Run 'SMF-28 pump sweep' succeeded" or the like. */
  title: string
  /** Where to look at it; a path (/runs/…) is made absolute (PUBLIC_URL, else the configured host). */
  url: string
  /** The body: status, duration, headline figures. */
  summary: string
}

/** The kinds of mail a user may turn off; account mails (confirmation, reset) are always sent. */
export type NoticeKind = 'run' | 'sweep'

const SETTING: Record<NoticeKind, { column: 'notifyOnFinish' | 'notifyOnSweepFinish'; what: string }> = {
  run: { column: 'notifyOnFinish', what: '"a run of mine finished"' },
  sweep: { column: 'notifyOnSweepFinish', what: '"a sweep of mine finished"' },
}

export const ACCOUNT_PATH = '/account'

/**
 * Mails the user that their run or sweep finished, unless their setting for that kind is off.
 * Returns whether a mail was sent. Mail trouble is the caller's to log; it must never fail a run.
 */
export async function notifyFinished(db: Db, userId: string, kind: NoticeKind, notice: FinishedNotice, origin = configuredOrigin()): Promise<boolean> {
  if (!isUuid(userId)) return false
  const { column, what } = SETTING[kind]
  const [user] = await db.select({ email: users.email, wants: users[column] }).from(users).where(eq(users.id, userId))
  if (!user || !user.wants) return false
  const url = absoluteLink(notice.url, origin)
  await sendMail(runFinishedMail(user.email, { ...notice, url, settingsUrl: absoluteLink(ACCOUNT_PATH, origin), what }))
  return true
}

/** A single run's mail (kept for callers that predate the per-kind settings). */
export function notifyRunFinished(db: Db, userId: string, notice: FinishedNotice): Promise<boolean> {
  return notifyFinished(db, userId, 'run', notice)
}
