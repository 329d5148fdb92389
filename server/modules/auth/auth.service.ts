import type { AcceptedMessage, PasswordResetCompleteBody, SignInBody, SignUpBody } from '@shared/api/auth'
import type { Db } from '../../db/client'
import { emailConfirmations, passwordResets, type User } from '../../db/schema'
import { AppError, unauthorized } from '../../errors'
import type { Logger } from '../../logger'
import { sendMail } from '../mail/mailer'
import { alreadyRegisteredMail, confirmationMail, passwordResetMail } from '../mail/templates'
import { EMAIL_CONFIRMATION_TTL_MS, PASSWORD_RESET_TTL_MS } from './auth-options'
import { invitationProvesAddress } from '../groups/invitations.service'
import { completeEmailChange } from './account.service'
import { consumeEmailConfirmation, consumeOneTimeToken, issueOneTimeToken, spendAllTokens } from './one-time-tokens.repo'
import { hashPassword, verifyPassword } from './passwords'
import { revokeAllSessions } from './sessions.repo'
import { findUserByEmail, findUserById, insertUser, markEmailConfirmed, updateUser } from './users.repo'

/** Builds the absolute link mailed for a page path and token. */
export type LinkTo = (path: string, token: string) => string

export const CONFIRM_PATH = '/confirm-email'
export const RESET_PATH = '/reset-password'

const SIGN_UP_ACCEPTED: AcceptedMessage = { ok: true, message: 'Check your mailbox: we sent a message to that address.' }
/** Only the holder of an invitation to the address sees this, so it tells nobody else who has an account. */
const SIGN_UP_INVITED: AcceptedMessage = { ok: true, message: 'Your account is ready and your address is confirmed by the invitation.' }
export const RESET_ACCEPTED: AcceptedMessage = { ok: true, message: 'If that address has an account, a reset link is on its way.' }
const BAD_LINK = () => new AppError('invalid_token', 400, 'This link is not valid any more: it was used already, has expired or was mistyped')

// Mail trouble is logged, never reported: a different answer would tell who has an account.
async function mailQuietly(log: Logger, send: () => Promise<void>): Promise<void> {
  try {
    await send()
  } catch (err) {
    log.error({ err }, 'sending mail failed')
  }
}

/**
 * Creates the account and mails a confirmation link (none when the sign-up came through a valid
 * invitation to the same address, which proves it already); for an address that already has an account,
 * mails its owner a reset link instead. The answer is the same either way.
 */
export async function signUp(db: Db, log: Logger, linkTo: LinkTo, body: SignUpBody): Promise<AcceptedMessage> {
  const passwordHash = await hashPassword(body.password)
  const name = body.name ?? body.email.split('@')[0]
  const created = await insertUser(db, { email: body.email, name, passwordHash })
  if (created && body.invitationToken && (await invitationProvesAddress(db, body.invitationToken, created.email))) {
    // The invitation link came through that mailbox: a second confirmation mail would only confuse.
    await markEmailConfirmed(db, created.id)
    return SIGN_UP_INVITED
  }
  if (created) {
    const token = await issueOneTimeToken(db, emailConfirmations, created.id, EMAIL_CONFIRMATION_TTL_MS)
    await mailQuietly(log, () => sendMail(confirmationMail(created.email, linkTo(CONFIRM_PATH, token))))
  } else {
    const existing = await findUserByEmail(db, body.email)
    if (existing) {
      const token = await issueOneTimeToken(db, passwordResets, existing.id, PASSWORD_RESET_TTL_MS)
      await mailQuietly(log, () => sendMail(alreadyRegisteredMail(existing.email, linkTo(RESET_PATH, token))))
    }
  }
  return SIGN_UP_ACCEPTED
}

/** The user for a right e-mail and password; one message for every failure. */
export async function checkCredentials(db: Db, body: SignInBody): Promise<User> {
  const user = await findUserByEmail(db, body.email)
  const ok = await verifyPassword(body.password, user?.passwordHash)
  if (!user || !ok) throw unauthorized('E-mail or password is wrong')
  return user
}

/** Confirms the sign-up address, or moves the account to the new address a change link was sent to. */
export async function confirmEmail(db: Db, log: Logger, token: string): Promise<AcceptedMessage> {
  const used = await consumeEmailConfirmation(db, token)
  if (!used) throw BAD_LINK()
  if (used.newEmail) return completeEmailChange(db, log, used.userId, used.newEmail)
  await markEmailConfirmed(db, used.userId)
  await spendAllTokens(db, emailConfirmations, used.userId)
  return { ok: true, message: 'Thank you: your address is confirmed.' }
}

export async function resendConfirmation(db: Db, log: Logger, linkTo: LinkTo, userId: string): Promise<AcceptedMessage> {
  const user = await findUserById(db, userId)
  if (user && !user.emailConfirmedAt) {
    const token = await issueOneTimeToken(db, emailConfirmations, user.id, EMAIL_CONFIRMATION_TTL_MS)
    await mailQuietly(log, () => sendMail(confirmationMail(user.email, linkTo(CONFIRM_PATH, token))))
  }
  return { ok: true, message: user?.emailConfirmedAt ? 'Your address is already confirmed.' : 'A new confirmation link is on its way.' }
}

/**
 * Mails a reset link when the address has an account. The route answers RESET_ACCEPTED before this
 * runs (afterResponse), so neither the answer nor its timing tells whether the address is known.
 */
export async function requestPasswordReset(db: Db, log: Logger, linkTo: LinkTo, email: string): Promise<void> {
  const user = await findUserByEmail(db, email)
  if (!user) return
  const token = await issueOneTimeToken(db, passwordResets, user.id, PASSWORD_RESET_TTL_MS)
  await mailQuietly(log, () => sendMail(passwordResetMail(user.email, linkTo(RESET_PATH, token))))
}

/**
 * Sets the new password with a single-use link. The link proves the mailbox, so the address counts
 * as confirmed; every session (and every other reset link) of the user ends.
 */
export async function completePasswordReset(db: Db, body: PasswordResetCompleteBody): Promise<void> {
  const userId = await consumeOneTimeToken(db, passwordResets, body.token)
  if (!userId) throw BAD_LINK()
  await updateUser(db, userId, { passwordHash: await hashPassword(body.password) })
  await markEmailConfirmed(db, userId)
  await spendAllTokens(db, passwordResets, userId)
  await revokeAllSessions(db, userId)
}
