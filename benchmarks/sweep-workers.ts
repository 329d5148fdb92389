// `node --import tsx benchmarks/sweep-workers.ts [points] [windowNs]`: a sweep of `points` runs (the write
// pulse's peak power over a linear range) drained by one and then by two worker processes (one solver thread
// each), fed through the sweep feeder as in production. Prints wall time per case and the ratio; a throwaway
// database is created and dropped. Not a test: benchmarks/README.md records the figures.
import { spawn, type ChildProcess } from 'node:child_process'
import { availableParallelism, loadavg } from 'node:os'
import { createDb as createDatabase, databaseUrl, dropDb, start, testDatabaseName } from '../scripts/db.mjs'
import { migrateDatabase } from '../server/db/migrate'
import { createDb, createPool } from '../server/db/client'
import { groups, memberships, users } from '../server/db/schema'
import { createLogger } from '../server/logger'
import { startJobService } from '../server/jobs/job-service'
import { startSweeps } from '../server/modules/sweeps'
import { createSweep } from '../server/modules/sweeps/sweeps.service'
import { benchConfig } from './workers-setup'

const POINTS = Number(process.argv[2] ?? 32)
const WINDOW_NS = Number(process.argv[3] ?? 20)
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ')

await start(undefined, { quiet: true, database: null })
const name = testDatabaseName()
createDatabase(name)
const url = databaseUrl(name)
await migrateDatabase(url)
const pool = createPool(url, { max: 8 })
const db = createDb(pool)
const log = createLogger('silent')
const jobs = await startJobService({ databaseUrl: url, pool, log, threads: 0, watchdog: false })
const sweeps = await startSweeps({ db, pool, log, boss: jobs.boss, mail: false })
const [user] = await db.insert(users).values({ email: 'ingrid.solvang@halden.example', name: 'Ingrid Solvang', passwordHash: 'x' }).returning()
const [group] = await db.insert(groups).values({ name: 'Halden Acousto-Optics Lab', slug: 'halden' }).returning()
await db.insert(memberships).values({ userId: user.id, groupId: group.id, role: 'owner' })
const auth = { userId: user.id, email: user.email, isAdmin: false, via: 'token' as const }
const deps = { db, pool, boss: jobs.boss, log, feeder: sweeps.feeder }

const base = benchConfig(WINDOW_NS)
base.channels[0].pump.pulses[0].label = 'write'

function spawnWorker(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/jobs/worker-main.ts', '--threads', '1'], {
    env: { ...process.env, DATABASE_URL: url, LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  return new Promise((resolve, reject) => {
    let out = ''
    child.stdout!.on('data', (d) => ((out += d), out.includes('taking runs') && resolve(child)))
    child.on('exit', (code) => reject(new Error(`worker exited with ${code}`)))
  })
}
const stopWorker = (p: ChildProcess) => new Promise((r) => (p.exitCode !== null || p.signalCode !== null ? r(null) : (p.once('exit', r), p.kill('SIGTERM'))))

async function drain(workerCount: number): Promise<{ seconds: number; solverS: number }> {
  const procs = await Promise.all(Array.from({ length: workerCount }, spawnWorker))
  // Let the workers table show them, so the feeder's depth matches the threads.
  await new Promise((r) => setTimeout(r, 500))
  const t0 = performance.now()
  const sweep = await createSweep(deps, auth, {
    groupId: group.id,
    title: `${POINTS} points, ${workerCount} worker(s)`,
    notes: '',
    baseConfig: base,
    axes: [{ field: 'pulsePeakPowerW', pulseLabel: 'write', values: { kind: 'linear', start: 0.25, stop: 0.25 * POINTS, count: POINTS } }],
  })
  for (;;) {
    const { rows } = await pool.query(`select status from sweeps where id = $1`, [sweep.id])
    if (rows[0].status !== 'running') break
    await new Promise((r) => setTimeout(r, 100))
  }
  const seconds = (performance.now() - t0) / 1000
  const { rows } = await pool.query(
    `select count(*) filter (where status = 'succeeded')::int as ok, sum((figures->>'wallTimeS')::float) as solver_s from runs where sweep_id = $1`,
    [sweep.id],
  )
  if (rows[0].ok !== POINTS) throw new Error(`only ${rows[0].ok} of ${POINTS} points succeeded`)
  await Promise.all(procs.map(stopWorker))
  return { seconds, solverS: Number(rows[0].solver_s) }
}

try {
  const cu = (await import('../shared/resource-estimate')).estimateResources(base, (await import('../shared/grid-step')).chooseGrid(base)).cellUpdates
  console.log(`sweep: ${POINTS} points of ${WINDOW_NS} ns at 0.5 ps on the 5 cm chip (${cu.toPrecision(3)} cell-updates each); ${availableParallelism()} cores, load ${load()}`)
  const one = await drain(1)
  console.log(`1 worker : ${one.seconds.toFixed(1)} s wall (solver time summed over points ${one.solverS.toFixed(1)} s)`)
  const two = await drain(2)
  console.log(`2 workers: ${two.seconds.toFixed(1)} s wall (solver time summed over points ${two.solverS.toFixed(1)} s)`)
  console.log(`ratio (1 worker / 2 workers): ${(one.seconds / two.seconds).toFixed(2)}; load after ${load()}`)
} finally {
  await sweeps.stop()
  await jobs.stop()
  await pool.end()
  dropDb(name)
}
