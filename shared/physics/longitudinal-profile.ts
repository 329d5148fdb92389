/*
 * A waveguide whose Brillouin response changes along z: segments [startM, endM) where the shift, linewidth,
 * gain coefficient or loss differ from the waveguide's own values (docs/model.md, longitudinal profiles).
 *
 *   ν_B(z) = ν_B + δν(z),   δν = shiftOffsetMHz + C_T·temperatureOffsetK + C_ε·strainMicro
 *
 * Outside every segment the waveguide's values hold. C_T and C_ε are the silica-fibre values near 1550 nm
 * the trade quotes (common practice): about +1 MHz/K (Kurashima et al. 1990, Opt. Lett. 15, 1038, measured
 * a coefficient of this size) and about +0.05 MHz/µε (Horiguchi, Kurashima & Tateda 1989, IEEE Photon.
 * Technol. Lett. 1, 107). Both papers are quoted from memory; they measured near 1.3 µm, and the
 * coefficients scale with ν_B, i.e. as 1/λ, so the rounded 1550-nm values are the ones in use.
 */
import { z } from 'zod'

const finite = () => z.number().finite()

/** Shift per kelvin and per microstrain of standard silica fibre near 1550 nm (common practice, see above). */
export const SHIFT_COEFFICIENTS = {
  mhzPerK: 1.0,
  mhzPerMicrostrain: 0.05,
} as const

export const MAX_PROFILE_SEGMENTS = 200

export const ProfileSegment = z
  .object({
    startM: finite().min(0).describe('Start of the segment, from the pump input (m)'),
    endM: finite().positive().describe('End of the segment (m)'),
    shiftOffsetMHz: finite().min(-2000).max(2000).default(0).describe('Brillouin shift change δν_B (MHz)'),
    temperatureOffsetK: finite().min(-300).max(1000).default(0).describe('Temperature change (K); adds 1 MHz/K to the shift'),
    strainMicro: finite().min(-20_000).max(20_000).default(0).describe('Strain change (µε); adds 0.05 MHz/µε to the shift'),
    linewidthMHz: finite().positive().max(10_000).optional().describe('Local gain linewidth Δν_B, FWHM (MHz)'),
    gainCoefficientMPerW: finite().positive().max(1e-6).optional().describe('Local peak gain coefficient g_B (m/W)'),
    lossDbPerM: finite().min(0).max(1000).optional().describe('Local optical power loss (dB/m)'),
  })
  .refine((s) => s.endM > s.startM, { path: ['endM'], message: 'The segment must end after it starts' })
export type ProfileSegment = z.infer<typeof ProfileSegment>

export const LongitudinalProfile = z.object({
  segments: z.array(ProfileSegment).max(MAX_PROFILE_SEGMENTS).default([]).describe('Sections of the waveguide whose Brillouin response differs, in order along z'),
})
export type LongitudinalProfile = z.infer<typeof LongitudinalProfile>
export type LongitudinalProfileInput = z.input<typeof LongitudinalProfile>

/** Total shift change of a segment (MHz): the direct offset plus temperature and strain. */
export function segmentShiftMHz(s: Pick<ProfileSegment, 'shiftOffsetMHz' | 'temperatureOffsetK' | 'strainMicro'>): number {
  return s.shiftOffsetMHz + SHIFT_COEFFICIENTS.mhzPerK * s.temperatureOffsetK + SHIFT_COEFFICIENTS.mhzPerMicrostrain * s.strainMicro
}

/** The segment in force at z (half-open [startM, endM)), or null where the waveguide's own values hold. */
export function segmentAt(profile: LongitudinalProfile | undefined, zM: number): ProfileSegment | null {
  if (!profile) return null
  for (const s of profile.segments) if (zM >= s.startM && zM < s.endM) return s
  return null
}

/** True when the waveguide carries at least one segment: the solver then uses the local values cell by cell. */
export function profileIsActive(profile: LongitudinalProfile | undefined): boolean {
  return !!profile && profile.segments.length > 0
}
