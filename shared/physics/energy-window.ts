// Where an energy window lies in time: fixed windows as given, anchored ones around the expected
// arrival of their pulse at the window's port (shared/physics/pulse-roles.ts), in widths of the light expected there.
import type { EnergyWindow, SimulationConfig } from './simulation-config'
import { pulseArrival, pulseName, transitNs } from './pulse-roles'

export interface ResolvedWindow {
  startNs: number
  endNs: number
  anchor: { pulse: string; arrivalNs: number; fwhmNs: number } | null
}

/** Null when the anchor names a pulse that does not exist (the configuration schema refuses that). */
export function resolveEnergyWindow(config: Pick<SimulationConfig, 'channels' | 'waveguide'>, w: EnergyWindow): ResolvedWindow | null {
  if (!w.anchor) return w.startNs === undefined || w.endNs === undefined ? null : { startNs: w.startNs, endNs: w.endNs, anchor: null }
  const a = w.anchor
  const ch = config.channels[a.channel]
  const arrival = ch ? pulseArrival(ch, a.port, a.pulseIndex, w.port, transitNs(config.waveguide)) : null
  if (!ch || !arrival) return null
  return {
    startNs: arrival.arrivalNs + a.fromFwhm * arrival.fwhmNs,
    endNs: arrival.arrivalNs + a.toFwhm * arrival.fwhmNs,
    anchor: { pulse: pulseName(ch, a.port, a.pulseIndex), ...arrival },
  }
}
