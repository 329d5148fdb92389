import { z } from 'zod'
import { safeText } from '../api/text'
import { BroadbandSource, FrequencyModulation } from './source-modulation'

const finite = () => z.number().finite()

/** Fields every pulse shape has. Times are at the facet the pulse enters through. */
const pulseCommon = {
  label: safeText().trim().max(60).optional().describe('Role of the pulse (data, write, read, refresh …)'),
  peakPowerW: finite().min(0).max(1e9).describe('Peak power (W)'),
  centreNs: finite().describe('Centre time at the input facet (ns)'),
  phaseRad: finite().default(0).describe('Carrier phase (rad)'),
  frequencyOffsetMHz: finite().min(-1e5).max(1e5).default(0).describe('Carrier offset from the port frequency (MHz)'),
}

/**
 * Widths are the FWHM of the power profile. A Gaussian A = √P·exp(−(t−t₀)²/2T²) (T the rms width of the
 * amplitude) has fwhmNs = 2·√(ln 2)·T ≈ 1.6651·T.
 */
export const GaussianPulse = z.object({
  shape: z.literal('gaussian'),
  ...pulseCommon,
  fwhmNs: finite().positive().max(1e6).describe('Power FWHM (ns)'),
})
export const Sech2Pulse = z.object({
  shape: z.literal('sech2'),
  ...pulseCommon,
  fwhmNs: finite().positive().max(1e6).describe('Power FWHM (ns)'),
})
export const SuperGaussianPulse = z.object({
  shape: z.literal('superGaussian'),
  ...pulseCommon,
  fwhmNs: finite().positive().max(1e6).describe('Power FWHM (ns)'),
  order: finite().min(1).max(50).default(3).describe('Super-Gaussian order m in exp(−(t/T)^(2m))'),
})
export const RectangularPulse = z.object({
  shape: z.literal('rectangular'),
  ...pulseCommon,
  fwhmNs: finite().positive().max(1e6).describe('Width at half power (ns)'),
  riseNs: finite().positive().max(1e6).default(0.02).describe('10–90 % rise and fall time (ns)'),
})
/** A measured or computed envelope, sampled uniformly from centreNs − (n−1)·sampleIntervalNs/2. */
export const SampledPulse = z.object({
  shape: z.literal('sampled'),
  ...pulseCommon,
  sampleIntervalNs: finite().positive().max(1e6).describe('Time between samples (ns)'),
  powerShape: z.array(finite().min(0)).min(2).max(1_000_000).describe('Relative power samples, scaled so the largest is peakPowerW'),
})

export const Pulse = z.discriminatedUnion('shape', [GaussianPulse, Sech2Pulse, SuperGaussianPulse, RectangularPulse, SampledPulse])
export type Pulse = z.infer<typeof Pulse>
export type PulseShape = Pulse['shape']
export const PULSE_SHAPES = ['gaussian', 'sech2', 'superGaussian', 'rectangular', 'sampled'] as const

/**
 * Everything launched into one port: a list of pulses plus a continuous leak (a modulator's finite extinction),
 * optionally with the source's frequency modulation and random phase applied to the whole field.
 */
export const PortInput = z.object({
  pulses: z.array(Pulse).max(2000).default([]),
  backgroundPowerW: finite().min(0).max(1e6).default(0).describe('Continuous power between pulses (W)'),
  modulation: FrequencyModulation.optional().describe('Sinusoidal frequency modulation of the source'),
  broadband: BroadbandSource.optional().describe('Random phase of a broadband source'),
})
export type PortInput = z.infer<typeof PortInput>
