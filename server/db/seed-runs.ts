// Demo runs: on first start, the examples in solver/examples are queued as runs of the demo group, authored
// by the demo editor, so the worker computes them and a new user opens real maps at once. Only when the
// group has no runs at all: a group that deleted or made its own runs is left alone.
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { Logger } from '../logger'
import { createRun } from '../modules/runs/runs.service'
import type { Db } from './client'
import { groups, users } from './schema'
import { DEMO_ACCOUNTS, DEMO_GROUP } from './seed'

export const EXAMPLES_DIR = fileURLToPath(new URL('../../solver/examples', import.meta.url))

/** Titles of our own for the example files; a file not listed gets one from its name. */
const TITLES: Record<string, string> = {
  'store-and-retrieve-chalcogenide-rib': 'Store and retrieve, R7 rib',
  'store-refresh-retrieve-chalcogenide-rib': 'Store, refresh and retrieve, R7 rib',
  'storage-150ps-svea': 'Storage of a 150 ps pulse (envelope model)',
  'storage-150ps-higher-order': 'Storage of a 150 ps pulse (second-order acoustics)',
  'pulsed-pump-depletion-chalcogenide-rib': 'Pulsed pump depletion, R7 rib',
  'cw-amplifier-silica-fibre': 'CW amplifier, 50 m silica fibre',
}

const titleOf = (stem: string) => TITLES[stem] ?? stem.replace(/-/g, ' ').replace(/^./, (c) => c.toUpperCase())

export interface SeedRunsDeps {
  db: Db
  pool: Pool
  boss: PgBoss
  log: Logger
}

/** Queues the demo runs for the demo group, authored by the demo editor; returns how many were queued. */
export async function seedDemoRuns(deps: SeedRunsDeps, dir = EXAMPLES_DIR): Promise<number> {
  const [group] = await deps.db.select().from(groups).where(sql`${groups.slug} = ${DEMO_GROUP.slug}`)
  const editor = DEMO_ACCOUNTS.find((a) => a.role === 'editor')!
  const [author] = await deps.db.select().from(users).where(sql`lower(${users.email}) = lower(${editor.email})`)
  if (!group || !author) return 0
  return queueExampleRuns(deps, group.id, { userId: author.id, email: author.email, isAdmin: author.isAdmin }, dir)
}

/** Queues every example of `dir` once, in file-name order, when the group has no runs yet. */
export async function queueExampleRuns(deps: SeedRunsDeps, groupId: string, author: { userId: string; email: string; isAdmin: boolean }, dir = EXAMPLES_DIR): Promise<number> {
  const { rows } = await deps.pool.query(`select count(*)::int as n from runs where group_id = $1`, [groupId])
  if (rows[0].n > 0) return 0
  const auth = { ...author, via: 'session' as const }
  let queued = 0
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.json')).sort()) {
    const stem = file.replace(/\.json$/, '')
    const parsed = SimulationConfig.safeParse(JSON.parse(readFileSync(join(dir, file), 'utf8')))
    if (!parsed.success) {
      deps.log.warn({ file, issues: parsed.error.issues }, 'demo example does not parse; skipped')
      continue
    }
    await createRun(deps, auth, { groupId, title: titleOf(stem), notes: `Demo run of the example ${file}.`, config: parsed.data })
    queued++
  }
  return queued
}

// `node --import tsx server/db/seed-runs.ts`: queue the demo runs when the demo group has none.
if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const { loadDatabaseUrl, loadLogLevel } = await import('../env')
  const { createDb, createPool } = await import('./client')
  const { createBoss, declareQueues } = await import('../jobs/queues')
  const { createLogger } = await import('../logger')
  const { describeDbError } = await import('./describe-error')
  const url = loadDatabaseUrl()
  const pool = createPool(url, { max: 2, applicationName: 'sonoweave-seed-runs' })
  const boss = createBoss({ databaseUrl: url, applicationName: 'sonoweave-seed-runs', max: 2 })
  const log = createLogger(loadLogLevel())
  boss.on('error', (err) => log.error({ err }, 'queue error'))
  try {
    await boss.start()
    await declareQueues(boss)
    const n = await seedDemoRuns({ db: createDb(pool), pool, boss, log })
    console.log(n ? `db: ${n} demo runs queued (the worker computes them after start)` : 'db: demo runs already present')
  } catch (err) {
    console.error(`db: queuing the demo runs failed: ${describeDbError(err, url)}`)
    process.exitCode = 1
  } finally {
    await boss.stop({ graceful: false, wait: true }).catch(() => {})
    await pool.end()
  }
}
