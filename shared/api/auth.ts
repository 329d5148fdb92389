import { z } from 'zod'
import { safeText } from './text'

/** Longest address SMTP allows in a forward path (RFC 5321 §4.5.3.1.3). */
export const EMAIL_MAX_CHARS = 254
export const PASSWORD_MIN_CHARS = 10
/** bcrypt reads at most 72 bytes of a password; more would be silently ignored, so refuse it. */
export const PASSWORD_MAX_BYTES = 72
export const NAME_MAX_CHARS = 100

export const Email = safeText({ error: 'E-mail is required' })
  .trim()
  .max(EMAIL_MAX_CHARS, `At most ${EMAIL_MAX_CHARS} characters`)
  .pipe(z.email({ error: 'Not a valid e-mail address' }))
  .describe('The address we send sign-in links and notifications to')

export const Password = safeText({ error: 'Password is required' })
  .min(PASSWORD_MIN_CHARS, `At least ${PASSWORD_MIN_CHARS} characters`)
  .refine((s) => new TextEncoder().encode(s).length <= PASSWORD_MAX_BYTES, `At most ${PASSWORD_MAX_BYTES} bytes (about ${PASSWORD_MAX_BYTES} plain letters)`)
  .describe(`At least ${PASSWORD_MIN_CHARS} characters`)

export const PersonName = safeText().trim().min(1, 'Name is required').max(NAME_MAX_CHARS, `At most ${NAME_MAX_CHARS} characters`)

/** Opaque secrets we mail or hand out (base64url). Bounded so junk never reaches a hash or the database. */
export const SecretToken = safeText({ error: 'Token is required' }).trim().min(16, 'Not a valid token').max(200, 'Not a valid token')

export const SignUpBody = z.object({
  email: Email,
  password: Password,
  name: PersonName.optional(),
  /** The invitation the visitor followed: when it was sent to this address, the address counts as confirmed. */
  invitationToken: SecretToken.optional(),
})
export type SignUpBody = z.infer<typeof SignUpBody>

// Sign-in checks only presence and size: an old password shorter than today's rule must still work.
export const SignInBody = z.object({
  email: Email,
  password: safeText({ error: 'Password is required' }).min(1, 'Password is required').max(200, 'At most 200 characters'),
})
export type SignInBody = z.infer<typeof SignInBody>

export const ConfirmEmailBody = z.object({ token: SecretToken })
export const PasswordResetRequestBody = z.object({ email: Email })
export const PasswordResetCompleteBody = z.object({ token: SecretToken, password: Password })
export type PasswordResetCompleteBody = z.infer<typeof PasswordResetCompleteBody>

/** Which mails a user gets; account mails (confirmation, reset, address change) always go out. */
export const MailSettings = z.object({
  notifyOnFinish: z.boolean().describe('Mail me when a single run of mine finishes'),
  notifyOnSweepFinish: z.boolean().describe('Mail me one digest when a sweep of mine finishes'),
  notifyOnGroupChange: z.boolean().describe('Mail me when I am invited to a group or my role in one changes'),
})
export type MailSettings = z.infer<typeof MailSettings>

export const UpdateMeBody = z
  .object({ name: PersonName.optional(), ...MailSettings.partial().shape })
  .refine((b) => Object.values(b).some((v) => v !== undefined), 'Nothing to change')
export type UpdateMeBody = z.infer<typeof UpdateMeBody>

/** Signed in, with the current password: a borrowed unlocked screen is not enough to take the account. */
export const ChangePasswordBody = z.object({
  currentPassword: safeText({ error: 'Current password is required' }).min(1, 'Current password is required').max(200, 'At most 200 characters'),
  newPassword: Password,
})
export type ChangePasswordBody = z.infer<typeof ChangePasswordBody>

export const ChangeEmailBody = z.object({
  currentPassword: ChangePasswordBody.shape.currentPassword,
  newEmail: Email,
})
export type ChangeEmailBody = z.infer<typeof ChangeEmailBody>

export const GroupRole = z.enum(['owner', 'editor', 'viewer'])
export type GroupRole = z.infer<typeof GroupRole>

export const MeUser = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string().optional(),
  isAdmin: z.boolean().default(false),
  emailConfirmed: z.boolean().optional(),
  notifyOnFinish: z.boolean().optional(),
  notifyOnSweepFinish: z.boolean().optional(),
  notifyOnGroupChange: z.boolean().optional(),
})
export type MeUser = z.infer<typeof MeUser>

export const MeMembership = z.object({
  groupId: z.string(),
  groupName: z.string(),
  groupSlug: z.string().optional(),
  role: GroupRole,
})
export type MeMembership = z.infer<typeof MeMembership>

/** GET /api/me. */
export const MeResponse = z.object({
  user: MeUser,
  memberships: z.array(MeMembership).default([]),
  currentGroupId: z.string().nullable().optional(),
  via: z.enum(['session', 'token']).optional(),
})
export type MeResponse = z.infer<typeof MeResponse>

/** What sign-up, reset requests and the like answer whatever the address: nothing that tells who has an account. */
export const AcceptedMessage = z.object({ ok: z.literal(true), message: z.string() })
export type AcceptedMessage = z.infer<typeof AcceptedMessage>

// ---- API tokens ------------------------------------------------------------------------------

export const TOKEN_NAME_MAX_CHARS = 80
export const TOKEN_MAX_DAYS = 366

export const ApiTokenCreateBody = z.object({
  name: safeText({ error: 'Name is required' }).trim().min(1, 'Name is required').max(TOKEN_NAME_MAX_CHARS, `At most ${TOKEN_NAME_MAX_CHARS} characters`),
  expiresInDays: z.number().int('A whole number of days').min(1, 'At least 1 day').max(TOKEN_MAX_DAYS, `At most ${TOKEN_MAX_DAYS} days`).nullable().optional()
    .describe('Leave empty for a token that lasts until revoked'),
})
export type ApiTokenCreateBody = z.infer<typeof ApiTokenCreateBody>

export const ApiTokenSummary = z.object({
  id: z.string(),
  name: z.string(),
  tokenPrefix: z.string(),
  createdAt: z.string(),
  expiresAt: z.string().nullable(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
})
export type ApiTokenSummary = z.infer<typeof ApiTokenSummary>

/** The only answer that ever carries the secret. */
export const CreatedApiToken = ApiTokenSummary.extend({ token: z.string() })
export type CreatedApiToken = z.infer<typeof CreatedApiToken>
