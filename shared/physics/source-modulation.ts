// What a source does to the phase of everything launched into a port: a sinusoidal frequency modulation, a
// broadband (random-phase) field, or both. The equations are in shared/physics/source-phase.ts and docs/model.md.
import { z } from 'zod'

const finite = () => z.number().finite()

/**
 * Sinusoidal frequency modulation A(t) = A₀(t)·exp[i β sin(2π f_m (t − t_d))], β = Δf/f_m: the instantaneous
 * frequency swings by ±Δf at the rate f_m. Pump and Stokes given the same rate and excursion share one
 * modulation; their delays set where along the guide the two are in step (a correlation peak).
 */
export const FrequencyModulation = z.object({
  rateMHz: finite().positive('must be above 0').max(1e4).describe('Modulation rate f_m (MHz)'),
  excursionMHz: finite().min(0).max(1e5).describe('Frequency excursion Δf: the frequency swings by ±Δf (MHz)'),
  delayNs: finite().min(-1e7).max(1e7).default(0).describe('Modulation delay t_d at the input facet (ns)'),
})
export type FrequencyModulation = z.infer<typeof FrequencyModulation>

/**
 * A source of Lorentzian linewidth Δν: its phase performs a random walk with diffusion 2πΔν,
 * ⟨[φ(t+τ) − φ(t)]²⟩ = 2πΔν|τ|. The seed fixes the realisation: pump and Stokes with the same seed and
 * linewidth carry one source's phase, φ(t − t_d) with their own delays, as in a correlation scheme.
 */
export const BroadbandSource = z.object({
  linewidthMHz: finite().positive('must be above 0').max(2e4).describe('Source linewidth Δν, FWHM of its Lorentzian spectrum (MHz)'),
  seed: z.number().int().min(0).max(2 ** 31 - 1).default(1).describe('Seed of the random phase; the same seed gives the same field'),
  delayNs: finite().min(-1e7).max(1e7).default(0).describe('Delay of the random phase at the input facet (ns)'),
})
export type BroadbandSource = z.infer<typeof BroadbandSource>

/** Modulation index β = Δf/f_m (rad). */
export const modulationIndex = (m: Pick<FrequencyModulation, 'rateMHz' | 'excursionMHz'>): number => m.excursionMHz / m.rateMHz
