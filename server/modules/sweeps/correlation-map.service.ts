// The sensing map of a correlation scan (a sweep over the detuning and the Stokes source delay): each finished
// point's probe trace (ch1_stokes_out) gives one reading at the correlation peak its delay selects, assembled
// and fitted by shared/analysis (docs/analysis.md, sensing map, correlation read-out). The caller has checked
// the read rule and that the sweep is such a scan.
import { SensingSetupError } from '@shared/analysis/sensing-map'
import { assembleCorrelationMap, type CorrelationScanPoint } from '@shared/analysis/correlation-map'
import { correlationSensingFigures } from '@shared/analysis/correlation-sensing-figures'
import { CORRELATION_MIN_POINTS, correlationAxisIndex } from '@shared/api/correlation-scan'
import type { SensingMapResponse } from '@shared/api/sensing-map'
import type { SweepDetail } from '@shared/api/sweeps'
import { chooseGrid } from '@shared/physics/grid-step'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { AppError } from '../../errors'
import { findArray, findRun } from '../runs/runs.repo'
import type { SweepsDeps } from './sweeps.service'
import { sensingMapColumns } from './sensing-map-columns'

const unusable = (message: string) => new AppError('not_a_sensing_scan', 422, message)

/** |A|² of a stored complex trace (little-endian c16). */
function powerOf(data: Buffer): Float64Array {
  const values = new Float64Array(new Uint8Array(data).buffer)
  const out = new Float64Array(values.length / 2)
  for (let i = 0; i < out.length; i++) out[i] = values[2 * i] ** 2 + values[2 * i + 1] ** 2
  return out
}

/** The probe at z = 0 with the pump off: launched power through the guide's loss, section by section (W). */
export function probeReferenceW(config: SimulationConfig): number {
  const wg = config.waveguide
  let lossDb = wg.lossDbPerM * wg.lengthM
  for (const s of wg.profile?.segments ?? []) {
    const len = Math.max(0, Math.min(s.endM, wg.lengthM) - Math.max(s.startM, 0))
    if (s.lossDbPerM !== undefined) lossDb += (s.lossDbPerM - wg.lossDbPerM) * len
  }
  return config.channels[0].stokes.backgroundPowerW * 10 ** (-lossDb / 10)
}

export async function correlationMapFor(deps: SweepsDeps, sweep: SweepDetail, noiseRms: number): Promise<SensingMapResponse> {
  const done = sweep.points.filter((p) => p.status === 'succeeded')
  if (done.length < CORRELATION_MIN_POINTS) throw unusable(`The map needs at least ${CORRELATION_MIN_POINTS} finished points; ${done.length} of ${sweep.points.length} have finished`)
  const at = correlationAxisIndex(sweep.axes)
  const points: CorrelationScanPoint[] = []
  let dtNs = 0
  let config: SimulationConfig = sweep.baseConfig
  for (const p of done) {
    const run = await findRun(deps.db, p.runId)
    const trace = run && (await findArray(deps.db, p.runId, run.attempt, 'ch1_stokes_out'))
    if (!run || !trace) continue
    config = run.config as SimulationConfig
    dtNs = chooseGrid(config).dtS * 1e9
    const pumpDelayNs = config.channels[0].pump.modulation?.delayNs ?? 0
    points.push({ detuningMHz: p.values[at.detuning], delayNs: p.values[at.delay] - pumpDelayNs, stokesOutW: powerOf(trace.data) })
  }
  const wg = config.waveguide
  const modulation = config.channels[0].pump.modulation!
  try {
    const map = assembleCorrelationMap(points, { dtNs, groupIndex: wg.groupIndex, lengthM: wg.lengthM, linewidthMHz: wg.linewidthMHz, rateMHz: modulation.rateMHz, probeReferenceW: probeReferenceW(config), relativeNoiseRms: noiseRms })
    const fig = correlationSensingFigures(map, wg.profile?.segments ?? [], wg.groupIndex, wg.linewidthMHz, modulation)
    return {
      readOut: 'correlation',
      brillouinShiftGHz: wg.brillouinShiftGHz,
      ...sensingMapColumns(map),
      trueShiftMHz: fig.trueShiftMHz,
      nominalResolutionM: fig.nominalResolutionM,
      measuredResolutionM: fig.measuredResolutionM,
      resolutionM: fig.resolutionM,
      rangeM: fig.rangeM,
      rangeStartM: fig.rangeStartM,
      peakSpacingM: fig.peakSpacingM,
      hotSpots: fig.hotSpots,
      pointsUsed: points.length,
      pointsPending: sweep.points.length - points.length,
      noiseRms,
    }
  } catch (e) {
    if (e instanceof SensingSetupError) throw unusable(e.message)
    throw e
  }
}
