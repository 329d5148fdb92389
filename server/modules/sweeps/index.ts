// The sweeps module's public door: its routes and the feeder, started together by the API process.
// Wiring (server/index.ts): const sweeps = await startSweeps({ db, pool, log, boss: jobs.boss });
// mount sweeps.routes at /sweeps and stop sweeps.stop on shutdown.
import type { Router } from 'express'
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import type { SweepLimits } from '@shared/physics/sweep-points'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import type { QuotaConfig } from '../quotas'
import { startSweepFeeder, type SweepFeeder } from './sweep-feeder'
import { sweepsRoutes } from './sweeps.routes'

export interface SweepsModule {
  routes: Router
  feeder: SweepFeeder
  stop: () => Promise<void>
}

export async function startSweeps(o: { db: Db; pool: Pool; log: Logger; boss: PgBoss; limits?: SweepLimits; quotas?: QuotaConfig; feedIntervalMs?: number; mail?: boolean }): Promise<SweepsModule> {
  const feeder = await startSweepFeeder({ pool: o.pool, db: o.db, boss: o.boss, log: o.log, intervalMs: o.feedIntervalMs, mail: o.mail })
  return { routes: sweepsRoutes({ ...o, feeder }), feeder, stop: () => feeder.stop() }
}

export { feedSweeps, SWEEP_POINT_PRIORITY } from './sweep-feeder'
