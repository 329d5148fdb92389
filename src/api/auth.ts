import { AcceptedMessage, MeResponse, MeUser, type ChangeEmailBody, type ChangePasswordBody, type SignUpBody, type UpdateMeBody } from '@shared/api/auth'
import { z } from 'zod'
import { api } from './client'

const SignedIn = z.object({ user: MeUser })
const Ok = z.object({ ok: z.literal(true), message: z.string() })

export const signUp = (body: SignUpBody) => api.post('/auth/sign-up', body, { schema: AcceptedMessage })
export const signIn = (email: string, password: string) => api.post('/auth/sign-in', { email, password }, { schema: SignedIn })
export const signOut = () => api.post('/auth/sign-out')
export const confirmEmail = (token: string) => api.post('/auth/confirm-email', { token }, { schema: Ok })
export const resendConfirmation = () => api.post('/auth/resend-confirmation', undefined, { schema: AcceptedMessage })
export const requestPasswordReset = (email: string) => api.post('/auth/password-reset/request', { email }, { schema: AcceptedMessage })
export const completePasswordReset = (token: string, password: string) =>
  api.post('/auth/password-reset/complete', { token, password }, { schema: Ok })
export const changePassword = (body: ChangePasswordBody) => api.post('/me/password', body, { schema: AcceptedMessage })
export const changeEmail = (body: ChangeEmailBody) => api.post('/me/email', body, { schema: AcceptedMessage })
export const updateMe = (body: UpdateMeBody) => api.patch('/me', body, { schema: MeResponse })

const HeldMail = z.object({
  id: z.string(),
  receivedAt: z.string(),
  recipients: z.array(z.string()),
  subject: z.string(),
  from: z.string(),
  text: z.string(),
  masked: z.boolean(),
})
export type HeldMail = z.infer<typeof HeldMail>
export const listHeldMail = () => api.get('/admin/held-mail', { schema: z.object({ catching: z.boolean(), messages: z.array(HeldMail) }) })
export const clearHeldMail = () => api.delete('/admin/held-mail')
