import type { Request } from 'express'
import type { AuthOptions } from './auth-options'

/**
 * Absolute link to a client page for mail. The configured origin wins; otherwise the request's own
 * (trusted only from a loopback proxy, see app 'trust proxy'), which is right for dev and tests.
 */
export function appLink(opts: AuthOptions, req: Request, path: string, token: string): string {
  const origin = opts.appUrl ?? `${req.protocol}://${req.get('host')}`
  return `${origin}${path}?token=${encodeURIComponent(token)}`
}
