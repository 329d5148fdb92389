// Which input a step-size rule of shared/physics/grid-step.ts depends on, as a field path of the configuration, so a
// grid the solver cannot take is refused on the field the user can change.
import type { SimulationConfig } from './simulation-config'

const PORTS = ['pump', 'stokes'] as const

/** The pulse (or continuous background) with the largest power: what the gain and coupling rules scale with. */
export function strongestPowerPath(config: SimulationConfig): string {
  let best = { p: -1, path: 'channels' }
  config.channels.forEach((ch, ci) => {
    for (const port of PORTS) {
      ch[port].pulses.forEach((pulse, pi) => {
        if (pulse.peakPowerW > best.p) best = { p: pulse.peakPowerW, path: `channels.${ci}.${port}.pulses.${pi}.peakPowerW` }
      })
      if (ch[port].backgroundPowerW > best.p) best = { p: ch[port].backgroundPowerW, path: `channels.${ci}.${port}.backgroundPowerW` }
    }
  })
  return best.path
}

/** The width field of the pulse with the shortest time feature (FWHM, rise time or sample interval). */
export function shortestFeaturePath(config: SimulationConfig): string {
  let best = { t: Infinity, path: 'channels' }
  config.channels.forEach((ch, ci) => {
    for (const port of PORTS) {
      ch[port].pulses.forEach((p, pi) => {
        const at = `channels.${ci}.${port}.pulses.${pi}`
        const candidates: Array<[number, string]> =
          p.shape === 'sampled' ? [[p.sampleIntervalNs, 'sampleIntervalNs']] : p.shape === 'rectangular' ? [[p.fwhmNs, 'fwhmNs'], [p.riseNs, 'riseNs']] : [[p.fwhmNs, 'fwhmNs']]
        for (const [t, name] of candidates) if (t < best.t) best = { t, path: `${at}.${name}` }
      })
    }
  })
  return best.path
}

/** The channel whose carrier offset is farthest from another's: what the mismatch rule scales with. */
export function widestOffsetPath(config: SimulationConfig): string {
  const offsets = config.channels.map((c) => c.offsetGHz)
  const lo = Math.min(...offsets)
  const far = offsets.reduce((best, o, i) => (Math.abs(o - lo) > Math.abs(offsets[best] - lo) ? i : best), 0)
  return `channels.${far}.offsetGHz`
}
