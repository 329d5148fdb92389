import { z } from 'zod'
import { safeText } from './text'
import { Email, GroupRole } from './auth'

export { GroupRole }

export const GROUP_NAME_MAX_CHARS = 80

export const GroupName = safeText({ error: 'Name is required' })
  .trim()
  .min(2, 'At least 2 characters')
  .max(GROUP_NAME_MAX_CHARS, `At most ${GROUP_NAME_MAX_CHARS} characters`)

export const GroupCreateBody = z.object({ name: GroupName })
export type GroupCreateBody = z.infer<typeof GroupCreateBody>
export const GroupUpdateBody = z.object({ name: GroupName })

export const GroupSummary = z.object({ id: z.string(), name: z.string(), slug: z.string(), role: GroupRole, createdAt: z.string() })
export type GroupSummary = z.infer<typeof GroupSummary>

export const GroupMember = z.object({
  userId: z.string(),
  email: z.string(),
  name: z.string(),
  role: GroupRole,
  joinedAt: z.string(),
})
export type GroupMember = z.infer<typeof GroupMember>

export const RoleChangeBody = z.object({ role: GroupRole })

export const InviteBody = z.object({ email: Email, role: GroupRole })
export type InviteBody = z.infer<typeof InviteBody>

export const InvitationSummary = z.object({
  id: z.string(),
  email: z.string(),
  role: GroupRole,
  createdAt: z.string(),
  expiresAt: z.string(),
})
export type InvitationSummary = z.infer<typeof InvitationSummary>

/** What the accept page shows before the person commits. */
export const InvitationPreview = z.object({
  groupName: z.string(),
  role: GroupRole,
  email: z.string(),
  expiresAt: z.string(),
  invitedBy: z.string().nullable(),
})
export type InvitationPreview = z.infer<typeof InvitationPreview>

export const AcceptInvitationBody = z.object({ token: safeText().trim().min(16, 'Not a valid token').max(200, 'Not a valid token') })
