// Closing a sweep: once no point is queued or running, the sweep is finished and its author gets one
// digest mail (unless their setting for sweep mail is off); its points send none of their own. The
// update that closes it also claims the mail, so with several feeders running only one sends it.
import type { Pool } from 'pg'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { notifyFinished } from '../mail/notify'
import { sweepDigestNotice } from '../mail/sweep-digest'
import { toSweepDetail } from './sweeps.mapper'
import { findSweep, pointRuns } from './sweeps.repo'

/** Marks every running sweep without queued or running points finished; mails each author once. */
export async function closeFinishedSweeps(pool: Pool, db: Db, log: Logger, o: { mail: boolean }): Promise<string[]> {
  const { rows } = await pool.query(
    `update sweeps s set status = 'finished', finished_at = now(), notified_at = now()
      where s.status = 'running' and not exists (select 1 from runs r where r.sweep_id = s.id and r.status in ('queued', 'running'))
      returning s.id, s.author_id`,
  )
  for (const r of rows) {
    if (!o.mail || !r.author_id) continue
    try {
      const sweep = await findSweep(pool, r.id)
      if (!sweep) continue
      await notifyFinished(db, r.author_id, 'sweep', sweepDigestNotice(toSweepDetail(sweep, await pointRuns(pool, r.id))))
    } catch (err) {
      log.warn({ err, sweepId: r.id }, 'sweep-finished mail failed')
    }
  }
  return rows.map((r) => r.id)
}
