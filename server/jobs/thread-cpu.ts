// CPU time of the calling thread, for the cost observations of finished runs (modules/estimates/): beside the
// wall time it tells a run that computed slowly from one that waited for a core. Node 20 gives only the
// process's total (process.cpuUsage counts every thread), so it is read from Linux's per-thread stat file.
import { readFileSync } from 'node:fs'

/** The unit of the CPU times in /proc: USER_HZ, fixed at 100 per second on Linux (proc(5), common practice). */
const TICKS_PER_S = 100

/** User plus system CPU seconds of this thread, or null where the system does not give them. */
export function threadCpuSeconds(): number | null {
  try {
    const stat = readFileSync('/proc/thread-self/stat', 'utf8')
    // The command name (field 2) may hold spaces; fields from 3 on follow its closing parenthesis.
    const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
    // utime and stime are fields 14 and 15 (proc(5)): indices 11 and 12 counted from field 3.
    const ticks = Number(rest[11]) + Number(rest[12])
    return Number.isFinite(ticks) ? ticks / TICKS_PER_S : null
  } catch {
    return null
  }
}
