// Plain-language names for validation issue paths ("channels.0.stokes.pulses.1.centreNs" → "Stokes pulse 2,
// centre time"), for every message a user reads: the list beside the submit button, the waveguide form and
// the server's answer to a sweep with an invalid point. No JSON path reaches a user.
const FIELD_NAMES: Record<string, string> = {
  lengthM: 'length',
  lossDbPerM: 'loss',
  groupIndex: 'group index',
  phaseIndex: 'phase index',
  effectiveAreaUm2: 'effective area',
  gainCoefficientMPerW: 'gain coefficient',
  polarisationFactor: 'polarisation factor',
  brillouinShiftGHz: 'Brillouin shift',
  linewidthMHz: 'linewidth',
  acousticVelocityMPerS: 'sound speed',
  kerrN2M2PerW: 'Kerr index',
  wavelengthNm: 'wavelength',
  peakPowerW: 'peak power',
  centreNs: 'centre time',
  fwhmNs: 'width',
  phaseRad: 'phase',
  frequencyOffsetMHz: 'frequency offset',
  order: 'order',
  riseNs: 'rise time',
  backgroundPowerW: 'continuous background',
  offsetGHz: 'carrier offset',
  windowNs: 'window length',
  detuningMHz: 'detuning',
  timeStepPs: 'time step',
  mapRows: 'map rows',
  mapCols: 'map columns',
  temperatureK: 'temperature',
  seed: 'seed',
  startNs: 'start',
  endNs: 'end',
  pulseIndex: 'pulse it follows',
  fromFwhm: 'start (widths)',
  toFwhm: 'end (widths)',
  modulation: 'frequency modulation',
  rateMHz: 'rate',
  excursionMHz: 'excursion',
  delayNs: 'delay',
  broadband: 'broadband source',
  startM: 'start',
  endM: 'end',
  shiftOffsetMHz: 'shift change',
  temperatureOffsetK: 'temperature change',
  strainMicro: 'strain',
}

export function describeIssuePath(path: readonly PropertyKey[], channelCount: number): string {
  const parts: string[] = []
  for (let i = 0; i < path.length; i++) {
    const k = path[i]
    if (k === 'channels' && typeof path[i + 1] === 'number') {
      if (channelCount > 1) parts.push(`channel ${(path[i + 1] as number) + 1}`)
      i++
    } else if ((k === 'pump' || k === 'stokes') && path[i + 1] === 'pulses' && typeof path[i + 2] === 'number') {
      parts.push(`${k === 'pump' ? 'pump' : 'Stokes'} pulse ${(path[i + 2] as number) + 1}`)
      i += 2
    } else if (k === 'pump' || k === 'stokes') {
      parts.push(k === 'pump' ? 'pump' : 'Stokes')
    } else if (k === 'profile' && path[i + 1] === 'segments' && typeof path[i + 2] === 'number') {
      parts.push(`profile segment ${(path[i + 2] as number) + 1}`)
      i += 2
    } else if (k === 'energyWindows' && typeof path[i + 1] === 'number') {
      parts.push(`energy window ${(path[i + 1] as number) + 1}`)
      i++
    } else if (k === 'options' || k === 'grid' || k === 'noise' || k === 'anchor') {
      continue
    } else {
      parts.push(FIELD_NAMES[String(k)] ?? String(k))
    }
  }
  const s = parts.join(', ')
  return s.charAt(0).toUpperCase() + s.slice(1)
}
