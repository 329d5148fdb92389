// Everything a fit needs, loaded from the database: the measurement, the run's config and stored output.
import type { FitRequest } from '@shared/api/fits'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { Series } from '@shared/analysis/trace-align'
import type { Db } from '../../db/client'
import { AppError } from '../../errors'
import { findArray, type RunRow } from '../runs/runs.repo'
import { fromBytes } from '../traces/trace-arrays'
import { loadTraceArrays } from '../traces/traces.service'
import type { TraceMeta } from '../traces/traces.repo'
import type { FitInputs } from './fit-engine'
import { powerOf } from './fit-model'

const PORT_ARRAY = { pumpOut: 'pump_out', stokesOut: 'stokes_out' } as const

/** The run's stored output power at one port (W against ns). */
export async function runOutput(db: Db, run: RunRow, port: FitRequest['port'], channel: number): Promise<Series> {
  const name = `ch${channel + 1}_${PORT_ARRAY[port]}`
  const [time, trace] = await Promise.all([findArray(db, run.id, run.attempt, 'time_ns'), findArray(db, run.id, run.attempt, name)])
  if (!time || !trace) throw new AppError('invalid_input', 400, `The run has no ${name} output`, { fields: [{ path: 'channel', message: `no channel ${channel + 1} in this run` }] })
  return { timeNs: fromBytes(time.data), values: powerOf(fromBytes(trace.data)) }
}

export async function fitInputs(db: Db, request: FitRequest, trace: TraceMeta, run: RunRow): Promise<FitInputs> {
  const arrays = await loadTraceArrays(db, trace)
  const values = arrays.signals[request.signalIndex]
  if (!values) throw new AppError('invalid_input', 400, `The trace has ${trace.signals.length} signal(s); there is no signal ${request.signalIndex + 1}`, { fields: [{ path: 'signalIndex', message: 'out of range' }] })
  return {
    request,
    config: run.config as SimulationConfig,
    measured: { timeNs: arrays.timeNs, values },
    signalUnit: trace.signals[request.signalIndex].unit,
    runModel: await runOutput(db, run, request.port, request.channel),
  }
}
