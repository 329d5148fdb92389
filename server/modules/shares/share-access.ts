// The one read-access rule of shareable resources (runs, sweeps): members act by their group role; on read
// routes a live share link (?share=<token>) stands in for the viewer role. Anything else is "not found" to
// non-members, so ids of other groups' resources do not leak.
import type { Request } from 'express'
import type { Db } from '../../db/client'
import { notFound } from '../../errors'
import { groupRoleOf, requireGroupRole, type Role } from '../../policy/access'
import type { AuthContext } from '../auth/auth-context'
import { resolveShare } from './shares.service'

export interface SharedResource {
  /** The name it was registered under (registerShareable). */
  type: string
  id: string
  groupId: string
  /** Said in the 404: "Run not found". */
  label: string
}

/** The token of `?share=` on a request, when there is exactly one. */
export function shareTokenOf(req: Request): string | undefined {
  const v = req.query.share
  return typeof v === 'string' ? v : undefined
}

/**
 * Passes when the caller may act on the resource with at least `minRole`; for `viewer`, a share token (from
 * shareTokenOf) that resolveShare accepts will do. Throws 404, or 401/403 as requireGroupRole does.
 */
export async function requireResourceAccess(db: Db, auth: AuthContext | undefined, resource: SharedResource, minRole: Role, shareToken?: string): Promise<void> {
  if (minRole === 'viewer' && shareToken !== undefined) {
    const member = auth ? await groupRoleOf(db, auth.userId, resource.groupId) : null
    if (member || (await resolveShare(db, shareToken, resource.type, resource.id, auth))) return
    throw notFound(resource.label)
  }
  await requireGroupRole(db, auth, resource.groupId, minRole, resource.label)
}
