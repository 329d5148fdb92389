// A correlation sensing scan as the sweep form takes it: the Stokes source delay moving the correlation peak along
// the guide (shared/api/correlation-scan.ts) beside the gain scan's detuning axis, which takes fewer points, and the
// sentence that says what will be read. Null when the run is not a correlation set-up.
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { CORRELATION_SCAN_COUNT, correlationConfigProblem, correlationScanPlan } from '@shared/api/correlation-scan'
import { correlationFigures } from '@shared/physics/correlation-figures'
import type { AxisDraft } from './axis-draft'
import { formatValue } from './sweep-format'

export interface CorrelationScanStart {
  /** The base configuration, its window lengthened when the read-out needs more. */
  config: SimulationConfig
  /** The delay axis. */
  delay: AxisDraft
  /** Points of the detuning axis beside it. */
  detuningCount: number
  /** What the scan reads, in words. */
  text: string
}

export function correlationScanStart(config: SimulationConfig): CorrelationScanStart | null {
  if (correlationConfigProblem(config) !== null) return null
  const plan = correlationScanPlan(config)
  const m = config.channels[0].pump.modulation!
  const wg = config.waveguide
  const fig = correlationFigures(wg.groupIndex, wg.linewidthMHz, m.rateMHz, m.excursionMHz)
  const delay: AxisDraft = {
    field: 'modulationDelayNs',
    pulseLabel: '',
    tiedLabels: [],
    kind: 'linear',
    listText: '',
    // Rounded towards the middle, so the first and last delays still read inside the guide.
    start: String(Math.trunc(plan.delayStartNs * 1000) / 1000),
    stop: String(Math.trunc(plan.delayStopNs * 1000) / 1000),
    count: String(CORRELATION_SCAN_COUNT),
  }
  const stepM = (plan.toM - plan.fromM) / (CORRELATION_SCAN_COUNT - 1)
  const longer = wg.lengthM > fig.peakSpacingM ? ` The fibre is longer than the peak spacing d_m = ${formatValue(Number(fig.peakSpacingM.toPrecision(3)))} m: further peaks add their gain to every reading; lower f_m to read it all.` : ''
  const text =
    `Correlation read-out: ${CORRELATION_SCAN_COUNT} Stokes delays move the correlation peak from ${formatValue(Number(plan.fromM.toPrecision(4)))} m to ${formatValue(Number(plan.toM.toPrecision(4)))} m, ` +
    `${formatValue(Number(stepM.toPrecision(3)))} m apart; at each the detuning scan gives the local gain spectrum. ` +
    `Nominal resolution Δz = ${formatValue(Number((fig.peakWidthM ?? 0).toPrecision(3)))} m.${longer}`
  const window = Math.max(config.windowNs, Math.ceil(plan.windowNs))
  return {
    config: window === config.windowNs ? config : { ...config, windowNs: window },
    delay,
    detuningCount: CORRELATION_SCAN_COUNT,
    text: window === config.windowNs ? text : `${text} The window is lengthened to ${formatValue(window)} ns so each point is read after the sound has settled.`,
  }
}
