// The calibration every estimate of this server uses: built from the database on each request (one indexed
// query over a few rows per class), so a run that just finished counts at once.
import type { Pool } from 'pg'
import type { SpeedCalibration } from '@shared/physics/speed-calibration'
import type { Logger } from '../../logger'
import { solverEngine } from '../../env'
import { recentRunCosts } from './run-costs.repo'
import { calibrate } from './speed-calibration'

/** This server's measured speeds; without them (the query failed) the estimate takes the benchmark figures. */
export async function loadSpeedCalibration(pool: Pool, log?: Logger): Promise<SpeedCalibration | null> {
  try {
    // The engine the solver threads are set to decides which class a run will be (SOLVER_ENGINE).
    return { ...calibrate(await recentRunCosts(pool)), engine: solverEngine() }
  } catch (err) {
    log?.warn({ err }, 'speed calibration unavailable; estimates use the benchmark figures')
    return null
  }
}
