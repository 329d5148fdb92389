/** The caller of a request, as established by the session cookie or an API token. */
export interface AuthContext {
  userId: string
  email: string
  isAdmin: boolean
  via: 'session' | 'token'
  /** The sessions row behind the cookie (via 'session'). */
  sessionId?: string
  /** The api_tokens row behind the Bearer header (via 'token'). */
  tokenId?: string
}
