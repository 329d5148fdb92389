// Shared set-up of the worker benchmarks: a throwaway migrated database with one editor of the Halden
// group, pg-boss for submitting, and worker processes started with `npm run worker`'s entry.
import { spawn, type ChildProcess } from 'node:child_process'
import { createDb as createDatabase, databaseUrl, dropDb, start, testDatabaseName } from '../scripts/db.mjs'
import { migrateDatabase } from '../server/db/migrate'
import { createDb, createPool } from '../server/db/client'
import { groups, memberships, users } from '../server/db/schema'
import { createLogger } from '../server/logger'
import { startJobService } from '../server/jobs/job-service'
import { createRun } from '../server/modules/runs/runs.service'
import { chipConfig, gaussian } from '../tests/solver/chip-fixtures'

/** The "Halden test rib" chip with a Gaussian pump and a weak CW Stokes seed; cost grows as windowNs/Δt². */
export function benchConfig(windowNs: number, timeStepPs = 0.5) {
  return chipConfig({
    windowNs,
    channels: [{ pump: { pulses: [gaussian(1, windowNs / 3, 0.3)], backgroundPowerW: 0 }, stokes: { pulses: [], backgroundPowerW: 0.001 } }],
    grid: { timeStepPs, mapRows: 64, mapCols: 64, mapReduction: 'max' },
  })
}

export async function benchSetup() {
  await start(undefined, { quiet: true, database: null })
  const name = testDatabaseName()
  createDatabase(name)
  const url = databaseUrl(name)
  await migrateDatabase(url)
  const pool = createPool(url, { max: 6 })
  const db = createDb(pool)
  const log = createLogger('silent')
  const jobs = await startJobService({ databaseUrl: url, pool, log, threads: 0, watchdog: false })
  const [user] = await db.insert(users).values({ email: 'tomas.reyes@halden.example', name: 'Tomas Reyes', passwordHash: 'x' }).returning()
  const [group] = await db.insert(groups).values({ name: 'Halden Acousto-Optics Lab', slug: 'halden' }).returning()
  await db.insert(memberships).values({ userId: user.id, groupId: group.id, role: 'editor' })
  const auth = { userId: user.id, email: user.email, isAdmin: false, via: 'token' as const }

  return {
    url,
    pool,
    db,
    log,
    jobs,
    group,
    auth,
    submit: async (title: string, config: ReturnType<typeof benchConfig>) =>
      (await createRun({ db, pool, boss: jobs.boss, log }, auth, { groupId: group.id, title, notes: '', config })).run.id,
    spawnWorker: (args: string[] = []): Promise<ChildProcess> => {
      const child = spawn(process.execPath, ['--import', 'tsx', 'server/jobs/worker-main.ts', '--threads', '1', ...args], {
        env: { ...process.env, DATABASE_URL: url, LOG_LEVEL: 'warn' },
        stdio: ['ignore', 'pipe', 'inherit'],
      })
      return new Promise((resolve, reject) => {
        let out = ''
        child.stdout!.on('data', (d) => {
          out += d
          if (out.includes('taking runs')) resolve(child)
        })
        child.on('exit', (code) => reject(new Error(`worker exited with ${code}`)))
      })
    },
    stopWorker: (p: ChildProcess) => new Promise((r) => (p.exitCode !== null || p.signalCode !== null ? r(null) : (p.once('exit', r), p.kill('SIGTERM')))),
    close: async () => {
      await jobs.stop()
      await pool.end()
      dropDb(name)
    },
  }
}
