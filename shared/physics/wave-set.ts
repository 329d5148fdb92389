/*
 * The optical waves and acoustic fields of a run beyond the plain pump–Stokes pair, and the processes that
 * couple them (docs/model.md, "Waves in both directions"). Carriers, relative to the pump's ν_p:
 *   backward Stokes order n (n = 1 … N):  ν_p − n(ν_B + δ)   travelling (−1)^n·z   (δ = the run's detuning)
 *   co-propagating probe:                 ν_p − (ν_B + δ)     travelling +z
 *   forward Stokes / anti-Stokes of ν_F:  ν_p ∓ ν_F           travelling +z
 * A backward process couples order n − 1 (higher frequency) to order n through every backward resonance r,
 * each with its own acoustic field detuned by (ν_B + δ) − ν_B,r. A forward resonance has one acoustic field,
 * written by pump and forward Stokes and read by pump and anti-Stokes (with the anti-Stokes mismatch Δk).
 * Only these processes are modelled: a co-propagating probe therefore sees no Brillouin gain.
 * The solver (solver/network/), the form and the result all read the same list from here.
 */
import type { PortInput } from './pulse'
import type { SimulationConfig } from './simulation-config'

export type WaveKind = 'pump' | 'stokes' | 'coProbe' | 'cascadeStokes' | 'forwardStokes' | 'forwardAntiStokes'

export interface WaveSpec {
  /** Stable name used in array and file names (snake_case). */
  key: string
  /** What a user reads. */
  label: string
  kind: WaveKind
  /** +1: launched at z = 0, travelling +z; −1: launched at z = L, travelling −z. */
  direction: 1 | -1
  /** Carrier frequency minus the pump carrier (GHz). */
  offsetGHz: number
  /** What is launched at the wave's input facet. */
  input: PortInput
}

export interface AcousticFieldSpec {
  key: string
  label: string
  kind: 'backward' | 'forward'
  /** Resonance frequency (GHz). */
  resonanceGHz: number
  linewidthMHz: number
  gainCoefficientMPerW: number
  /** (ν_higher − ν_lower) − ν_resonance of the waves that write it (MHz). */
  detuningMHz: number
}

export interface ProcessSpec {
  /** Index in waves of the higher-frequency wave. */
  higher: number
  /** Index in waves of the lower-frequency wave. */
  lower: number
  /** Index in fields of the acoustic field that couples them. */
  field: number
  /** Phase mismatch Δk (1/m): the coupling carries e^{±iΔk z} (sign convention in solver/network/). */
  mismatchPerM: number
}

export interface WaveSet {
  waves: WaveSpec[]
  fields: AcousticFieldSpec[]
  processes: ProcessSpec[]
}

const EMPTY: PortInput = { pulses: [], backgroundPowerW: 0 }
const ORDINAL = ['', '1st', '2nd', '3rd', '4th']

/** True when the run needs the multi-wave solver: any wave, field or order beyond the plain pump–Stokes pair. */
export function usesWaveNetwork(config: SimulationConfig): boolean {
  const wg = config.waveguide
  return (
    config.channels.some((ch) => ch.coProbe !== undefined || ch.forwardInputs.length > 0) ||
    (wg.additionalResonances?.length ?? 0) > 0 ||
    (wg.forwardResonances?.length ?? 0) > 0 ||
    config.options.cascade.stokesOrders > 1
  )
}

/** The waves, fields and processes of the first channel (the multi-wave model takes one channel). */
export function waveSet(config: SimulationConfig): WaveSet {
  const wg = config.waveguide
  const ch = config.channels[0]
  const shiftGHz = wg.brillouinShiftGHz + config.detuningMHz / 1000
  const waves: WaveSpec[] = [{ key: 'pump', label: 'Pump', kind: 'pump', direction: 1, offsetGHz: 0, input: ch.pump }]
  const fields: AcousticFieldSpec[] = []
  const processes: ProcessSpec[] = []
  const backward = [
    { shiftGHz: wg.brillouinShiftGHz, linewidthMHz: wg.linewidthMHz, gainCoefficientMPerW: wg.gainCoefficientMPerW },
    ...(wg.additionalResonances ?? []),
  ]
  const orders = config.options.cascade.stokesOrders
  for (let n = 1; n <= orders; n++) {
    const input = n === 1 ? ch.stokes : { pulses: [], backgroundPowerW: config.options.cascade.seedPowerW }
    waves.push({
      key: n === 1 ? 'stokes' : `stokes_${n}`,
      label: orders === 1 ? 'Stokes' : `${ORDINAL[n]}-order Stokes`,
      kind: n === 1 ? 'stokes' : 'cascadeStokes',
      direction: n % 2 === 0 ? 1 : -1,
      offsetGHz: -n * shiftGHz,
      input,
    })
    const higher = n === 1 ? 0 : waves.length - 2
    backward.forEach((r, ri) => {
      const suffix = backward.length > 1 ? ` (resonance ${ri + 1})` : ''
      fields.push({
        key: `acoustic_${n}_${ri + 1}`,
        label: orders > 1 ? `Acoustic field of order ${n}${suffix}` : `Acoustic field${suffix}`,
        kind: 'backward',
        resonanceGHz: r.shiftGHz,
        linewidthMHz: r.linewidthMHz,
        gainCoefficientMPerW: r.gainCoefficientMPerW,
        detuningMHz: 1000 * (shiftGHz - r.shiftGHz),
      })
      processes.push({ higher, lower: waves.length - 1, field: fields.length - 1, mismatchPerM: 0 })
    })
  }
  if (ch.coProbe) {
    waves.push({ key: 'co_probe', label: 'Co-propagating probe', kind: 'coProbe', direction: 1, offsetGHz: -shiftGHz, input: ch.coProbe })
  }
  ;(wg.forwardResonances ?? []).forEach((f, fi) => {
    const inputs = ch.forwardInputs[fi] ?? { stokes: EMPTY, antiStokes: EMPTY }
    const nuGHz = f.frequencyMHz / 1000
    const tag = (wg.forwardResonances ?? []).length > 1 ? ` ${fi + 1}` : ''
    fields.push({
      key: `forward_acoustic_${fi + 1}`,
      label: `Forward acoustic field${tag}`,
      kind: 'forward',
      resonanceGHz: nuGHz,
      linewidthMHz: f.linewidthMHz,
      gainCoefficientMPerW: f.gainCoefficientMPerW,
      detuningMHz: 0,
    })
    const field = fields.length - 1
    waves.push({ key: `forward_stokes_${fi + 1}`, label: `Forward Stokes${tag}`, kind: 'forwardStokes', direction: 1, offsetGHz: -nuGHz, input: inputs.stokes })
    processes.push({ higher: 0, lower: waves.length - 1, field, mismatchPerM: 0 })
    if (config.options.forwardAntiStokes) {
      waves.push({ key: `forward_anti_stokes_${fi + 1}`, label: `Forward anti-Stokes${tag}`, kind: 'forwardAntiStokes', direction: 1, offsetGHz: nuGHz, input: inputs.antiStokes })
      processes.push({ higher: waves.length - 1, lower: 0, field, mismatchPerM: f.antiStokesMismatchPerM })
    }
  })
  return { waves, fields, processes }
}
