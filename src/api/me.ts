import { z } from 'zod'
import { api, ApiError } from './client'

// Client-side reading of GET /api/me until the accounts work puts the response schema in shared/
// (then import it from there and delete this one). Unknown extra fields are ignored on purpose.
export const GroupRole = z.enum(['owner', 'editor', 'viewer'])
export type GroupRole = z.infer<typeof GroupRole>

export const Membership = z.object({
  groupId: z.string(),
  groupName: z.string(),
  role: GroupRole,
})
export type Membership = z.infer<typeof Membership>

export const MeUser = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string().optional(),
  isAdmin: z.boolean().default(false),
})
export type MeUser = z.infer<typeof MeUser>

export const MeResponse = z.object({
  user: MeUser,
  memberships: z.array(Membership).default([]),
  currentGroupId: z.string().nullable().optional(),
})
export type MeResponse = z.infer<typeof MeResponse>

/** The signed-in user, or null when nobody is (401) or the route does not exist yet (404). */
export async function fetchMe(): Promise<MeResponse | null> {
  try {
    return await api.get('/me', { schema: MeResponse })
  } catch (e) {
    if (e instanceof ApiError && (e.status === 401 || e.status === 404)) return null
    throw e
  }
}

export const signIn = (email: string, password: string) => api.post('/auth/sign-in', { email, password })
export const signOut = () => api.post('/auth/sign-out')
