// The cost observations of finished runs (table run_costs): written by the worker when a run succeeds, read
// by the speed calibration (speed-calibration.ts).
import { hostname, loadavg } from 'node:os'
import type { Pool } from 'pg'
import { KernelClass, kernelKey } from '@shared/physics/kernel-class'
import type { CostObservation } from './speed-calibration'
import { MAX_RUNS } from './speed-calibration'

/** Observations older than this say little about today's machine. */
export const OBSERVATION_MAX_AGE_DAYS = 30
/** Rows read per class: more than MAX_RUNS, since short or paused runs among them are left out. */
const ROWS_PER_KERNEL = 2 * MAX_RUNS

export interface NewRunCost {
  runId: string
  kernel: KernelClass
  cellUpdates: number
  envelopeRatio: number
  wallS: number
  cpuS: number | null
}

export async function insertRunCost(pool: Pool, c: NewRunCost): Promise<void> {
  await pool.query(
    `insert into run_costs (run_id, kernel, engine, path, threads, cell_updates, envelope_ratio, wall_s, cpu_s, load_avg, host)
     values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11)`,
    [c.runId, kernelKey(c.kernel), c.kernel.engine, c.kernel.path, c.kernel.threads, c.cellUpdates, c.envelopeRatio, c.wallS, c.cpuS, loadavg()[0], hostname()],
  )
}

/** The newest observations of every class (rows of an unknown class, from another solver version, are skipped). */
export async function recentRunCosts(pool: Pool): Promise<CostObservation[]> {
  const { rows } = await pool.query<{ engine: string; path: string; threads: number; cell_updates: number; envelope_ratio: number; wall_s: number; cpu_s: number | null; created_at: Date }>(
    `select engine, path, threads, cell_updates, envelope_ratio, wall_s, cpu_s, created_at from (
       select *, row_number() over (partition by kernel order by created_at desc, id desc) as rank
       from run_costs where created_at > now() - make_interval(days => $1)
     ) r where rank <= $2`,
    [OBSERVATION_MAX_AGE_DAYS, ROWS_PER_KERNEL],
  )
  return rows.flatMap((r) => {
    const kernel = KernelClass.safeParse({ engine: r.engine, path: r.path, threads: r.threads })
    if (!kernel.success) return []
    return [{ kernel: kernel.data, cellUpdates: Number(r.cell_updates), envelopeRatio: Number(r.envelope_ratio), wallS: Number(r.wall_s), cpuS: r.cpu_s === null ? null : Number(r.cpu_s), at: r.created_at }]
  })
}
