const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** Ids from URLs reach uuid columns only when well formed; anything else is simply "not found". */
export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID.test(value)
}
