// Fair order of single runs across users, fixed at the moment a run is queued.
//
// Why: pg-boss 10 fetches `priority desc, created_on`, so with one priority for every single run the queue is
// first come, first served: one user's burst of 50 runs holds every other group's run until the burst is done.
// The sweep feeder (modules/sweeps/sweep-feeder.ts) solves this for sweep points by holding them back and
// handing them over one at a time, fewest in flight first. Single runs keep their job from the moment they are
// stored (row and job in one transaction, and a run starts the instant a thread is free), so they get the same
// turn-taking from the priority instead, as start-time fair queueing does with its start tags:
//
//   rank = max(V, r_last + 1),   priority = SINGLE_RUN_PRIORITY − min(rank, MAX_SINGLE_RUN_RANK)
//
// V is the lowest rank among all waiting single runs (the front of the line; 0 when none waits) and r_last the
// highest rank among the author's own waiting runs (none: −∞). A burst of N runs takes ranks V … V+N−1; a run
// from someone with nothing waiting takes V and is fetched right after the run at the front, before the rest of
// the burst; two bursts interleave run by run. The r_last term keeps one author's runs first in, first out, and
// ranks start again from 0 whenever the line empties. Sweep points stay below every rank (queues.ts). Turns are
// per author, whatever the group; a group's share is bounded by its in-flight quota (modules/quotas).
import type { PoolClient } from 'pg'
import { MAX_SINGLE_RUN_RANK, SINGLE_RUN_PRIORITY } from './queues'

/** The rank a new single run of `authorId` takes (see above); call it in the transaction that stores the run. */
export async function nextSingleRunRank(c: PoolClient, authorId: string): Promise<number> {
  const { rows } = await c.query(
    `select min(queue_rank) as front, max(queue_rank) filter (where author_id = $1) as last_own
       from runs where status = 'queued' and sweep_id is null`,
    [authorId],
  )
  const front: number = rows[0].front ?? 0
  const lastOwn: number | null = rows[0].last_own
  return Math.min(MAX_SINGLE_RUN_RANK, Math.max(front, lastOwn === null ? 0 : lastOwn + 1))
}

/** The pg-boss priority of a single run of this rank. */
export const singleRunPriority = (rank: number): number => SINGLE_RUN_PRIORITY - Math.min(rank, MAX_SINGLE_RUN_RANK)
