import { Router } from 'express'
import { forbidden, unauthorized } from '../../errors'
import { mailCatcher } from './mailer'

/**
 * GET /api/dev/mail: what the in-process catcher caught, newest first. Open to anyone outside
 * production (it is how a developer reads confirmation and reset links); site admins only in
 * production. DELETE empties it.
 */
export function devMailRoutes(): Router {
  const router = Router()
  router.use((req, _res, next) => {
    if (process.env.NODE_ENV !== 'production') return next()
    if (!req.auth) return next(unauthorized())
    next(req.auth.isAdmin ? undefined : forbidden('Only site administrators can read caught mail'))
  })
  router.get('/', async (_req, res) => {
    const catcher = await mailCatcher()
    res.set('Cache-Control', 'no-store').json({ catching: catcher !== null, messages: catcher?.messages() ?? [] })
  })
  router.delete('/', async (_req, res) => {
    ;(await mailCatcher())?.clear()
    res.status(204).end()
  })
  return router
}
