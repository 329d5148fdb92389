// A signed-in user changes their own password or address. Both ask for the current password, so an
// unlocked screen left behind is not enough to take the account over.
import { and, eq, ne, sql } from 'drizzle-orm'
import type { AcceptedMessage, ChangeEmailBody, ChangePasswordBody } from '@shared/api/auth'
import type { Db } from '../../db/client'
import { emailConfirmations, sessions, users } from '../../db/schema'
import { AppError, conflict, notFound } from '../../errors'
import type { Logger } from '../../logger'
import { sendMail } from '../mail/mailer'
import { emailChangedNoticeMail, emailChangeMail } from '../mail/templates'
import { EMAIL_CONFIRMATION_TTL_MS } from './auth-options'
import { issueEmailChangeToken, spendAllTokens } from './one-time-tokens.repo'
import { hashPassword, verifyPassword } from './passwords'
import { findUserById, updateUser } from './users.repo'

/** The same page confirms sign-ups and changes of address. */
const CONFIRM_PATH = '/confirm-email'

const wrongPassword = () =>
  new AppError('wrong_password', 400, 'The current password is wrong', { fields: [{ path: 'currentPassword', message: 'This is not your current password' }] })

async function userWithPassword(db: Db, userId: string, currentPassword: string) {
  const user = await findUserById(db, userId)
  if (!user) throw notFound('User')
  if (!(await verifyPassword(currentPassword, user.passwordHash))) throw wrongPassword()
  return user
}

/** New password; every other session of the user ends, the one making the change stays. */
export async function changePassword(db: Db, userId: string, keepSessionId: string | undefined, body: ChangePasswordBody): Promise<AcceptedMessage> {
  await userWithPassword(db, userId, body.currentPassword)
  await updateUser(db, userId, { passwordHash: await hashPassword(body.newPassword) })
  const others = keepSessionId ? and(eq(sessions.userId, userId), ne(sessions.id, keepSessionId)) : eq(sessions.userId, userId)
  await db.update(sessions).set({ revokedAt: sql`now()` }).where(and(others, sql`${sessions.revokedAt} is null`))
  return { ok: true, message: 'Your password is changed; every other session is signed out.' }
}

/**
 * Mails a confirmation link to the new address; the account keeps the old one until the link is
 * opened. The answer is the same whether or not another account has the address (that shows only
 * when the link is opened, to whoever reads that mailbox).
 */
export async function requestEmailChange(db: Db, log: Logger, link: (path: string, token: string) => string, userId: string, body: ChangeEmailBody): Promise<AcceptedMessage> {
  const user = await userWithPassword(db, userId, body.currentPassword)
  if (user.email.toLowerCase() === body.newEmail.toLowerCase()) {
    throw new AppError('invalid_input', 400, 'That is already your address', { fields: [{ path: 'newEmail', message: 'This is already your address' }] })
  }
  // Only the newest request counts: earlier change links stop working.
  await db.update(emailConfirmations).set({ usedAt: sql`now()` }).where(and(eq(emailConfirmations.userId, userId), sql`${emailConfirmations.newEmail} is not null`, sql`${emailConfirmations.usedAt} is null`))
  const token = await issueEmailChangeToken(db, userId, body.newEmail, EMAIL_CONFIRMATION_TTL_MS)
  try {
    await sendMail(emailChangeMail(body.newEmail, link(CONFIRM_PATH, token)))
  } catch (err) {
    log.error({ err }, 'sending an address-change mail failed')
    throw new AppError('mail_failed', 503, 'The confirmation mail could not be sent; try again later')
  }
  return { ok: true, message: `We sent a confirmation link to ${body.newEmail}. Your address changes when you open it.` }
}

/** The change link was opened: the account moves to the new address, which is thereby confirmed. */
export async function completeEmailChange(db: Db, log: Logger, userId: string, newEmail: string): Promise<AcceptedMessage> {
  const user = await findUserById(db, userId)
  if (!user) throw notFound('User')
  try {
    await db.update(users).set({ email: newEmail, emailConfirmedAt: sql`now()` }).where(eq(users.id, userId))
  } catch (err) {
    if ((err as { code?: string }).code === '23505' || (err as { cause?: { code?: string } }).cause?.code === '23505') {
      throw conflict('Another account already uses this address, so yours cannot move to it')
    }
    throw err
  }
  await spendAllTokens(db, emailConfirmations, userId)
  try {
    await sendMail(emailChangedNoticeMail(user.email, newEmail))
  } catch (err) {
    log.error({ err }, 'sending the address-changed notice failed')
  }
  return { ok: true, message: `Thank you: your account now uses ${newEmail}.` }
}
