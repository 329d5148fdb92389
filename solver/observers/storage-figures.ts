/*
 * Storage read-out figures, measured in the retrieval window: the expected echo arrival at the pump
 * output ± RETRIEVAL_WINDOW_FWHM echo widths (shared/physics/pulse-roles.ts gives both).
 *   η    = Σ|A_out − A_ref|²Δt / E_data      (read-out field: with minus without the read pulse)
 *   leak = Σ|A_ref|²Δt / E_data              (data light in the window that was never read out)
 *   φ    = arg Σ(A_out − A_ref) − φ_data, in [0, 2π)
 * A_ref is the pump output of the reference run (solver/storage-reference.ts).
 */
import { echoArrival, pulseFwhmNs, pulseName, transitNs, type StorageRoles } from '@shared/physics/pulse-roles'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { ChannelFigures, FigureWindow, NotDetermined } from '@shared/physics/simulation-result'
import { pulseAmplitude } from '@shared/physics/pulse-envelope'
import { differenceEnergyJ, energyJ, windowIndices } from './trace-measures'

/** Half-width of the retrieval window in echo FWHMs: a Gaussian echo keeps 1 − erfc(2·1.665) > 99.999 % inside. */
export const RETRIEVAL_WINDOW_FWHM = 2
/** Another pulse's light counts as arriving within ±1 FWHM of its expected arrival (98 % of a Gaussian's energy); its tails are what the reference removes. */
export const OTHER_PULSE_CORE_FWHM = 1

/**
 * Leak-through below this fraction of the data energy is reported as 0: it is then the far tail of the data
 * pulse, nothing anyone can act on, and its relative grid error is large (several % at 1e-15).
 */
export const LEAK_THROUGH_FLOOR = 1e-9

type StorageFigures = Pick<ChannelFigures, 'retrievalEfficiency' | 'leakThrough' | 'retrievedPhaseRad' | 'readWindowNs' | 'retrievalWindow'> & { notDetermined: NotDetermined[] }

const f3 = (x: number) => String(Number(x.toPrecision(3)))
const STORAGE_KEYS = ['retrievalEfficiency', 'retrievedPhaseRad'] as const

export function storageFigures(config: SimulationConfig, k: number, roles: StorageRoles, pumpOut: Float64Array, refPumpOut: Float64Array | null, dtS: number): StorageFigures {
  const T = transitNs(config.waveguide)
  const echo = echoArrival(roles, T)
  const half = RETRIEVAL_WINDOW_FWHM * echo.fwhmNs
  const win: FigureWindow = { arrivalNs: echo.arrivalNs, fwhmNs: echo.fwhmNs, startNs: echo.arrivalNs - half, endNs: echo.arrivalNs + half }
  const out: StorageFigures = { retrievalEfficiency: null, leakThrough: null, retrievedPhaseRad: null, readWindowNs: [win.startNs, win.endNs], retrievalWindow: win, notDetermined: [] }
  const span = `${f3(win.startNs)}–${f3(win.endNs)} ns`
  const reasons: Omit<NotDetermined, 'figure'>[] = []
  const inside = win.startNs >= 0 && win.endNs <= config.windowNs
  if (!inside) {
    reasons.push({
      code: 'window-outside-run',
      message:
        win.endNs > config.windowNs
          ? `The retrieved pulse is expected at the pump output at ${f3(win.arrivalNs)} ns (window ${span}), but the run ends at ${f3(config.windowNs)} ns: lengthen the window to at least ${f3(win.endNs)} ns or read earlier.`
          : `The retrieved pulse would reach the pump output before t = 0 (window ${span}): the read pulse comes too early.`,
    })
  }
  const ch = config.channels[k]
  ch.pump.pulses.forEach((p, i) => {
    const a = p.centreNs + T
    const core = OTHER_PULSE_CORE_FWHM * pulseFwhmNs(p)
    if (a + core > win.startNs && a - core < win.endNs) {
      const readLater = roles.read.centreNs + (a + core - win.startNs)
      reasons.push({
        code: 'overlaps-pulse',
        message: `The ${pulseName(ch, 'pump', i)} pulse reaches the pump output at ${f3(a)} ns, inside the retrieval window ${span}, so its light cannot be told from the retrieved pulse: move the read pulse to ≥ ${f3(readLater)} ns.`,
      })
    }
  })
  out.notDetermined = reasons.flatMap((r) => STORAGE_KEYS.map((figure) => ({ figure, ...r })))
  if (!inside) {
    out.notDetermined.push({ figure: 'leakThrough', ...reasons[0] })
    return out
  }
  let dataJ = 0
  const dtNs = dtS * 1e9
  for (let n = 0; n < pumpOut.length / 2; n++) dataJ += roles.data.peakPowerW * pulseAmplitude(roles.data, n * dtNs) ** 2 * dtS
  if (!(dataJ > 0)) return out
  const [n0, n1] = windowIndices(win.startNs, win.endNs, dtS)
  const ref = refPumpOut ?? new Float64Array(pumpOut.length)
  const leak = energyJ(ref, dtS, n0, n1) / dataJ
  out.leakThrough = leak < LEAK_THROUGH_FLOOR ? 0 : leak
  if (reasons.length > 0) return out
  let sr = 0, si = 0
  for (let n = n0; n <= n1; n++) (sr += pumpOut[2 * n] - ref[2 * n]), (si += pumpOut[2 * n + 1] - ref[2 * n + 1])
  const twoPi = 2 * Math.PI
  out.retrievalEfficiency = differenceEnergyJ(pumpOut, ref, dtS, n0, n1) / dataJ
  out.retrievedPhaseRad = (((Math.atan2(si, sr) - roles.data.phaseRad) % twoPi) + twoPi) % twoPi
  return out
}
