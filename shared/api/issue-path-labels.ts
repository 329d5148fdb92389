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
  shiftGHz: 'shift',
  frequencyMHz: 'frequency',
  antiStokesMismatchPerM: 'anti-Stokes mismatch',
  label: 'label',
  stokesOrders: 'Stokes orders',
  seedPowerW: 'seed power of the higher Stokes orders',
  forwardAntiStokes: 'forward anti-Stokes wave',
  enabled: 'thermal noise',
  kerr: 'Kerr effect',
  higherOrderAcoustic: 'higher-order acoustic term',
  acousticAdvection: 'acoustic advection',
  additionalResonances: 'further backward resonances',
  forwardResonances: 'forward resonances',
  forwardInputs: 'forward inputs',
  groupId: 'group',
  title: 'title',
  notes: 'notes',
  noiseRms: 'detector noise',
  // A sweep's axes (shared/api/sweeps.ts).
  field: 'quantity',
  pulseLabel: 'pulse label',
  tiedLabels: 'tied labels',
  values: 'values',
  start: 'first value',
  stop: 'last value',
  count: 'number of values',
}

/** Lists of the waveguide and the channel whose entries are named by their number. */
const NUMBERED: Record<string, string> = {
  additionalResonances: 'further backward resonance',
  forwardResonances: 'forward resonance',
  forwardInputs: 'forward inputs of resonance',
  axes: 'sweep axis',
  tiedLabels: 'tied label',
}
const WAVE_NAMES: Record<string, string> = { pump: 'pump', stokes: 'Stokes', coProbe: 'co-propagating probe', antiStokes: 'anti-Stokes' }
const own = (table: Record<string, string>, key: string): string | undefined => (Object.hasOwn(table, key) ? table[key] : undefined)

export function describeIssuePath(path: readonly PropertyKey[], channelCount: number): string {
  const parts: string[] = []
  for (let i = 0; i < path.length; i++) {
    const k = path[i]
    if (k === 'channels' && typeof path[i + 1] === 'number') {
      if (channelCount > 1) parts.push(`channel ${(path[i + 1] as number) + 1}`)
      i++
    } else if (k === 'forwardInputs' && typeof path[i + 1] === 'number' && (path[i + 2] === 'stokes' || path[i + 2] === 'antiStokes')) {
      // channels.0.forwardInputs.1.stokes.pulses.0 → "forward Stokes of resonance 2, pulse 1"
      parts.push(`forward ${path[i + 2] === 'stokes' ? 'Stokes' : 'anti-Stokes'} of resonance ${(path[i + 1] as number) + 1}`)
      i += 2
      if (path[i + 1] === 'pulses' && typeof path[i + 2] === 'number') {
        parts.push(`pulse ${(path[i + 2] as number) + 1}`)
        i += 2
      }
    } else if (typeof k === 'string' && own(NUMBERED, k) && typeof path[i + 1] === 'number') {
      parts.push(`${NUMBERED[k]} ${(path[i + 1] as number) + 1}`)
      i++
    } else if (typeof k === 'string' && own(WAVE_NAMES, k) && path[i + 1] === 'pulses' && typeof path[i + 2] === 'number') {
      parts.push(`${WAVE_NAMES[k]} pulse ${(path[i + 2] as number) + 1}`)
      i += 2
    } else if (typeof k === 'string' && own(WAVE_NAMES, k)) {
      parts.push(WAVE_NAMES[k])
    } else if (k === 'profile' && path[i + 1] === 'segments' && typeof path[i + 2] === 'number') {
      parts.push(`profile segment ${(path[i + 2] as number) + 1}`)
      i += 2
    } else if (k === 'energyWindows' && typeof path[i + 1] === 'number') {
      parts.push(`energy window ${(path[i + 1] as number) + 1}`)
      i++
    } else if (k === 'options' || k === 'grid' || k === 'noise' || k === 'anchor' || k === 'cascade' || k === 'config') {
      continue
    } else if (k === 'values' && path[i - 2] === 'axes' && i + 1 < path.length) {
      // axes.0.values.count → "Sweep axis 1, number of values": the inner key says enough.
      continue
    } else if (k === 'baseConfig') {
      parts.push('base configuration')
    } else {
      parts.push(own(FIELD_NAMES, String(k)) ?? String(k))
    }
  }
  const s = parts.join(', ')
  return s.charAt(0).toUpperCase() + s.slice(1)
}
