// The unit a setting is in, read from the suffix its schema name carries (lengthM, fwhmNs, kerrN2M2PerW, …),
// for labels and messages that state values with their units.

/** Longest suffix first, so kerrN2M2PerW is m²/W, not W. */
const UNIT_SUFFIXES: [RegExp, string][] = [
  [/M2PerW$/, 'm²/W'],
  [/MPerW$/, 'm/W'],
  [/DbPerM$/, 'dB/m'],
  [/MPerS$/, 'm/s'],
  [/PerWM$/, '1/(W m)'],
  [/PerM$/, '1/m'],
  [/Um2$/, 'µm²'],
  [/VPerW$/, 'V/W'],
  [/GHz$/, 'GHz'],
  [/MHz$/, 'MHz'],
  [/Ns$/, 'ns'],
  [/Ps$/, 'ps'],
  [/Nm$/, 'nm'],
  [/Rad$/, 'rad'],
  [/W$/, 'W'],
  [/K$/, 'K'],
  [/M$/, 'm'],
]

export function unitOfKey(key: string): string {
  return UNIT_SUFFIXES.find(([re]) => re.test(key))?.[1] ?? ''
}
