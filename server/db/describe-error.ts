/** Turns a pg connection failure into one sentence that says what to change. */
export function describeDbError(err: unknown, databaseUrl: string): string {
  // Drizzle wraps the driver's error ("Failed query: …") and keeps the real one as `cause`.
  let e = err as { code?: string; message?: string; cause?: unknown }
  while (!e.code && e.cause) e = e.cause as typeof e
  let where = 'the database'
  try {
    const u = new URL(databaseUrl)
    where = `${u.hostname}:${u.port || 5432}${u.pathname}`
  } catch {
    /* the env check reports malformed URLs */
  }
  switch (e.code) {
    case 'ECONNREFUSED':
      return `nothing accepts connections at ${where}; start PostgreSQL (npm run db:start) or fix DATABASE_URL`
    case 'ENOTFOUND':
    case 'EAI_AGAIN':
      return `the host in DATABASE_URL (${where}) does not resolve; fix DATABASE_URL`
    case '3D000':
      return `database ${where} does not exist; create it or fix the name in DATABASE_URL`
    case '28P01':
    case '28000':
      return `PostgreSQL at ${where} rejected the credentials; fix the user/password in DATABASE_URL`
    default:
      return `${e.message ?? String(err)} (DATABASE_URL points at ${where})`
  }
}
