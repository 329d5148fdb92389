import type { Logger } from '../../logger'

// Work a request starts but does not wait for, so its answer takes the same time whatever the work
// finds (a reset for an unknown address must not answer faster than one that mails a link).
const pending = new Set<Promise<void>>()

/** Runs `work` once the current response is on its way; a failure is logged, never answered. */
export function afterResponse(log: Logger, what: string, work: () => Promise<unknown>): void {
  const done: Promise<void> = new Promise<void>((resolve) => setImmediate(resolve))
    .then(work)
    .then(
      () => undefined,
      (err: unknown) => log.error({ err }, `${what} failed`),
    )
    .finally(() => pending.delete(done))
  pending.add(done)
}

/** Resolves when every piece of deferred work (including work started meanwhile) has finished. */
export async function settleAfterResponse(): Promise<void> {
  while (pending.size > 0) await Promise.all([...pending])
}
