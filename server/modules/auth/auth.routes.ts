import { Router, type Request } from 'express'
import { ChangeEmailBody, ChangePasswordBody, ConfirmEmailBody, PasswordResetCompleteBody, PasswordResetRequestBody, SignInBody, SignUpBody, UpdateMeBody } from '@shared/api/auth'
import type { Db } from '../../db/client'
import { validate } from '../../middleware/validate'
import type { AuthOptions } from './auth-options'
import { requireAuth } from './auth.middleware'
import { afterResponse } from './after-response'
import { checkCredentials, completePasswordReset, confirmEmail, requestPasswordReset, resendConfirmation, RESET_ACCEPTED, signUp, type LinkTo } from './auth.service'
import { appLink } from './links'
import { loadMe, toMeUser, updateMe } from './me.service'
import { changePassword, requestEmailChange } from './account.service'
import { accountSignInLimiter, mailRequestLimiter, passwordCheckLimiter, signInLimiter } from './rate-limit'
import { clearSessionCookie, startSession } from './session-cookie'
import { revokeSession } from './sessions.repo'

/** /api/auth/*: sign-up, sign-in, sign-out, e-mail confirmation and password reset. */
export function authRoutes(deps: { db: Db }, opts: AuthOptions): Router {
  const router = Router()
  const linkTo = (req: Request): LinkTo => (path, token) => appLink(opts, req, path, token)
  const mailLimit = mailRequestLimiter(opts)

  router.post('/sign-up', mailLimit, validate({ body: SignUpBody }), async (req, res) => {
    res.status(202).json(await signUp(deps.db, req.log, linkTo(req), req.body))
  })

  router.post('/sign-in', signInLimiter(opts), accountSignInLimiter(opts), validate({ body: SignInBody }), async (req, res) => {
    const user = await checkCredentials(deps.db, req.body)
    // A sign-in while signed in replaces the old session rather than leaving it live.
    if (req.auth?.sessionId) await revokeSession(deps.db, req.auth.sessionId)
    await startSession(deps.db, opts, req, res, user.id)
    res.json({ user: toMeUser(user) })
  })

  router.post('/sign-out', async (req, res) => {
    if (req.auth?.sessionId) await revokeSession(deps.db, req.auth.sessionId)
    clearSessionCookie(opts, req, res)
    res.status(204).end()
  })

  router.post('/confirm-email', validate({ body: ConfirmEmailBody }), async (req, res) => {
    res.json(await confirmEmail(deps.db, req.log, req.body.token))
  })

  router.post('/resend-confirmation', requireAuth, mailLimit, async (req, res) => {
    res.status(202).json(await resendConfirmation(deps.db, req.log, linkTo(req), req.auth!.userId))
  })

  router.post('/password-reset/request', mailLimit, validate({ body: PasswordResetRequestBody }), (req, res) => {
    // Answer first, then look the address up: known and unknown addresses take the same time.
    res.status(202).json(RESET_ACCEPTED)
    const email: string = req.body.email
    afterResponse(req.log, 'password reset request', () => requestPasswordReset(deps.db, req.log, linkTo(req), email))
  })

  router.post('/password-reset/complete', validate({ body: PasswordResetCompleteBody }), async (req, res) => {
    await completePasswordReset(deps.db, req.body)
    res.json({ ok: true, message: 'Your password is changed. Sign in with the new one.' })
  })

  return router
}

/** /api/me: who is signed in, with their groups and roles; PATCH for name and mail settings; password and address changes. */
export function meRoutes(deps: { db: Db }, opts: AuthOptions): Router {
  const router = Router()
  const checkLimit = passwordCheckLimiter(opts)
  router.use(requireAuth)
  router.get('/', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await loadMe(deps.db, req.auth!))
  })
  router.patch('/', validate({ body: UpdateMeBody }), async (req, res) => {
    res.json(await updateMe(deps.db, req.auth!, req.body))
  })
  // Validation first: only wrong passwords count against the limit, not malformed bodies.
  router.post('/password', validate({ body: ChangePasswordBody }), checkLimit, async (req, res) => {
    res.json(await changePassword(deps.db, req.auth!.userId, req.auth!.sessionId, req.body))
  })
  router.post('/email', validate({ body: ChangeEmailBody }), checkLimit, mailRequestLimiter(opts), async (req, res) => {
    res.status(202).json(await requestEmailChange(deps.db, req.log, (path, token) => appLink(opts, req, path, token), req.auth!.userId, req.body))
  })
  return router
}
