import { Router } from 'express'
import { requireAdmin } from '../auth/auth.middleware'
import { viewOfMail } from './mail-mask'
import { mailCatcher } from './mailer'

/**
 * /api/admin/held-mail: the mail the in-process catcher holds when no SMTP_URL is set, newest first,
 * for signed-in site admins in every mode (a reset link read here would hand over the account).
 * One-time tokens are hidden unless the mail is addressed to the admin reading it. DELETE empties it.
 */
export function heldMailRoutes(): Router {
  const router = Router()
  router.use(requireAdmin)
  router.get('/', async (req, res) => {
    const catcher = await mailCatcher()
    const messages = (catcher?.messages() ?? []).map((m) => viewOfMail(m, req.auth!.email))
    res.set('Cache-Control', 'no-store').json({ catching: catcher !== null, messages })
  })
  router.delete('/', async (_req, res) => {
    ;(await mailCatcher())?.clear()
    res.status(204).end()
  })
  return router
}
