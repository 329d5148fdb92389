import { z } from 'zod'

/**
 * Figures of a run with more waves than the plain pump–Stokes pair (shared/physics/wave-set.ts): energies at
 * each wave's input and output facet, photon balance over all waves, and the non-reciprocity of a probe
 * launched both ways.
 */
export const WaveFigure = z.object({
  key: z.string(),
  label: z.string(),
  direction: z.union([z.literal(1), z.literal(-1)]),
  offsetGHz: z.number(),
  energyInJ: z.number(),
  energyOutJ: z.number(),
  /** E_out/E_in as a fraction; null when nothing was launched into this wave. */
  transmission: z.number().nullable(),
  /** 10·log10(transmission); null with transmission. */
  gainDb: z.number().nullable(),
})
export type WaveFigure = z.infer<typeof WaveFigure>

export const NonReciprocity = z.object({
  /** E_out/E_in of the Stokes-frequency probe launched at z = L (against the pump). */
  counterTransmission: z.number(),
  /** E_out/E_in of the same-frequency probe launched at z = 0 (with the pump). */
  coTransmission: z.number(),
  /** 10·log10(counter/co): the isolation between the two directions (dB). */
  isolationDb: z.number(),
})
export type NonReciprocity = z.infer<typeof NonReciprocity>

export const WaveFigures = z.object({
  waves: z.array(WaveFigure),
  /**
   * |Σ_waves (N_in − N_out − N_left)| / Σ N_in with N = E/(ħω) the photon number of each wave and "left" the
   * light still inside at the end: zero up to round-off without loss; null when α > 0.
   */
  photonBalanceResidual: z.number().nullable(),
  /** Null unless the run launches a probe both against and with the pump. */
  nonReciprocity: NonReciprocity.nullable(),
})
export type WaveFigures = z.infer<typeof WaveFigures>
