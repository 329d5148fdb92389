// Port traces of the waves beyond the pump–Stokes pair: the result's arrays named wave_<key>_in and
// wave_<key>_out (the pump's and Stokes' own are already the channel's port traces), labelled with the
// wave's name from the figures, else with its key in words.
import type { ArrayDescriptor } from '@shared/physics/simulation-result'
import type { WaveFigures } from '@shared/physics/wave-figures'

const WAVE_TRACE = /^wave_([a-z0-9_]+)_(in|out)$/
/** Already drawn as the channel's pump and Stokes ports. */
const MAIN_WAVES = new Set(['pump', 'stokes'])

export interface WaveTraceRef {
  key: string
  label: string
  /** +1: enters at z = 0 and leaves at z = L; −1 the other way; null when the figures do not say. */
  direction: 1 | -1 | null
  inName: string | null
  outName: string | null
}

const words = (key: string) => {
  const s = key.replace(/_/g, ' ')
  return s.charAt(0).toUpperCase() + s.slice(1)
}

/** One entry per extra wave, in the order the result lists them. */
export function extraWaveTraces(arrays: readonly Pick<ArrayDescriptor, 'name'>[], waves?: WaveFigures | null): WaveTraceRef[] {
  const out = new Map<string, WaveTraceRef>()
  for (const a of arrays) {
    const m = WAVE_TRACE.exec(a.name)
    if (!m || MAIN_WAVES.has(m[1])) continue
    const key = m[1]
    const fig = waves?.waves.find((w) => w.key === key)
    const ref = out.get(key) ?? { key, label: fig?.label ?? words(key), direction: fig?.direction ?? null, inName: null, outName: null }
    if (m[2] === 'in') ref.inName = a.name
    else ref.outName = a.name
    out.set(key, ref)
  }
  return [...out.values()]
}

/** Where a wave enters or leaves, for the trace's name. */
export function facetOf(ref: Pick<WaveTraceRef, 'direction'>, end: 'in' | 'out'): string {
  if (ref.direction === null) return end
  const atZero = (ref.direction === 1) === (end === 'in')
  return `${end} (z = ${atZero ? '0' : 'L'})`
}
