import type { RequestHandler } from 'express'
import { rateLimit } from 'express-rate-limit'
import { AppError } from '../../errors'
import { ACCOUNT_LOCK_WINDOW_MS, type AuthOptions } from './auth-options'

function limited(message: string): RequestHandler {
  return (_req, _res, next) => next(new AppError('rate_limited', 429, message))
}

/**
 * Failed sign-ins per client address: the (limit+1)-th failure within a minute gets 429.
 * Successful sign-ins do not count, so a lab sharing one address is not locked out by its own
 * members. The store lives in this app instance (one process); several servers would need a
 * shared store.
 */
export function signInLimiter(opts: AuthOptions): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit: opts.signInFailuresPerMinute,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: limited('Too many failed sign-ins from your address; wait a minute and try again'),
  })
}

/**
 * Failed sign-ins per account, whatever address they come from: a guesser who spreads over many
 * addresses (or a botnet) still gets 20 tries per 15 minutes at one account. The key is the address
 * typed, lower-cased, whether or not an account has it, so a 429 tells nothing about who exists.
 * The cost: a stranger can hold one account's sign-in shut for 15 minutes; a reset still works.
 */
export function accountSignInLimiter(opts: AuthOptions): RequestHandler {
  return rateLimit({
    windowMs: ACCOUNT_LOCK_WINDOW_MS,
    limit: opts.signInFailuresPerAccount,
    skipSuccessfulRequests: true,
    // No address to count against: the body's validation answers 400.
    skip: (req) => typeof req.body?.email !== 'string',
    keyGenerator: (req) => `account:${String(req.body.email).trim().toLowerCase()}`,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: limited('Too many failed sign-ins for this account; wait 15 minutes and try again'),
  })
}

/** Sign-ups and mailed links (confirmation, reset) per client address and hour: keeps us from mailing strangers in bulk. */
export function mailRequestLimiter(opts: AuthOptions): RequestHandler {
  return rateLimit({
    windowMs: 3600_000,
    limit: opts.mailRequestsPerHour,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: limited('Too many requests from your address; try again later'),
  })
}

/**
 * Wrong current passwords (password or address change) per signed-in account: the same budget as
 * sign-in failures per account, so a stolen session cannot be used to guess the password faster.
 */
export function passwordCheckLimiter(opts: AuthOptions): RequestHandler {
  return rateLimit({
    windowMs: ACCOUNT_LOCK_WINDOW_MS,
    limit: opts.signInFailuresPerAccount,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `password-check:${req.auth?.userId ?? 'anonymous'}`,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: limited('Too many wrong passwords for this account; wait 15 minutes and try again'),
  })
}
