import { MeResponse } from '@shared/api/auth'
import { api, ApiError } from './client'

// The response schema lives in shared/api/auth.ts (the API answers with it); re-exported for old imports.
export { GroupRole, MeResponse, MeUser } from '@shared/api/auth'
export type { MeMembership as Membership } from '@shared/api/auth'

/** The signed-in user, or null when nobody is (401) or the route does not exist yet (404). */
export async function fetchMe(): Promise<MeResponse | null> {
  try {
    return await api.get('/me', { schema: MeResponse })
  } catch (e) {
    if (e instanceof ApiError && (e.status === 401 || e.status === 404)) return null
    throw e
  }
}

export { signIn, signOut } from './auth'
