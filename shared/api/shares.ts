import { z } from 'zod'
import { safeText } from './text'

/** Names a module registered with the share service ('run', 'sweep', ...). */
export const ShareResourceType = safeText({ error: 'Resource type is required' }).trim().min(1).max(40).regex(/^[a-z][a-z0-9-]*$/, 'Not a resource type')

/** `?share=<token>` on the read routes of a shareable resource: it stands in for the viewer role. */
export const ShareTokenQuery = z.object({ share: safeText().max(200).optional().describe('Share-link token, for readers outside the group') })
export type ShareTokenQuery = z.infer<typeof ShareTokenQuery>

export const ShareCreateBody = z.object({
  resourceType: ShareResourceType,
  resourceId: z.uuid({ error: 'Not a valid id' }),
  public: z.boolean().default(false).describe('Anyone with the link, even without an account'),
})
export type ShareCreateBody = z.infer<typeof ShareCreateBody>

export const ShareListQuery = z.object({ resourceType: ShareResourceType, resourceId: z.uuid({ error: 'Not a valid id' }) })

export const ShareLinkSummary = z.object({
  id: z.string(),
  resourceType: z.string(),
  resourceId: z.string(),
  public: z.boolean(),
  createdAt: z.string(),
  createdBy: z.string().nullable(),
  revokedAt: z.string().nullable(),
})
export type ShareLinkSummary = z.infer<typeof ShareLinkSummary>

/** Only the creating answer carries the token; add `?share=<token>` to the resource's page or API URL. */
export const CreatedShareLink = ShareLinkSummary.extend({ token: z.string(), path: z.string().nullable() })
export type CreatedShareLink = z.infer<typeof CreatedShareLink>
