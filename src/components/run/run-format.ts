// Small display rules shared by the run page, the runs list and the dashboard.
import type { RunState, RunSummary } from '@shared/api/runs'

export const STATUS_META: Record<RunState, { label: string; colour: string; icon: string }> = {
  queued: { label: 'Queued', colour: 'info', icon: 'mdi-timer-sand' },
  running: { label: 'Running', colour: 'primary', icon: 'mdi-progress-clock' },
  succeeded: { label: 'Succeeded', colour: 'success', icon: 'mdi-check-circle-outline' },
  failed: { label: 'Failed', colour: 'error', icon: 'mdi-alert-circle-outline' },
  cancelled: { label: 'Cancelled', colour: 'warning', icon: 'mdi-cancel' },
}

/** Seconds the solver ran (start to finish), or so far for a running run; null before it started. */
export function runDurationS(r: Pick<RunSummary, 'startedAt' | 'finishedAt'>, now = Date.now()): number | null {
  if (!r.startedAt) return null
  const end = r.finishedAt ? Date.parse(r.finishedAt) : now
  return Math.max(0, (end - Date.parse(r.startedAt)) / 1000)
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' })
export const formatDateTime = (iso: string | null) => (iso ? dateTime.format(new Date(iso)) : '—')

export function ordinal(n: number): string {
  const s = n % 100 >= 11 && n % 100 <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th'
  return `${n}${s}`
}

/**
 * A config (or any JSON) flattened to dotted paths and printable values, for the manifest panel: every
 * parameter is listed, none hidden. Arrays of pulses become "channels.0.pump.pulses.1.peakPowerW".
 */
export function flattenParams(value: unknown, prefix = ''): Array<{ path: string; value: string }> {
  if (value === null || value === undefined) return [{ path: prefix, value: '—' }]
  if (Array.isArray(value)) {
    if (value.length === 0) return [{ path: prefix, value: 'none' }]
    return value.flatMap((v, i) => flattenParams(v, prefix ? `${prefix}.${i}` : String(i)))
  }
  if (typeof value === 'object') {
    return Object.entries(value as Record<string, unknown>).flatMap(([k, v]) => flattenParams(v, prefix ? `${prefix}.${k}` : k))
  }
  return [{ path: prefix, value: String(value) }]
}

/** Unit read off a field name by the house convention (lengthM, fwhmNs, peakPowerW …). */
export function unitOfField(path: string): string {
  const name = path.split('.').pop() ?? ''
  const suffixes: Array<[RegExp, string]> = [
    [/DbPerM$/, 'dB/m'],
    [/M2PerW$/, 'm²/W'],
    [/MPerW$/, 'm/W'],
    [/MPerS$/, 'm/s'],
    // After dB/m: a phase mismatch such as antiStokesMismatchPerM.
    [/PerM$/, '1/m'],
    [/Um2$/, 'µm²'],
    [/GHz$/, 'GHz'],
    [/MHz$/, 'MHz'],
    [/Nm$/, 'nm'],
    [/Ns$/, 'ns'],
    [/Ps$/, 'ps'],
    [/PowerW$|W$/, 'W'],
    [/Rad$/, 'rad'],
    [/K$/, 'K'],
    [/M$/, 'm'],
  ]
  return suffixes.find(([re]) => re.test(name))?.[1] ?? ''
}
