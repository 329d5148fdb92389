// A short standard single-mode silica fibre for the correlation read-out (typical values, common practice):
// n_g = 1.468, A_eff = 80 µm², g_B = 5e-11 m/W, ν_B = 10.8 GHz, Δν_B = 30 MHz. CW pump from z = 0 and CW probe
// (Stokes) from z = L share one sinusoidal frequency modulation; the probe's is delayed by t_d.
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { CorrelationScanPoint } from '@shared/analysis/correlation-map'
import { steadyFromNs } from '@shared/analysis/correlation-map'
import type { ProfileSegment } from '@shared/physics/longitudinal-profile'
import { planGrid, SimulationRun } from '../../solver/driver'
import { FIBRE } from './sensing-fixtures'

export { FIBRE }
export const VG_M_PER_NS = 0.299792458 / FIBRE.groupIndex

export interface CorrelationSetup {
  lengthM: number
  rateMHz: number
  excursionMHz: number
  pumpPowerW: number
  probePowerW: number
  segments: Partial<ProfileSegment>[]
}

/** Window: two crossings, the sound's settling and one modulation period of averaging, plus a margin. */
export const correlationWindowNs = (s: CorrelationSetup) => steadyFromNs(FIBRE.groupIndex, s.lengthM, FIBRE.linewidthMHz) + 1e3 / s.rateMHz + 5

export function correlationConfig(s: CorrelationSetup, detuningMHz: number, delayNs: number): SimulationConfig {
  const modulation = { rateMHz: s.rateMHz, excursionMHz: s.excursionMHz }
  return SimulationConfig.parse({
    waveguide: { ...FIBRE, lengthM: s.lengthM, profile: { segments: s.segments } },
    channels: [{ pump: { backgroundPowerW: s.pumpPowerW, modulation }, stokes: { backgroundPowerW: s.probePowerW, modulation: { ...modulation, delayNs } } }],
    detuningMHz,
    windowNs: correlationWindowNs(s),
    grid: { mapRows: 16, mapCols: 16 },
    options: { errorEstimate: false },
  })
}

/** Probe output power at z = 0 (W) of one run, and the time step (ns). */
export function correlationProbe(config: SimulationConfig): { powerW: Float64Array; dtNs: number } {
  const run = new SimulationRun(config, planGrid(config))
  run.advance(run.model.nt + 1)
  const out = run.traces[0].stokesOut
  const powerW = new Float64Array(out.length / 2)
  for (let i = 0; i < powerW.length; i++) powerW[i] = out[2 * i] ** 2 + out[2 * i + 1] ** 2
  return { powerW, dtNs: run.model.dtS * 1e9 }
}

/** Delay that puts the correlation peak at zM: t_d = 2(z − L/2)/v_g. */
export const delayForNs = (s: CorrelationSetup, zM: number) => (2 * (zM - s.lengthM / 2)) / VG_M_PER_NS

export function runCorrelationScan(s: CorrelationSetup, detuningsMHz: number[], delaysNs: number[]): { points: CorrelationScanPoint[]; dtNs: number } {
  let dtNs = 0
  const points = delaysNs.flatMap((delayNs) =>
    detuningsMHz.map((detuningMHz) => {
      const t = correlationProbe(correlationConfig(s, detuningMHz, delayNs))
      dtNs = t.dtNs
      return { detuningMHz, delayNs, stokesOutW: t.powerW }
    }),
  )
  return { points, dtNs }
}
