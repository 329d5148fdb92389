import { createHash, randomBytes } from 'node:crypto'

/**
 * Random secrets that travel in links and headers. 32 bytes (256 bits) of randomness cannot be
 * guessed; the database keeps only the SHA-256, so a leaked table grants nothing. A fast hash is
 * enough here (unlike passwords) because the input is already high-entropy.
 */
export function newSecretToken(prefix = ''): { token: string; hash: string } {
  const token = `${prefix}${randomBytes(32).toString('base64url')}`
  return { token, hash: hashSecretToken(token) }
}

export function hashSecretToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}
