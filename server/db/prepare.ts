// `node --import tsx server/db/prepare.ts [--seed]`: migrations, then (optionally) the demo seed, in
// one process, so start-up pays for one TypeScript loader instead of two.
import { createDb, createPool } from './client'
import { describeDbError } from './describe-error'
import { migrateDatabase } from './migrate'
import { seedDemo } from './seed'
import { loadDatabaseUrl } from '../env'

const url = loadDatabaseUrl()
let step = 'migration'
try {
  await migrateDatabase(url)
  console.log('db: migrations applied')
  if (process.argv.includes('--seed')) {
    step = 'seeding'
    const pool = createPool(url, { max: 1, applicationName: 'sonoweave-seed' })
    try {
      const { created } = await seedDemo(createDb(pool))
      console.log(created ? `db: demo workspace seeded (${created} accounts)` : 'db: demo workspace already present')
    } finally {
      await pool.end()
    }
  }
} catch (err) {
  console.error(`db: ${step} failed: ${describeDbError(err, url)}`)
  process.exit(1)
}
