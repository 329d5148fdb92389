// Builders for the sweep tests: a tiny chip run (4 ns window, 4 ps step: ~10⁵ cell-updates, well under a
// second of solver time) whose labelled pump pulse and CW Stokes seed the sweeps vary.
import type { Router } from 'express'
import type { SweepCreateInput } from '@shared/api/sweeps'
import type PgBoss from 'pg-boss'
import type { Db, Pool } from '../../server/db/client'
import { startSweeps, type SweepsModule } from '../../server/modules/sweeps'
import { chipConfig, gaussian } from '../solver/chip-fixtures'
import { silentLog } from './helpers'

export function tinySweepBase(windowNs = 4, timeStepPs = 4) {
  return chipConfig({
    windowNs,
    channels: [{ pump: { pulses: [gaussian(1, windowNs / 3, 0.3, 'write')], backgroundPowerW: 0 }, stokes: { pulses: [], backgroundPowerW: 0.001 } }],
    grid: { timeStepPs, mapRows: 16, mapCols: 16, mapReduction: 'max' },
    energyWindows: [{ label: 'late Stokes', port: 'stokesOut', startNs: windowNs / 2, endNs: windowNs }],
  })
}

/** A 1-D sweep of the write pulse's peak power over `n` values from 0.5 W up. */
export function powerSweep(groupId: string, title: string, n: number, base = tinySweepBase()): SweepCreateInput {
  return { groupId, title, baseConfig: base, axes: [{ field: 'pulsePeakPowerW', pulseLabel: 'write', values: { kind: 'linear', start: 0.5, stop: 0.5 * n, count: n } }] }
}

/** The sweeps module (routes + feeder) on the test's pg-boss. Stop it in an afterAll registered at the file's top level. */
export async function sweepsForTest(db: Db, pool: Pool, boss: PgBoss, o: { mail?: boolean; feedIntervalMs?: number } = {}): Promise<{ module: SweepsModule; routes: Array<[string, Router]> }> {
  const module = await startSweeps({ db, pool, log: silentLog, boss, mail: o.mail ?? false, feedIntervalMs: o.feedIntervalMs })
  return { module, routes: [['/sweeps', module.routes]] }
}
