import { Router, type Request } from 'express'
import { AcceptInvitationBody, GroupCreateBody, GroupUpdateBody, InviteBody, RoleChangeBody } from '@shared/api/groups'
import type { Db } from '../../db/client'
import { validate } from '../../middleware/validate'
import type { AuthOptions } from '../auth/auth-options'
import { requireAuth } from '../auth/auth.middleware'
import { appLink } from '../auth/links'
import { createGroup, getGroup, listMyGroups, renameGroup } from './groups.service'
import { acceptInvitation, invite, listPendingInvitations, previewInvitation, withdrawInvitation } from './invitations.service'
import { changeRole, listMembers, removeMember } from './members.service'

type GroupParams = { groupId: string }

/** /api/groups: the caller's groups, members and roles, invitations. Roles come from policy/access. */
export function groupsRoutes(deps: { db: Db }, opts: AuthOptions): Router {
  const { db } = deps
  const router = Router()
  router.use(requireAuth)
  const linkTo = (req: Request) => (path: string, token: string) => appLink(opts, req, path, token)

  router.get('/', async (req, res) => res.json({ groups: await listMyGroups(db, req.auth!.userId) }))
  router.post('/', validate({ body: GroupCreateBody }), async (req, res) => res.status(201).json(await createGroup(db, req.auth!, req.body.name)))
  router.get('/:groupId', async (req: Request<GroupParams>, res) => res.json(await getGroup(db, req.auth, req.params.groupId)))
  router.patch('/:groupId', validate({ body: GroupUpdateBody }), async (req: Request<GroupParams>, res) =>
    res.json(await renameGroup(db, req.auth, req.params.groupId, req.body.name)),
  )

  router.get('/:groupId/members', async (req: Request<GroupParams>, res) => res.json({ members: await listMembers(db, req.auth, req.params.groupId) }))
  router.patch('/:groupId/members/:userId', validate({ body: RoleChangeBody }), async (req: Request<GroupParams & { userId: string }>, res) =>
    res.json({ members: await changeRole(db, req.auth, req.params.groupId, req.params.userId, req.body.role) }),
  )
  router.delete('/:groupId/members/:userId', async (req: Request<GroupParams & { userId: string }>, res) => {
    await removeMember(db, req.auth, req.params.groupId, req.params.userId)
    res.status(204).end()
  })

  router.get('/:groupId/invitations', async (req: Request<GroupParams>, res) =>
    res.json({ invitations: await listPendingInvitations(db, req.auth, req.params.groupId) }),
  )
  router.post('/:groupId/invitations', validate({ body: InviteBody }), async (req: Request<GroupParams>, res) =>
    res.status(201).json(await invite(db, req.log, req.auth, req.params.groupId, req.body, linkTo(req))),
  )
  router.delete('/:groupId/invitations/:invitationId', async (req: Request<GroupParams & { invitationId: string }>, res) => {
    await withdrawInvitation(db, req.auth, req.params.groupId, req.params.invitationId)
    res.status(204).end()
  })
  return router
}

/**
 * /api/invitations: the token travels in the body, never the URL, so it stays out of access logs.
 * Preview is open to anyone with the link; accepting needs the invited address signed in.
 */
export function invitationsRoutes(deps: { db: Db }): Router {
  const router = Router()
  router.post('/preview', validate({ body: AcceptInvitationBody }), async (req, res) => res.json(await previewInvitation(deps.db, req.body.token)))
  router.post('/accept', requireAuth, validate({ body: AcceptInvitationBody }), async (req, res) =>
    res.json(await acceptInvitation(deps.db, req.auth!, req.body.token)),
  )
  return router
}
