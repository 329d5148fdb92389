// Sign-up, sessions, the signed-in account, API tokens and the site administration routes.
import { z } from 'zod'
import {
  AcceptedMessage,
  ApiTokenCreateBody,
  ChangeEmailBody,
  ChangePasswordBody,
  ApiTokenSummary,
  ConfirmEmailBody,
  CreatedApiToken,
  MeResponse,
  MeUser,
  PasswordResetCompleteBody,
  PasswordResetRequestBody,
  SignInBody,
  SignUpBody,
  UpdateMeBody,
} from '@shared/api/auth'
import { HealthStatus } from '@shared/api/health'
import { QueueActivity } from '@shared/api/queue'
import { QueueStatus } from '@shared/api/runs'
import type { ApiOperation } from '../registry'

const accepted = (status: number, description: string) => ({ status, description, schema: AcceptedMessage })
const noContent = { status: 204, description: 'Done; no body' }

export const accountOperations: ApiOperation[] = [
  { method: 'GET', path: '/api/health', tag: 'Service', auth: 'public', summary: 'Database and queue status (503 when either is down)', response: { status: 200, description: 'Status', schema: HealthStatus } },
  { method: 'GET', path: '/api/openapi.json', tag: 'Service', auth: 'public', summary: 'This API description (OpenAPI 3.1)', response: { status: 200, description: 'The OpenAPI document', contentType: 'application/json' } },

  { method: 'POST', path: '/api/auth/sign-up', tag: 'Account', auth: 'public', summary: 'Create an account; a confirmation link is mailed', body: SignUpBody, response: accepted(202, 'Accepted') },
  { method: 'POST', path: '/api/auth/sign-in', tag: 'Account', auth: 'public', summary: 'Start a browser session (sets the session cookie)', body: SignInBody, response: { status: 200, description: 'Signed in', schema: z.object({ user: MeUser }) } },
  { method: 'POST', path: '/api/auth/sign-out', tag: 'Account', auth: 'public', summary: 'End the browser session', response: noContent },
  { method: 'POST', path: '/api/auth/confirm-email', tag: 'Account', auth: 'public', summary: 'Confirm an e-mail address with the mailed token', body: ConfirmEmailBody, response: accepted(200, 'Confirmed') },
  { method: 'POST', path: '/api/auth/resend-confirmation', tag: 'Account', auth: 'user', summary: 'Mail the confirmation link again', response: accepted(202, 'Accepted') },
  { method: 'POST', path: '/api/auth/password-reset/request', tag: 'Account', auth: 'public', summary: 'Mail a password reset link (same answer for unknown addresses)', body: PasswordResetRequestBody, response: accepted(202, 'Accepted') },
  { method: 'POST', path: '/api/auth/password-reset/complete', tag: 'Account', auth: 'public', summary: 'Set a new password with the mailed token', body: PasswordResetCompleteBody, response: accepted(200, 'Changed') },
  { method: 'GET', path: '/api/me', tag: 'Account', auth: 'user', summary: 'The signed-in account with its groups and roles', response: { status: 200, description: 'The account', schema: MeResponse } },
  { method: 'PATCH', path: '/api/me', tag: 'Account', auth: 'user', summary: 'Change the display name or which mails you get', body: UpdateMeBody, response: { status: 200, description: 'The account', schema: MeResponse } },
  { method: 'POST', path: '/api/me/password', tag: 'Account', auth: 'user', summary: 'Change the password (current one required); every other session ends', body: ChangePasswordBody, response: accepted(200, 'Changed') },
  { method: 'POST', path: '/api/me/email', tag: 'Account', auth: 'user', summary: 'Change the address: a confirmation link goes to the new one, which takes effect when it is opened', body: ChangeEmailBody, response: accepted(202, 'Accepted') },

  { method: 'GET', path: '/api/tokens', tag: 'API tokens', auth: 'user', summary: 'Your API tokens (never their secrets)', response: { status: 200, description: 'Tokens', schema: z.object({ tokens: z.array(ApiTokenSummary) }) } },
  {
    method: 'POST',
    path: '/api/tokens',
    tag: 'API tokens',
    auth: 'user',
    summary: 'Create an API token; the secret is in this answer only',
    body: ApiTokenCreateBody,
    response: { status: 201, description: 'The token with its secret', schema: CreatedApiToken },
  },
  { method: 'DELETE', path: '/api/tokens/:id', tag: 'API tokens', auth: 'user', summary: 'Revoke one of your tokens', response: noContent },

  { method: 'GET', path: '/api/admin/users', tag: 'Administration', auth: 'admin', summary: 'Every account with its group count', response: { status: 200, description: 'Accounts', contentType: 'application/json' } },
  { method: 'PATCH', path: '/api/admin/users/:id', tag: 'Administration', auth: 'admin', summary: 'Grant or withdraw the site administrator flag', response: { status: 200, description: 'The account id and its flag', contentType: 'application/json' } },
  { method: 'GET', path: '/api/admin/held-mail', tag: 'Administration', auth: 'admin', summary: 'Mail held by the in-process catcher when no SMTP server is set', response: { status: 200, description: 'Held messages', contentType: 'application/json' } },
  { method: 'DELETE', path: '/api/admin/held-mail', tag: 'Administration', auth: 'admin', summary: 'Empty the held mail', response: noContent },
  { method: 'GET', path: '/api/queue', tag: 'Administration', auth: 'admin', summary: 'Queue depth, workers and their runs', response: { status: 200, description: 'Queue status', schema: QueueStatus } },
  {
    method: 'GET',
    path: '/api/queue/activity',
    tag: 'Administration',
    auth: 'admin',
    summary: 'Queue depth and busy solver threads over the last hour (sampled every 30 s), and each worker with the runs it has finished',
    response: { status: 200, description: 'Samples, oldest first, and workers seen in the last minute', schema: QueueActivity },
  },
]

