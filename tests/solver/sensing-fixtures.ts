// A short standard single-mode silica fibre for the sensing checks (typical values, common practice):
// n_g = 1.468, A_eff = 80 µm², g_B = 5e-11 m/W, ν_B = 10.8 GHz, Δν_B = 30 MHz. A Gaussian pump pulse of power
// FWHM τ enters at z = 0 after the CW probe (Stokes) launched at z = L has crossed the fibre.
import { SimulationConfig, type SimulationConfigInput } from '@shared/physics/simulation-config'
import type { SensingScanPoint } from '@shared/analysis/sensing-map'
import type { ProfileSegment } from '@shared/physics/longitudinal-profile'
import { planGrid, SimulationRun } from '../../solver/driver'

export const FIBRE = {
  name: 'Test fibre',
  groupIndex: 1.468,
  effectiveAreaUm2: 80,
  gainCoefficientMPerW: 5e-11,
  brillouinShiftGHz: 10.8,
  linewidthMHz: 30,
  wavelengthNm: 1550,
}
export const VG_M_PER_NS = 0.299792458 / FIBRE.groupIndex

export interface ScanSetup {
  lengthM: number
  pumpFwhmNs: number
  pumpPowerW: number
  probePowerW: number
  segments: Partial<ProfileSegment>[]
  timeStepPs?: number
  /** Rectangular pump pulse with this 10–90 % rise time (ns); Gaussian when absent. */
  riseNs?: number
}

/** Pulse centre and window the time-of-flight read-out needs for this fibre. */
export function scanTiming(s: ScanSetup) {
  const transitNs = s.lengthM / VG_M_PER_NS
  const pumpCentreNs = transitNs + 4 * s.pumpFwhmNs
  return { pumpCentreNs, windowNs: pumpCentreNs + 2 * transitNs + 3 * s.pumpFwhmNs }
}

function pumpPulse(s: ScanSetup, centreNs: number) {
  const common = { peakPowerW: s.pumpPowerW, centreNs, fwhmNs: s.pumpFwhmNs, label: 'pump' }
  return s.riseNs === undefined ? { shape: 'gaussian' as const, ...common } : { shape: 'rectangular' as const, riseNs: s.riseNs, ...common }
}

export function sensingConfig(s: ScanSetup, detuningMHz: number, extra: Partial<SimulationConfigInput> = {}): SimulationConfig {
  const { pumpCentreNs, windowNs } = scanTiming(s)
  return SimulationConfig.parse({
    waveguide: { ...FIBRE, lengthM: s.lengthM, profile: { segments: s.segments } },
    channels: [{ pump: { pulses: [pumpPulse(s, pumpCentreNs)] }, stokes: { backgroundPowerW: s.probePowerW } }],
    detuningMHz,
    windowNs,
    grid: { mapRows: 16, mapCols: 16, ...(s.timeStepPs ? { timeStepPs: s.timeStepPs } : {}) },
    options: { errorEstimate: false },
    ...extra,
  })
}

/** Probe output power at z = 0 (W) of one run, and the time step (ns). */
export function probeTrace(config: SimulationConfig): { powerW: Float64Array; dtNs: number; run: SimulationRun } {
  const run = new SimulationRun(config, planGrid(config))
  run.advance(run.model.nt + 1)
  const out = run.traces[0].stokesOut
  const powerW = new Float64Array(out.length / 2)
  for (let i = 0; i < powerW.length; i++) powerW[i] = out[2 * i] ** 2 + out[2 * i + 1] ** 2
  return { powerW, dtNs: run.model.dtS * 1e9, run }
}

export function runScan(s: ScanSetup, detuningsMHz: number[]): { points: SensingScanPoint[]; dtNs: number } {
  let dtNs = 0
  const points = detuningsMHz.map((d) => {
    const t = probeTrace(sensingConfig(s, d))
    dtNs = t.dtNs
    return { detuningMHz: d, stokesOutW: t.powerW }
  })
  return { points, dtNs }
}
