import { Router } from 'express'
import type { Db } from '../../db/client'
import { devMailRoutes } from '../mail/dev-mail.routes'
import { sharesRoutes } from '../shares/shares.routes'
import type { AuthOptions } from './auth-options'

export interface AccountDeps {
  db: Db
  auth?: Partial<AuthOptions>
}

/** Every accounts-related router under /api, mounted by createApp after `authenticate`. */
export function accountRoutes(deps: AccountDeps): Router {
  const router = Router()
  router.use('/shares', sharesRoutes(deps))
  router.use('/dev/mail', devMailRoutes())
  return router
}
