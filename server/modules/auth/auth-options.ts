import { randomBytes } from 'node:crypto'
import { runtimeMode } from '../../env'

export interface AuthOptions {
  /** HS256 key for session cookies; at least 32 characters. */
  jwtSecret: string
  /** Absolute origin used in mailed links (https://sonoweave.example); taken from the request when absent. */
  appUrl?: string
  /** Failed sign-ins one address may make per minute before 429. */
  signInFailuresPerMinute: number
  /** Failed sign-ins one account may have per ACCOUNT_LOCK_WINDOW_MS, from any address, before 429. */
  signInFailuresPerAccount: number
  /** Sign-ups (and reset/confirmation mails) one address may ask for per hour. */
  mailRequestsPerHour: number
}

export const SESSION_COOKIE = 'sw_session'
/**
 * The per-account sign-in window: 20 failures per 15 minutes is at most 80 guesses an hour, under
 * OWASP ASVS 4.0 §2.2.1's ceiling of 100 failed attempts per hour per account (quoted from memory).
 */
export const ACCOUNT_LOCK_WINDOW_MS = 15 * 60_000
/** A session idle this long ends; each rotation pushes the end forward. */
export const SESSION_IDLE_MS = 7 * 24 * 3600_000
/** No session lives longer than this, however active (then sign in again). */
export const SESSION_ABSOLUTE_MS = 30 * 24 * 3600_000
/** A cookie older than this is replaced on the next request (new JWT, later expiry). */
export const SESSION_ROTATE_AFTER_MS = 3600_000
export const EMAIL_CONFIRMATION_TTL_MS = 3 * 24 * 3600_000
export const PASSWORD_RESET_TTL_MS = 3600_000
export const INVITATION_TTL_MS = 7 * 24 * 3600_000

// One secret per process when none is given: fine for tests and throwaway servers, and refused in
// production, where a restart would sign everybody out and several servers would disagree.
let processSecret: string | undefined

export function resolveAuthOptions(given: Partial<AuthOptions> | undefined): AuthOptions {
  let jwtSecret = given?.jwtSecret
  if (!jwtSecret) {
    if (runtimeMode() === 'production') throw new Error('auth: jwtSecret is required in production')
    processSecret ??= randomBytes(32).toString('hex')
    jwtSecret = processSecret
  }
  return {
    jwtSecret,
    appUrl: given?.appUrl?.replace(/\/+$/, ''),
    signInFailuresPerMinute: given?.signInFailuresPerMinute ?? 10,
    signInFailuresPerAccount: given?.signInFailuresPerAccount ?? 20,
    mailRequestsPerHour: given?.mailRequestsPerHour ?? 20,
  }
}
