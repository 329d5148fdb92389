import { Router } from 'express'
import { asc, eq, sql } from 'drizzle-orm'
import { z } from 'zod'
import type { Db } from '../../db/client'
import { memberships, users } from '../../db/schema'
import { AppError, notFound } from '../../errors'
import { validate } from '../../middleware/validate'
import { isUuid } from '../../policy/ids'
import { requireAdmin } from './auth.middleware'

const AdminUserPatch = z.object({ isAdmin: z.boolean() })

/** /api/admin/users: site administrators list accounts and grant or withdraw the admin flag. */
export function adminRoutes(deps: { db: Db }): Router {
  const { db } = deps
  const router = Router()
  router.use(requireAdmin)
  router.get('/users', async (_req, res) => {
    const rows = await db
      .select({
        id: users.id,
        email: users.email,
        name: users.name,
        isAdmin: users.isAdmin,
        emailConfirmed: sql<boolean>`${users.emailConfirmedAt} is not null`,
        createdAt: users.createdAt,
        groupCount: sql<number>`(select count(*)::int from ${memberships} where ${memberships.userId} = ${users.id})`,
      })
      .from(users)
      .orderBy(asc(users.email))
    res.json({ users: rows })
  })
  router.patch('/users/:id', validate({ body: AdminUserPatch }), async (req, res) => {
    if (!isUuid(req.params.id)) throw notFound('User')
    // Withdrawing the flag from oneself could leave the site with no admin at all.
    if (req.params.id === req.auth!.userId && !req.body.isAdmin) throw new AppError('last_admin', 409, 'You cannot withdraw your own admin flag; ask another admin')
    const [row] = await db.update(users).set({ isAdmin: req.body.isAdmin }).where(eq(users.id, req.params.id)).returning({ id: users.id, isAdmin: users.isAdmin })
    if (!row) throw notFound('User')
    res.json(row)
  })
  return router
}
