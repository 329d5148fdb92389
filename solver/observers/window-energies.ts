// Energy through a port inside the user's windows: fixed times, or anchored to a pulse's expected
// arrival (shared/physics/energy-window.ts). An anchored window that leaves the simulated time gives no number.
// The window's edges cut through light, so its energy is the trapezoid integral (trace-measures.ts).
import { resolveEnergyWindow } from '@shared/physics/energy-window'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { WindowEnergy } from '@shared/physics/simulation-result'
import type { ChannelTraces } from './figures-of-merit'
import { windowEnergyJ } from './trace-measures'

const f3 = (x: number) => String(Number(x.toPrecision(3)))

export function windowEnergies(config: SimulationConfig, traces: ChannelTraces[], dtS: number): WindowEnergy[] {
  return config.energyWindows.map((w) => {
    const r = resolveEnergyWindow(config, w)
    const base = { label: w.label, port: w.port, startNs: r?.startNs ?? 0, endNs: r?.endNs ?? 0, anchor: r?.anchor ?? null }
    if (!r || r.startNs < 0 || r.endNs > config.windowNs) {
      const message = r
        ? `The window ${f3(r.startNs)}–${f3(r.endNs)} ns around the ${r.anchor?.pulse ?? ''} pulse's arrival at ${f3(r.anchor?.arrivalNs ?? 0)} ns is not inside the simulated 0–${f3(config.windowNs)} ns.`
        : 'The pulse this window follows is not in the run.'
      return { ...base, energyJPerChannel: [], energyJ: null, notDetermined: { figure: 'energy', code: 'window-outside-run' as const, message } }
    }
    const per = traces.map((t) => windowEnergyJ(t[w.port], dtS, r.startNs * 1e-9, r.endNs * 1e-9))
    return { ...base, energyJPerChannel: per, energyJ: per.reduce((a, b) => a + b, 0), notDetermined: null }
  })
}
