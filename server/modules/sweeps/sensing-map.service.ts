// The sensing map of a sweep over the detuning: each finished point's probe trace (ch1_stokes_out) becomes
// one column of the map, assembled and fitted by shared/analysis (docs/analysis.md, sensing map). Read rule
// as for the sweep itself (getSweep: group role or share link).
import { SensingSetupError, assembleSensingMap, type SensingScanPoint } from '@shared/analysis/sensing-map'
import { sensingFigures } from '@shared/analysis/sensing-figures'
import { sensingReadOut, sensingScanProblem, type SensingMapResponse } from '@shared/api/sensing-map'
import { chooseGrid } from '@shared/physics/grid-step'
import { pulseDurationNs } from '@shared/physics/pulse-duration'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { AppError } from '../../errors'
import type { AuthContext } from '../auth/auth-context'
import { findArray, findRun } from '../runs/runs.repo'
import { correlationMapFor } from './correlation-map.service'
import { getSweep, type SweepsDeps } from './sweeps.service'
import { sensingMapColumns } from './sensing-map-columns'

/** Positions in the answer: enough for a readable heatmap, small enough for a JSON answer of a few MB. */
const MAX_POSITIONS = 1000

const unusable = (message: string) => new AppError('not_a_sensing_scan', 422, message)

/** |A|² of a stored complex trace (little-endian c16). */
function powerOf(data: Buffer): Float64Array {
  const values = new Float64Array(new Uint8Array(data).buffer)
  const out = new Float64Array(values.length / 2)
  for (let i = 0; i < out.length; i++) out[i] = values[2 * i] ** 2 + values[2 * i + 1] ** 2
  return out
}

export async function sensingMapFor(deps: SweepsDeps, auth: AuthContext | undefined, id: string, noiseRms: number, shareToken?: string): Promise<SensingMapResponse> {
  const sweep = await getSweep(deps, auth, id, shareToken)
  const problem = sensingScanProblem(sweep)
  if (problem) throw unusable(problem)
  if (sensingReadOut(sweep) === 'correlation') return correlationMapFor(deps, sweep, noiseRms)
  const done = sweep.points.filter((p) => p.status === 'succeeded')
  if (done.length < 4) throw unusable(`The map needs at least 4 finished points; ${done.length} of ${sweep.points.length} have finished`)
  const points: SensingScanPoint[] = []
  let dtNs = 0
  let config: SimulationConfig = sweep.baseConfig
  for (const p of done) {
    const run = await findRun(deps.db, p.runId)
    const trace = run && (await findArray(deps.db, p.runId, run.attempt, 'ch1_stokes_out'))
    if (!run || !trace) continue
    config = run.config as SimulationConfig
    dtNs = chooseGrid(config).dtS * 1e9
    points.push({ detuningMHz: p.values[0], stokesOutW: powerOf(trace.data) })
  }
  const wg = config.waveguide
  const pump = config.channels[0].pump.pulses[0]
  const fwhmNs = pump.shape === 'sampled' ? 0 : pump.fwhmNs
  // The resolution's τ: the pulse's duration (its width for a rectangular pulse), not its FWHM.
  const durationNs = pulseDurationNs(pump)
  try {
    const setup = { dtNs, groupIndex: wg.groupIndex, lengthM: wg.lengthM, linewidthMHz: wg.linewidthMHz, pumpCentreNs: pump.centreNs, pumpFwhmNs: fwhmNs, maxPositions: MAX_POSITIONS }
    const map = assembleSensingMap(points, { ...setup, relativeNoiseRms: noiseRms })
    // The resolution is the read-out's, not the noise's: measured on the noise-free map (sensing-figures.ts).
    const clean = noiseRms > 0 ? assembleSensingMap(points, setup) : map
    const fig = sensingFigures(map, wg.profile?.segments ?? [], wg.groupIndex, durationNs, wg.linewidthMHz, clean)
    return {
      brillouinShiftGHz: wg.brillouinShiftGHz,
      ...sensingMapColumns(map),
      trueShiftMHz: fig.trueShiftMHz,
      nominalResolutionM: fig.nominalResolutionM,
      measuredResolutionM: fig.measuredResolutionM,
      resolutionM: fig.resolutionM,
      rangeM: fig.rangeM,
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
