// The fit queue's policy, declared once. A fit is CPU work of minutes (each Levenberg–Marquardt step is
// several solver runs), so it has its own queue: fits never wait behind, or block, simulation runs.
import type PgBoss from 'pg-boss'

export const FIT_QUEUE = 'trace-fits'

export const FIT_QUEUE_OPTIONS = {
  // Also pg-boss 10's hard runtime limit (docs/stack.md §6): far above the 100-iteration cap on the small
  // grids fits use; a worker lost mid-fit has its fit retried after this.
  expireInSeconds: 6 * 3600,
  retryLimit: 1,
  retryDelay: 5,
  retentionDays: 7,
} as const

let declared: WeakMap<PgBoss, Promise<void>> = new WeakMap()

/** Creates the queue when missing and applies the policy when it exists; once per pg-boss instance. */
export function declareFitQueue(boss: PgBoss): Promise<void> {
  let p = declared.get(boss)
  if (!p) {
    p = (async () => {
      await boss.createQueue(FIT_QUEUE, { name: FIT_QUEUE, ...FIT_QUEUE_OPTIONS })
      await boss.updateQueue(FIT_QUEUE, { name: FIT_QUEUE, ...FIT_QUEUE_OPTIONS })
    })()
    p.catch(() => declared.delete(boss))
    declared.set(boss, p)
  }
  return p
}

/** For tests that restart pg-boss on a fresh schema. */
export function forgetDeclaredQueues(): void {
  declared = new WeakMap()
}
