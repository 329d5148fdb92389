// Editing helpers for the pulses of one port: the form keeps schema *input* shapes (defaults may be absent).
import type { z } from 'zod'
import type { Pulse, PortInput, PulseShape } from '@shared/physics/pulse'

export type PulseDraft = z.input<typeof Pulse>
export type PortDraft = z.input<typeof PortInput>
export type EditableShape = Exclude<PulseShape, 'sampled'>

export const SHAPE_TITLES: Record<PulseShape, string> = {
  gaussian: 'Gaussian',
  sech2: 'sech²',
  superGaussian: 'super-Gaussian',
  rectangular: 'rectangular',
  sampled: 'sampled',
}
export const EDITABLE_SHAPES: EditableShape[] = ['gaussian', 'sech2', 'superGaussian', 'rectangular']

/** Common practice for a starting point: a 200 ps Gaussian of 10 mW. */
const DEFAULT_PULSE = { peakPowerW: 0.01, fwhmNs: 0.2 }

const widthOf = (p: PulseDraft): number | undefined => ('fwhmNs' in p ? p.fwhmNs : undefined)

/** The same pulse with another shape: power, timing, phase, offset and width carry over. */
export function withShape(p: PulseDraft, shape: EditableShape): PulseDraft {
  const common = {
    label: p.label,
    peakPowerW: p.peakPowerW,
    centreNs: p.centreNs,
    phaseRad: p.phaseRad,
    frequencyOffsetMHz: p.frequencyOffsetMHz,
  }
  const fwhmNs = widthOf(p) ?? DEFAULT_PULSE.fwhmNs
  switch (shape) {
    case 'superGaussian':
      return { ...common, shape, fwhmNs, order: 'order' in p ? p.order : 3 }
    case 'rectangular':
      return { ...common, shape, fwhmNs, riseNs: 'riseNs' in p ? p.riseNs : Math.min(0.02, fwhmNs / 5) }
    default:
      return { ...common, shape, fwhmNs }
  }
}

/** A new pulse after the last one of a port (or at `centreNs`), copying the last one's shape and power. */
export function nextPulse(pulses: readonly PulseDraft[], fallbackCentreNs: number): PulseDraft {
  const last = pulses[pulses.length - 1]
  if (!last || last.shape === 'sampled') return { shape: 'gaussian', ...DEFAULT_PULSE, centreNs: fallbackCentreNs }
  const width = widthOf(last) ?? DEFAULT_PULSE.fwhmNs
  return { ...plainCopy(last), centreNs: roundNs(last.centreNs + 5 * width) }
}

export interface TrainSpec {
  count: number
  firstCentreNs: number
  periodNs: number
  peakPowerW: number
  fwhmNs: number
  shape: EditableShape
  label?: string
}

/** N pulses every T ns starting at t₁: centres t₁ + k·T, k = 0 … N − 1 (e.g. a refresh train). */
export function pulseTrain(spec: TrainSpec): PulseDraft[] {
  const base = withShape({ shape: 'gaussian', peakPowerW: spec.peakPowerW, centreNs: 0, fwhmNs: spec.fwhmNs, label: spec.label }, spec.shape)
  return Array.from({ length: Math.max(0, Math.floor(spec.count)) }, (_, k) => ({
    ...base,
    centreNs: roundNs(spec.firstCentreNs + k * spec.periodNs),
  }))
}

/** Keeps sums like 0.1 + 0.2 from showing as 0.30000000000000004 in the fields (femtosecond resolution). */
const roundNs = (t: number): number => Math.round(t * 1e6) / 1e6


/** A deep copy of plain JSON data; works on Vue proxies, which structuredClone refuses. */
export const plainCopy = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T
