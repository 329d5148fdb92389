// The model a fit varies: the run's configuration with the freed parameters replaced, evaluated by the
// solver on a pinned time step (a grid that moved with the parameters would put steps in the residual).
import { chooseGrid } from '@shared/physics/grid-step'
import { FIT_PARAMETER_META, type FitPort, type PhysicalFitParameter } from '@shared/api/fits'
import { describeIssuePath } from '@shared/api/issue-path-labels'
import '@shared/api/issue-messages'
import type { Pulse } from '@shared/physics/pulse'
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { Series } from '@shared/analysis/trace-align'
import { simulateSync } from '../../../solver/index'

export type PhysicalValues = Partial<Record<PhysicalFitParameter, number>>

/** The run's own values of the parameters a fit can free. */
export function baseValues(config: SimulationConfig): Required<PhysicalValues> {
  return { linewidthMHz: config.waveguide.linewidthMHz, gainCoefficientMPerW: config.waveguide.gainCoefficientMPerW, pulseWidthScale: 1, detuningMHz: config.detuningMHz }
}

function stretch(p: Pulse, k: number): Pulse {
  switch (p.shape) {
    case 'rectangular':
      return { ...p, fwhmNs: p.fwhmNs * k, riseNs: p.riseNs * k }
    case 'sampled':
      return { ...p, sampleIntervalNs: p.sampleIntervalNs * k }
    default:
      return { ...p, fwhmNs: p.fwhmNs * k }
  }
}

/** Time step (ps) used for every evaluation of one model variant. */
export function pinnedStepPs(config: SimulationConfig, higherOrder: boolean): number {
  const base = chooseGrid(config).dtS * 1e12
  if (!higherOrder) return base
  const ho = chooseGrid({ ...config, grid: { ...config.grid, timeStepPs: undefined }, options: { ...config.options, higherOrderAcoustic: true } }).dtS * 1e12
  return Math.min(base, ho)
}

export function variantConfig(config: SimulationConfig, values: PhysicalValues, higherOrder: boolean, stepPs: number): SimulationConfig {
  const k = values.pulseWidthScale ?? 1
  const draft = {
    ...config,
    waveguide: {
      ...config.waveguide,
      linewidthMHz: values.linewidthMHz ?? config.waveguide.linewidthMHz,
      gainCoefficientMPerW: values.gainCoefficientMPerW ?? config.waveguide.gainCoefficientMPerW,
    },
    detuningMHz: values.detuningMHz ?? config.detuningMHz,
    channels: config.channels.map((ch) => ({
      ...ch,
      pump: { ...ch.pump, pulses: ch.pump.pulses.map((p) => stretch(p, k)) },
      stokes: { ...ch.stokes, pulses: ch.stokes.pulses.map((p) => stretch(p, k)) },
    })),
    // Maps are not looked at by a fit: the smallest the schema allows.
    grid: { ...config.grid, timeStepPs: stepPs, mapRows: 16, mapCols: 16 },
    options: { ...config.options, higherOrderAcoustic: higherOrder },
    energyWindows: [],
  }
  const parsed = SimulationConfig.safeParse(draft)
  if (!parsed.success) {
    const why = parsed.error.issues.map((i) => `${describeIssuePath(i.path, config.channels.length)}: ${i.message}`).join('; ')
    const at = Object.entries(values).map(([k, v]) => `${FIT_PARAMETER_META[k as PhysicalFitParameter]?.label ?? k} = ${v} ${FIT_PARAMETER_META[k as PhysicalFitParameter]?.unit ?? ''}`.trim())
    throw new Error(`The model cannot be evaluated at ${at.join(', ')}: ${why}`)
  }
  return parsed.data
}

/** Output power |A|² (W) of one port of one channel against time (ns). */
export function evaluateModel(config: SimulationConfig, port: FitPort, channel: number): Series {
  const result = simulateSync(config)
  if (result.status !== 'finished') throw new Error(`The solver did not finish: ${result.message}`)
  const traces = result.channels[channel]
  if (!traces) throw new Error(`The run has no channel ${channel + 1}`)
  const a = traces[port]
  const values = new Float64Array(a.length / 2)
  for (let i = 0; i < values.length; i++) values[i] = a[2 * i] ** 2 + a[2 * i + 1] ** 2
  return { timeNs: result.timeNs, values }
}

/** |A|² from an interleaved complex array (a stored run output). */
export function powerOf(interleaved: Float64Array): Float64Array {
  const out = new Float64Array(interleaved.length / 2)
  for (let i = 0; i < out.length; i++) out[i] = interleaved[2 * i] ** 2 + interleaved[2 * i + 1] ** 2
  return out
}
