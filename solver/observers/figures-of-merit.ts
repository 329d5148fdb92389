// Figures of merit from the full-resolution port traces (interleaved complex, √W) and the light left in
// the waveguide at the end. Which figures a channel gets follows its scheme (shared/physics/pulse-roles.ts):
//   storage   – retrieval efficiency, leak-through, retrieved phase (storage-figures.ts)
//   amplifier – peak Stokes gain, reflectivity E_s,out/E_p,in, delays and output widths of single pulses
//   generator – reflectivity, pump delay and width
// plus, always, the port energies and the Manley–Rowe residual. A figure that cannot be measured says why
// in notDetermined instead of giving a number.
import { channelScheme, pulseFwhmNs, storageRoles, type RunScheme } from '@shared/physics/pulse-roles'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { ChannelFigures, FiguresOfMerit, NotDetermined } from '@shared/physics/simulation-result'
import type { Model } from '../problem/coupled-modes'
import { storageFigures } from './storage-figures'
import { centroidS, CUT_PULSE_RATIO, energyJ, fwhmS, maxPower, tailBeyondEnd } from './trace-measures'
import { windowEnergies } from './window-energies'

export { energyJ, fwhmS } from './trace-measures'

export interface ChannelTraces {
  pumpIn: Float64Array
  stokesIn: Float64Array
  pumpOut: Float64Array
  stokesOut: Float64Array
}

/** An output pulse has left the waveguide once its expected arrival plus this many FWHM is inside the run. */
const OUTPUT_TAIL_FWHM = 2

const GAIN_SCHEMES: RunScheme[] = ['amplifier']
const REFLECTIVITY_SCHEMES: RunScheme[] = ['amplifier', 'generator']
const f3 = (x: number) => String(Number(x.toPrecision(3)))
/** Up to three significant digits, rounded up: a suggested window is never shorter than the rule asks. */
const ceil3 = (x: number) => {
  const e = Math.pow(10, Math.floor(Math.log10(x)) - 2)
  return String(Number((Math.ceil(x / e) * e).toPrecision(3)))
}
const pct = (x: number) => `${Number((100 * x).toPrecision(2))} %`

export function computeFigures(
  config: SimulationConfig,
  model: Model,
  traces: ChannelTraces[],
  leftJ: { pump: number; stokes: number }[],
  wallTimeS: number,
  cellUpdates: number,
  referenceTraces: ChannelTraces[] | null = null,
): FiguresOfMerit {
  const dt = model.dtS
  const transitS = model.nz * dt
  const r = model.rates.frequencyRatio
  const channels: ChannelFigures[] = traces.map((t, k) => {
    const ch = config.channels[k]
    const scheme = channelScheme(ch)
    const notDetermined: NotDetermined[] = []
    const e = { pumpIn: energyJ(t.pumpIn, dt), stokesIn: energyJ(t.stokesIn, dt), pumpOut: energyJ(t.pumpOut, dt), stokesOut: energyJ(t.stokesOut, dt) }
    const sIn = maxPower(t.stokesIn)
    // Delay and width describe one pulse through one port; with several pulses a centroid mixes them.
    const single = (port: 'pump' | 'stokes', key: 'Delay' | 'OutFwhm', value: () => number | null): number | null => {
      if (scheme === 'storage' || (port === 'stokes' && scheme !== 'amplifier')) return null
      const pulses = ch[port].pulses
      if (pulses.length !== 1) {
        if (pulses.length > 1) notDetermined.push({ figure: `${port}${key}Ns`, code: 'several-pulses', message: `The ${port === 'pump' ? 'pump' : 'Stokes'} input carries ${pulses.length} pulses; a delay or width describes a single pulse.` })
        return null
      }
      if (ch[port].backgroundPowerW > 0) {
        notDetermined.push({ figure: `${port}${key}Ns`, code: 'overlaps-pulse', message: `The ${port === 'pump' ? 'pump' : 'Stokes'} input has a continuous background under its pulse; a centroid or width would describe the mixture, not the pulse.` })
        return null
      }
      const endNs = pulses[0].centreNs + transitS * 1e9 + OUTPUT_TAIL_FWHM * pulseFwhmNs(pulses[0])
      if (endNs > config.windowNs) {
        notDetermined.push({ figure: `${port}${key}Ns`, code: 'window-outside-run', message: `The ${port === 'pump' ? 'pump' : 'Stokes'} pulse has not fully left the waveguide when the run ends at ${f3(config.windowNs)} ns; lengthen the window to at least ${f3(endNs)} ns.` })
        return null
      }
      // The expected arrival says nothing of a pulse that slow light delayed and the Brillouin response
      // stretched into a long tail: measure what is still arriving when the run ends.
      const cut = tailBeyondEnd(port === 'pump' ? t.pumpOut : t.stokesOut, dt)
      if (cut.powerRatio > CUT_PULSE_RATIO || cut.energyRatio > CUT_PULSE_RATIO) {
        const what = cut.powerRatio > CUT_PULSE_RATIO ? `its power there is ${pct(cut.powerRatio)} of its peak` : `about ${pct(cut.energyRatio)} of its energy would arrive later`
        notDetermined.push({
          figure: `${port}${key}Ns`,
          code: 'window-outside-run',
          message: `The ${port === 'pump' ? 'pump' : 'Stokes'} output pulse is still arriving when the run ends at ${f3(config.windowNs)} ns (${what}), so ${key === 'Delay' ? 'its delay would come out short' : 'a width would not describe the whole pulse'}; lengthen the window to at least ${ceil3(cut.neededEndS * 1e9)} ns.`,
        })
        return null
      }
      return value()
    }
    const delay = (out: Float64Array, inp: Float64Array) => () => {
      const a = centroidS(out, dt), b = centroidS(inp, dt)
      return a !== null && b !== null ? (a - b - transitS) * 1e9 : null
    }
    const fw = (a: Float64Array) => () => {
      const f = fwhmS(a, dt)
      return f === null ? null : f * 1e9
    }
    let manleyRoweResidual: number | null = null
    const scale = e.pumpIn + r * e.stokesIn
    if (model.rates.alphaPerM === 0 && scale > 0) {
      const lostPump = e.pumpIn - e.pumpOut - leftJ[k].pump
      const gainedStokes = e.stokesOut + leftJ[k].stokes - e.stokesIn
      manleyRoweResidual = Math.abs(lostPump - r * gainedStokes) / scale
    }
    const roles = storageRoles(ch)
    const storage = roles
      ? storageFigures(config, k, roles, t.pumpOut, referenceTraces?.[k]?.pumpOut ?? null, dt)
      : { retrievalEfficiency: null, leakThrough: null, retrievedPhaseRad: null, readWindowNs: null, retrievalWindow: null, notDetermined: [] }
    const figures: ChannelFigures = {
      channel: k,
      scheme,
      energyJ: e,
      peakStokesGainDb: GAIN_SCHEMES.includes(scheme) && sIn > 0 ? 10 * Math.log10(maxPower(t.stokesOut) / sIn) : null,
      reflectivity: REFLECTIVITY_SCHEMES.includes(scheme) && e.pumpIn > 0 ? e.stokesOut / e.pumpIn : null,
      pumpDelayNs: single('pump', 'Delay', delay(t.pumpOut, t.pumpIn)),
      stokesDelayNs: single('stokes', 'Delay', delay(t.stokesOut, t.stokesIn)),
      pumpOutFwhmNs: single('pump', 'OutFwhm', fw(t.pumpOut)),
      stokesOutFwhmNs: single('stokes', 'OutFwhm', fw(t.stokesOut)),
      manleyRoweResidual,
      retrievalEfficiency: storage.retrievalEfficiency,
      leakThrough: storage.leakThrough,
      retrievedPhaseRad: storage.retrievedPhaseRad,
      readWindowNs: storage.readWindowNs,
      retrievalWindow: storage.retrievalWindow,
      notDetermined: [...storage.notDetermined, ...notDetermined],
    }
    return figures
  })
  return { channels, windows: windowEnergies(config, traces, dt), wallTimeS, cellUpdatesPerS: wallTimeS > 0 ? cellUpdates / wallTimeS : 0 }
}
