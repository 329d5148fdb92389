import { z } from 'zod'
import { safeText } from '../api/text'

const finite = () => z.number().finite()

/** Most acoustic resonances a waveguide may list besides its main one, per kind: each adds a field per cell and order. */
export const MAX_EXTRA_RESONANCES = 3

/**
 * A further backward resonance of the same optical mode (another acoustic mode, or a second material in the
 * core): its own shift, linewidth and peak gain coefficient, with its own acoustic field. The gain spectrum is
 * the sum of the main resonance's Lorentzian and these.
 */
export const BackwardResonance = z.object({
  label: safeText().trim().max(60).optional(),
  shiftGHz: finite().positive().max(100).describe('Brillouin shift of this resonance ν_B,r (GHz)'),
  linewidthMHz: finite().positive().max(10_000).describe('Gain linewidth of this resonance, FWHM (MHz)'),
  gainCoefficientMPerW: finite().positive().max(1e-6).describe('Peak gain coefficient of this resonance g_B,r (m/W)'),
})
export type BackwardResonance = z.infer<typeof BackwardResonance>

/**
 * A forward (co-propagating) resonance: a transverse acoustic mode near cut-off at a few hundred MHz in fibre
 * or a few GHz in a chip. It couples the pump to a forward Stokes wave at ν_p − ν_F and to a forward anti-Stokes
 * wave at ν_p + ν_F, both launched at z = 0 with the pump. The gain parameter is G_F = η_pol·g_F/A_eff as for
 * the backward resonance.
 */
export const ForwardResonance = z.object({
  label: safeText().trim().max(60).optional(),
  frequencyMHz: finite().min(1).max(100_000).describe('Frequency of the forward acoustic resonance ν_F (MHz)'),
  linewidthMHz: finite().positive().max(10_000).describe('Gain linewidth of the forward resonance, FWHM (MHz)'),
  gainCoefficientMPerW: finite().positive().max(1e-6).describe('Peak forward gain coefficient g_F (m/W)'),
  antiStokesMismatchPerM: finite()
    .min(-1e6)
    .max(1e6)
    .default(0)
    .describe('Phase mismatch of the anti-Stokes process Δk = β_s + β_as − 2β_p (1/m); 0 = phase matched'),
})
export type ForwardResonance = z.infer<typeof ForwardResonance>

/** Most Stokes orders of a cascade. Beyond a few orders four-wave mixing between orders, not modelled, takes over. */
export const MAX_STOKES_ORDERS = 4

export const CascadeSettings = z.object({
  stokesOrders: z
    .number()
    .int()
    .min(1)
    .max(MAX_STOKES_ORDERS, `at most ${MAX_STOKES_ORDERS} orders: beyond that, four-wave mixing between orders (not modelled) matters`)
    .default(1)
    .describe('Backward Stokes orders: order n + 1 is pumped by order n, one Brillouin shift lower, travelling against it'),
  seedPowerW: finite()
    .min(0)
    .max(1)
    .default(0)
    .describe('CW power launched into each order above the first at its input facet (W); stands in for spontaneous scattering when thermal noise is off'),
})
export type CascadeSettings = z.infer<typeof CascadeSettings>
