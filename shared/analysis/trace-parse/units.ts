// Unit hints in column names and metadata: "Time (ns)", "t [µs]", "time / ps", "Ch1_mV", "Horizontal Units: s".
import type { TraceSignalUnit, TraceTimeUnit } from '../../api/traces'

const TIME_ALIASES: Record<string, TraceTimeUnit> = {
  s: 's',
  sec: 's',
  secs: 's',
  second: 's',
  seconds: 's',
  ms: 'ms',
  us: 'us',
  'µs': 'us',
  'μs': 'us',
  ns: 'ns',
  ps: 'ps',
}

const SIGNAL_ALIASES: Record<string, TraceSignalUnit> = {
  w: 'W',
  watt: 'W',
  watts: 'W',
  mw: 'mW',
  uw: 'uW',
  'µw': 'uW',
  'μw': 'uW',
  v: 'V',
  volt: 'V',
  volts: 'V',
  mv: 'mV',
  'a.u.': 'arb',
  au: 'arb',
  arb: 'arb',
  'arb.': 'arb',
  'arb. u.': 'arb',
}

/** The unit written in a column name, or null: bracketed, after a slash, or as a trailing _suffix. */
export function unitInName(name: string): string | null {
  const bracket = /[[(]\s*([^\])]{1,12}?)\s*[\])]\s*$/.exec(name)
  if (bracket) return bracket[1]
  const slash = /\/\s*([^\s/]{1,8})\s*$/.exec(name)
  if (slash) return slash[1]
  const suffix = /[_\s-](s|ms|us|µs|μs|ns|ps|W|mW|uW|µW|V|mV)$/.exec(name.trim())
  if (suffix) return suffix[1]
  return null
}

export function asTimeUnit(unit: string | null | undefined): TraceTimeUnit | null {
  if (!unit) return null
  return TIME_ALIASES[unit.trim()] ?? TIME_ALIASES[unit.trim().toLowerCase()] ?? null
}

export function asSignalUnit(unit: string | null | undefined): TraceSignalUnit | null {
  if (!unit) return null
  const u = unit.trim()
  // Case matters between mW/MW and mV; exact spellings first, then the case-folded list.
  if (u === 'W' || u === 'mW' || u === 'V' || u === 'mV') return u
  return SIGNAL_ALIASES[u.toLowerCase()] ?? null
}

/** Names that mean "this is the time axis". */
export function looksLikeTimeName(name: string): boolean {
  return /^\s*(t|time|x|zeit|tiempo|temps)\b/i.test(name) || /^\s*time/i.test(name)
}
