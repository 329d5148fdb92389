import { firstOrderTauNs, gaussianSigmaNs, type DetectorResponse } from '@shared/analysis/detector-response'
import { alignClosedForm, energyScale, peakScale, sampleAt, type Series } from '@shared/analysis/trace-align'
import { alignByEnergy, alignByPeak } from '@shared/analysis/trace-quick-align'
import { fmt } from './trace-format'

/** How the overlay lines a measurement up with the model: offset and scale together, or the offset by hand. */
export type AlignRule = 'none' | 'peak' | 'energy' | 'fitted'
/** Where the offset in use came from. */
export type OffsetSource = 'hand' | Exclude<AlignRule, 'none'>

export interface OverlayAlignment {
  offsetNs: number
  /** 1σ of the least-squares offset; null for the quick rules. */
  offsetSigmaNs: number | null
}

const span = (m: Series): [number, number] => [m.timeNs[0], m.timeNs[m.timeNs.length - 1]]

/**
 * The offset that the rule gives for one measurement against the (detected) model. The quick rules look at
 * the model where the measurement falls at the current offset; least squares scans ± half the model's span.
 */
export function alignTrace(rule: Exclude<AlignRule, 'none'>, measured: Series, model: Series, fromOffsetNs: number, modelSpanNs: number): OverlayAlignment | null {
  const [a, b] = span(measured)
  if (rule === 'peak' || rule === 'energy') {
    const q = (rule === 'peak' ? alignByPeak : alignByEnergy)(measured, model, a, b, fromOffsetNs)
    return q && Number.isFinite(q.offsetNs) ? { offsetNs: q.offsetNs, offsetSigmaNs: null } : null
  }
  try {
    const f = alignClosedForm(measured, model, { startNs: a, endNs: b, offsetMinNs: -modelSpanNs / 2, offsetMaxNs: modelSpanNs / 2 })
    return { offsetNs: f.offsetNs, offsetSigmaNs: f.offsetUncertaintyNs }
  } catch {
    return null
  }
}

/** Scale per trace so that measurement ≈ scale × model at the offset in use, by the chosen rule (1 when none applies). */
export function scaleFor(rule: AlignRule, measured: Series, model: Series, offsetNs: number): number {
  if (rule === 'none') return 1
  const [a, b] = span(measured)
  if (rule === 'peak') return peakScale(measured, model, a, b, offsetNs) || 1
  if (rule === 'energy') return energyScale(measured, model, a, b, offsetNs) || 1
  try {
    return alignClosedForm(measured, model, { startNs: a, endNs: b, offsetMinNs: offsetNs, offsetMaxNs: offsetNs, scanPoints: 3 }).scale || 1
  } catch {
    return 1
  }
}

/** measured/scale − model on the measurement's samples moved onto model time, and its rms. */
export function residualOf(timeNs: Float64Array, scaled: Float64Array, model: Series): { values: Float64Array; rms: number } {
  const hint = { j: 0 }
  const values = Float64Array.from(timeNs, (x, i) => scaled[i] - sampleAt(model, x, hint))
  const rms = Math.sqrt(values.reduce((p, v) => p + v * v, 0) / Math.max(1, values.length))
  return { values, rms }
}

const SOURCE_TEXT: Record<OffsetSource, string> = { hand: 'set by hand', peak: 'peaks matched', energy: 'centroids matched', fitted: 'least squares' }

/** "Model shifted by +1.234 ns (peaks matched)": the model drawn at t + offset lies on the measurement. */
export function offsetText(offsetNs: number, source: OffsetSource, sigmaNs: number | null): string {
  const sign = offsetNs > 0 ? '+' : offsetNs < 0 ? '−' : '±'
  const sigma = source === 'fitted' && sigmaNs !== null && Number.isFinite(sigmaNs) ? ` ± ${fmt(sigmaNs, 2)}` : ''
  return `Model shifted by ${sign}${fmt(Math.abs(offsetNs))}${sigma} ns (${SOURCE_TEXT[source]})`
}

/** "first-order detector, 1.5 GHz (τ = 0.1061 ns)", or why the response is not applied. */
export function detectorText(r: DetectorResponse): string | null {
  if (r.kind === 'none') return null
  if (!(r.bandwidthGHz > 0)) return 'Detector bandwidth must be more than 0 GHz; the model is shown without it'
  return r.kind === 'firstOrder'
    ? `first-order detector, ${fmt(r.bandwidthGHz, 3)} GHz (τ = ${fmt(firstOrderTauNs(r.bandwidthGHz), 3)} ns)`
    : `Gaussian detector, ${fmt(r.bandwidthGHz, 3)} GHz (σ = ${fmt(gaussianSigmaNs(r.bandwidthGHz), 3)} ns)`
}
