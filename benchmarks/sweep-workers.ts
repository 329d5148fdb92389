// `node --import tsx benchmarks/sweep-workers.ts [points] [windowNs]`: a sweep of `points` runs (the write
// pulse's peak power over a linear range) drained by one and then by two worker processes (one solver thread
// each), fed through the sweep feeder as in production. Prints wall time per case and the ratio; a throwaway
// database is created and dropped. Not a test: benchmarks/README.md records the figures.
import { availableParallelism, loadavg } from 'node:os'
import { startSweeps } from '../server/modules/sweeps'
import { createSweep } from '../server/modules/sweeps/sweeps.service'
import { benchConfig, benchSetup } from './workers-setup'

const POINTS = Number(process.argv[2] ?? 32)
const WINDOW_NS = Number(process.argv[3] ?? 20)
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ')

const bench = await benchSetup()
const { db, pool, log, jobs, group, auth } = bench
const sweeps = await startSweeps({ db, pool, log, boss: jobs.boss, mail: false })
const deps = { db, pool, boss: jobs.boss, log, feeder: sweeps.feeder }

const base = benchConfig(WINDOW_NS)
base.channels[0].pump.pulses[0].label = 'write'

async function drain(workerCount: number): Promise<{ seconds: number; solverS: number }> {
  const procs = await Promise.all(Array.from({ length: workerCount }, () => bench.spawnWorker()))
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
  await Promise.all(procs.map(bench.stopWorker))
  return { seconds, solverS: Number(rows[0].solver_s) }
}

try {
  const cu = (await import('../shared/physics/resource-estimate')).estimateResources(base, (await import('../shared/physics/grid-step')).chooseGrid(base)).cellUpdates
  console.log(`sweep: ${POINTS} points of ${WINDOW_NS} ns at 0.5 ps on the 5 cm chip (${cu.toPrecision(3)} cell-updates each); ${availableParallelism()} cores, load ${load()}`)
  const one = await drain(1)
  console.log(`1 worker : ${one.seconds.toFixed(1)} s wall (solver time summed over points ${one.solverS.toFixed(1)} s)`)
  const two = await drain(2)
  console.log(`2 workers: ${two.seconds.toFixed(1)} s wall (solver time summed over points ${two.solverS.toFixed(1)} s)`)
  console.log(`ratio (1 worker / 2 workers): ${(one.seconds / two.seconds).toFixed(2)}; load after ${load()}`)
} finally {
  await sweeps.stop()
  await bench.close()
}
