// Types for scripts/supervise.mjs, which stays plain JavaScript like the other scripts.
import type { ChildProcess } from 'node:child_process'
export declare const SUPERVISE_DEFAULTS: { maxCrashes: number; windowMs: number; firstDelayMs: number; maxDelayMs: number }
export interface SuperviseOptions extends Partial<typeof SUPERVISE_DEFAULTS> {
  spawnChild: () => ChildProcess
  name?: string
  log?: (line: string) => void
}
export interface Supervisor {
  /** The exit code the supervisor should end with. */
  done: Promise<number>
  stop: (signal?: NodeJS.Signals) => void
  readonly pid: number | null
}
export declare function supervise(o: SuperviseOptions): Supervisor
