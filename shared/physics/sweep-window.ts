/*
 * The window a sweep point needs: long enough that no pulse loses more than TRUNCATION_LIMIT of its energy
 * after the window's end (shared/physics/pulse-truncation.ts) and that the storage echo's retrieval window,
 * its expected arrival ± RETRIEVAL_WINDOW_FWHM echo widths (pulse-roles.ts), ends inside the run. A sweep that
 * moves or widens pulses extends each point's window to that length (rounded up to 3 significant digits)
 * instead of failing the point; energy cut before t = 0 cannot be fixed this way and is still refused.
 */
import type { PortInput, Pulse } from './pulse'
import type { SimulationConfig } from './simulation-config'
import { echoArrival, storageRoles, transitNs } from './pulse-roles'
import { outsideFractions, TRUNCATION_LIMIT } from './pulse-truncation'

/** Same rule as the storage figures' retrieval window (solver/observers/storage-figures.ts). */
export const ECHO_WINDOW_FWHM = 2

function inputs(config: SimulationConfig): PortInput[] {
  return config.channels.flatMap((ch) => [ch.pump, ch.stokes, ...(ch.coProbe ? [ch.coProbe] : []), ...ch.forwardInputs.flatMap((f) => [f.stokes, f.antiStokes])])
}

/** Shortest window (ns) from fromNs on that keeps the pulse's energy outside within TRUNCATION_LIMIT. */
function windowForPulseNs(p: Pulse, fromNs: number): number {
  const before = outsideFractions(p, Math.max(fromNs, p.centreNs + 1)).before
  // Energy lost before t = 0 is the point's own problem (the config refuses it with its fix); the end is ours.
  if (before >= TRUNCATION_LIMIT) return fromNs
  const fits = (w: number) => before + outsideFractions(p, w).after <= TRUNCATION_LIMIT
  if (fits(fromNs)) return fromNs
  let hi = Math.max(fromNs, p.centreNs) * 2 + 1
  while (!fits(hi)) hi *= 2
  let lo = fromNs
  for (let i = 0; i < 60; i++) {
    const m = (lo + hi) / 2
    if (fits(m)) hi = m
    else lo = m
  }
  return hi
}

const ceil3 = (x: number) => {
  const e = Math.pow(10, Math.floor(Math.log10(x)) - 2)
  return Number((Math.ceil(x / e) * e).toPrecision(3))
}

/** The window (ns) the configuration needs by the rules above; at least its own. */
export function neededWindowNs(config: SimulationConfig): number {
  let need = config.windowNs
  for (const input of inputs(config)) for (const p of input.pulses) need = windowForPulseNs(p, need)
  const tNs = transitNs(config.waveguide)
  for (const ch of config.channels) {
    const r = storageRoles(ch)
    if (!r) continue
    const echo = echoArrival(r, tNs)
    need = Math.max(need, echo.arrivalNs + ECHO_WINDOW_FWHM * echo.fwhmNs)
  }
  return need > config.windowNs ? ceil3(need) : config.windowNs
}
