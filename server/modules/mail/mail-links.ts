// Every link in a mail is absolute: a mail client has no page to resolve "/runs/…" against.
// Routes know the request's host; a worker does not, so it falls back on the configured listener.

import { serviceAddressEnv } from '../../env'

/** The origin links in mail point at: PUBLIC_URL, else the server's own HOST:PORT. */
export function configuredOrigin(env: ReturnType<typeof serviceAddressEnv> = serviceAddressEnv()): string {
  const publicUrl = env.PUBLIC_URL?.trim().replace(/\/+$/, '')
  if (publicUrl) return publicUrl
  const host = env.HOST && env.HOST !== '0.0.0.0' && env.HOST !== '::' ? env.HOST : 'localhost'
  const port = env.PORT || '3001'
  return `http://${host.includes(':') ? `[${host}]` : host}:${port}`
}

/** A path (/runs/…) made absolute against `origin`; an absolute URL is left as it is. */
export function absoluteLink(pathOrUrl: string, origin: string = configuredOrigin()): string {
  if (/^https?:\/\//i.test(pathOrUrl)) return pathOrUrl
  return `${origin.replace(/\/+$/, '')}/${pathOrUrl.replace(/^\/+/, '')}`
}
