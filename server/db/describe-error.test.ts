import { describe, expect, it } from 'vitest'
import { createDb, createPool } from './client'
import { migrateDatabase } from './migrate'
import { describeDbError } from './describe-error'

async function errorFrom(url: string, viaDrizzle = false): Promise<unknown> {
  if (viaDrizzle) return migrateDatabase(url).then(() => null, (e: unknown) => e)
  const pool = createPool(url, { max: 1 })
  try {
    await createDb(pool).execute('select 1')
    return null
  } catch (err) {
    return err
  } finally {
    await pool.end()
  }
}

describe('describeDbError', () => {
  it('says nothing is listening, and what to do, for a refused connection (also through Drizzle)', async () => {
    const url = 'postgres://postgres@127.0.0.1:1/sonoweave'
    for (const viaDrizzle of [false, true]) {
      expect(describeDbError(await errorFrom(url, viaDrizzle), url)).toBe(
        'nothing accepts connections at 127.0.0.1:1/sonoweave; start PostgreSQL (npm run db:start) or fix DATABASE_URL',
      )
    }
  })

  it('names a missing database', async () => {
    const url = new URL(process.env.TEST_DATABASE_URL as string)
    url.pathname = '/no_such_database_here'
    const msg = describeDbError(await errorFrom(url.href), url.href)
    expect(msg).toMatch(/^database .*\/no_such_database_here does not exist; create it or fix the name in DATABASE_URL$/)
  })
})
