import type { ApiTokenCreateBody, ApiTokenSummary, CreatedApiToken } from '@shared/api/auth'
import type { Db } from '../../db/client'
import type { ApiToken } from '../../db/schema'
import { notFound } from '../../errors'
import { newSecretToken } from '../auth/secret-token'
import { insertToken, listTokens, revokeToken } from './tokens.repo'

/** Recognisable in a leaked-secret scan and in a script's config. */
export const API_TOKEN_PREFIX = 'swt_'
const SHOWN_PREFIX_CHARS = API_TOKEN_PREFIX.length + 6

function toSummary(t: ApiToken): ApiTokenSummary {
  return {
    id: t.id,
    name: t.name,
    tokenPrefix: t.tokenPrefix,
    createdAt: t.createdAt.toISOString(),
    expiresAt: t.expiresAt?.toISOString() ?? null,
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
  }
}

export async function createToken(db: Db, userId: string, body: ApiTokenCreateBody): Promise<CreatedApiToken> {
  const { token, hash } = newSecretToken(API_TOKEN_PREFIX)
  const expiresAt = body.expiresInDays ? new Date(Date.now() + body.expiresInDays * 86_400_000) : null
  const row = await insertToken(db, { userId, name: body.name, tokenHash: hash, tokenPrefix: token.slice(0, SHOWN_PREFIX_CHARS), expiresAt })
  return { ...toSummary(row), token }
}

export async function listMyTokens(db: Db, userId: string): Promise<ApiTokenSummary[]> {
  return (await listTokens(db, userId)).map(toSummary)
}

/** Someone else's token id is "not found", like an unknown one. */
export async function revokeMyToken(db: Db, userId: string, tokenId: string): Promise<void> {
  if (!(await revokeToken(db, userId, tokenId))) throw notFound('API token')
}
