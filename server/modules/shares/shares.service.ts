import type { CreatedShareLink, ShareCreateBody, ShareLinkSummary } from '@shared/api/shares'
import type { Db } from '../../db/client'
import type { ShareLink } from '../../db/schema'
import { AppError, notFound } from '../../errors'
import { requireGroupRole } from '../../policy/access'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import { hashSecretToken, newSecretToken } from '../auth/secret-token'
import { shareableOf, shareableTypes, type Shareable } from './share-registry'
import { findLiveShareByHash, findShareLink, insertShareLink, listShareLinks, revokeShareLink } from './shares.repo'

const SHARE_TOKEN_PREFIX = 'shr_'

export function toShareSummary(link: ShareLink): ShareLinkSummary {
  return {
    id: link.id,
    resourceType: link.resourceType,
    resourceId: link.resourceId,
    public: link.public,
    createdAt: link.createdAt.toISOString(),
    createdBy: link.createdBy,
    revokedAt: link.revokedAt?.toISOString() ?? null,
  }
}

function registered(type: string): Shareable {
  const shareable = shareableOf(type)
  if (!shareable) {
    const known = shareableTypes()
    throw new AppError('invalid_input', 400, 'Some fields are not valid', {
      fields: [{ path: 'resourceType', message: known.length ? `Must be one of: ${known.join(', ')}` : 'Nothing can be shared yet' }],
    })
  }
  return shareable
}

/** The resource's group, checked against the caller's role; 404 for missing resources and non-members alike. */
async function groupFor(db: Db, auth: AuthContext | undefined, type: string, id: string, minRole: 'viewer' | 'editor'): Promise<{ groupId: string; shareable: Shareable }> {
  const shareable = registered(type)
  const groupId = isUuid(id) ? await shareable.groupOf(db, id) : null
  if (!groupId) throw notFound('Resource')
  await requireGroupRole(db, auth, groupId, minRole, 'Resource')
  return { groupId, shareable }
}

/** A new read-only link; the token is in this answer only. Needs the editor role in the resource's group. */
export async function createShare(db: Db, auth: AuthContext | undefined, body: ShareCreateBody): Promise<CreatedShareLink> {
  const { groupId, shareable } = await groupFor(db, auth, body.resourceType, body.resourceId, 'editor')
  const { token, hash } = newSecretToken(SHARE_TOKEN_PREFIX)
  const link = await insertShareLink(db, {
    resourceType: body.resourceType,
    resourceId: body.resourceId,
    groupId,
    tokenHash: hash,
    public: body.public,
    createdBy: auth!.userId,
  })
  const path = shareable.pathOf ? `${shareable.pathOf(body.resourceId)}?share=${encodeURIComponent(token)}` : null
  return { ...toShareSummary(link), token, path }
}

/** Links of one resource (without tokens); any member of its group may see them. */
export async function listShares(db: Db, auth: AuthContext | undefined, resourceType: string, resourceId: string): Promise<ShareLinkSummary[]> {
  await groupFor(db, auth, resourceType, resourceId, 'viewer')
  return (await listShareLinks(db, resourceType, resourceId)).map(toShareSummary)
}

/** Revokes a link (idempotent). Needs the editor role in the link's group. */
export async function revokeShare(db: Db, auth: AuthContext | undefined, id: string): Promise<ShareLinkSummary> {
  const link = await findShareLink(db, id)
  if (!link) throw notFound('Share link')
  await requireGroupRole(db, auth, link.groupId, 'editor', 'Share link')
  return toShareSummary(await revokeShareLink(db, link.id))
}

/**
 * Does `token` (from ?share=) grant read access to resource `id` of `type`? True for a live link
 * to exactly that resource that is public, or non-public with someone signed in. Group members do
 * not need this: check their role first and call this only for outsiders.
 */
export async function resolveShare(db: Db, token: string | undefined | null, type: string, id: string, auth?: AuthContext): Promise<boolean> {
  if (typeof token !== 'string' || token.length < 16 || token.length > 200) return false
  const link = await findLiveShareByHash(db, hashSecretToken(token), type, id)
  if (!link) return false
  // A resource moved to another group since the link was made is no longer what was shared.
  const shareable = shareableOf(type)
  if (shareable && (await shareable.groupOf(db, id)) !== link.groupId) return false
  return link.public || auth !== undefined
}
