import { Router } from 'express'
import type { Db } from '../../db/client'
import { groupsRoutes, invitationsRoutes } from '../groups/groups.routes'
import { tokensRoutes } from '../tokens/tokens.routes'
import { adminRoutes } from './admin.routes'
import { heldMailRoutes } from '../mail/held-mail.routes'
import { sharesRoutes } from '../shares/shares.routes'
import { resolveAuthOptions, type AuthOptions } from './auth-options'
import { authRoutes, meRoutes } from './auth.routes'

export interface AccountDeps {
  db: Db
  auth?: Partial<AuthOptions>
}

/** Every accounts-related router under /api, mounted by createApp after `authenticate`. */
export function accountRoutes(deps: AccountDeps): Router {
  const router = Router()
  const opts = resolveAuthOptions(deps.auth)
  router.use('/auth', authRoutes(deps, opts))
  router.use('/me', meRoutes(deps, opts))
  router.use('/groups', groupsRoutes(deps, opts))
  router.use('/invitations', invitationsRoutes(deps))
  router.use('/tokens', tokensRoutes(deps))
  router.use('/shares', sharesRoutes(deps))
  router.use('/admin/held-mail', heldMailRoutes())
  router.use('/admin', adminRoutes(deps))
  return router
}
