import { createHash } from 'node:crypto'

/** JSON with object keys sorted at every level, so equal configs serialise identically. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`
  }
  return JSON.stringify(value)
}

/** sha256 (hex) of the canonical JSON of a parsed config: the "same experiment" fingerprint. */
export function configHash(config: unknown): string {
  return createHash('sha256').update(canonicalJson(config)).digest('hex')
}
