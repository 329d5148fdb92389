// Laser-safety and optical-damage cautions shown beside a configuration. These are reminders, not a safety
// assessment: every message defers to local rules and the lab's laser safety officer.

export type AdvisorySeverity = 'info' | 'warning' | 'danger'

export interface Advisory {
  code: string
  severity: AdvisorySeverity
  message: string
}

export const SAFETY_DEFERRAL =
  'This is a reminder, not a safety assessment: follow your local rules and ask your laser safety officer.'

/** Default damage guideline for the guided intensity (W/cm²); common practice, adjustable per material. */
export const DEFAULT_DAMAGE_INTENSITY_W_PER_CM2 = 1e9
/** CW power in a fibre above which a fibre fuse can start at a defect (Kashyap & Blow 1988). */
export const FIBRE_FUSE_CW_POWER_W = 1
/** IEC 60825-1: the Class 3B accessible emission limit for CW lasers is 0.5 W; above it, Class 4. */
export const CLASS_4_CW_POWER_W = 0.5
/** Stokes light returned towards the pump source above this fraction of the pump calls for an isolator. */
export const BACK_REFLECTION_FRACTION = 0.1

export interface SafetyInputs {
  /** Largest continuous (or quasi-continuous) power launched at either port (W). */
  maxCwPowerW: number
  /** Largest peak power launched at either port (W). */
  maxPeakPowerW: number
  effectiveAreaUm2: number
  isFibre: boolean
  /** Expected Stokes power leaving z = 0 divided by the pump power launched there; omit when unknown. */
  stokesToPumpRatio?: number
  damageIntensityWPerCm2?: number
}

/** A power or energy ratio as people say it: "35 % of" below 1, "1.2× / 990×" from 1 up (never capped). */
export function describeRatio(ratio: number): string {
  return ratio < 1 ? `${Number((100 * ratio).toPrecision(2))} % of` : `${Number(ratio.toPrecision(ratio < 10 ? 2 : 3))}×`
}

/** Peak guided intensity in W/cm² from a power and an effective area in µm² (1 µm² = 1e-8 cm²). */
export function intensityWPerCm2(powerW: number, effectiveAreaUm2: number): number {
  return powerW / (effectiveAreaUm2 * 1e-8)
}

export function laserSafetyAdvisories(s: SafetyInputs): Advisory[] {
  const out: Advisory[] = []
  const limit = s.damageIntensityWPerCm2 ?? DEFAULT_DAMAGE_INTENSITY_W_PER_CM2
  const peakIntensity = intensityWPerCm2(s.maxPeakPowerW, s.effectiveAreaUm2)
  if (peakIntensity > limit) {
    out.push({
      code: 'damage-intensity',
      severity: 'danger',
      message:
        `Peak intensity ${peakIntensity.toExponential(2)} W/cm² exceeds the damage guideline of ${limit.toExponential(2)} W/cm². ` +
        `Facets, splices and coatings may be damaged; check the damage threshold of your material. ${SAFETY_DEFERRAL}`,
    })
  }
  if (s.isFibre && s.maxCwPowerW >= FIBRE_FUSE_CW_POWER_W) {
    out.push({
      code: 'fibre-fuse',
      severity: 'danger',
      message:
        `${s.maxCwPowerW.toPrecision(3)} W continuous in a fibre can start a fibre fuse (Kashyap & Blow 1988) that runs back ` +
        `towards the source and destroys the fibre. Keep connectors clean and avoid tight bends. ${SAFETY_DEFERRAL}`,
    })
  }
  if (s.stokesToPumpRatio !== undefined && s.stokesToPumpRatio > BACK_REFLECTION_FRACTION) {
    out.push({
      code: 'back-reflection',
      severity: 'warning',
      message:
        `The Stokes light returning to the pump source may reach ${describeRatio(s.stokesToPumpRatio)} the pump power ` +
        `(above ${100 * BACK_REFLECTION_FRACTION} %). Back-reflected light can damage lasers and amplifiers: use an isolator or circulator.`,
    })
  }
  if (s.maxCwPowerW > CLASS_4_CW_POWER_W) {
    out.push({
      code: 'laser-class-4',
      severity: 'warning',
      message:
        `Continuous power above ${CLASS_4_CW_POWER_W} W suggests a Class 4 laser under IEC 60825-1: eye and skin hazard, ` +
        `including from diffuse reflections. ${SAFETY_DEFERRAL}`,
    })
  } else if (s.maxPeakPowerW > CLASS_4_CW_POWER_W) {
    out.push({
      code: 'laser-class-pulsed',
      severity: 'info',
      message:
        `Peak power above ${CLASS_4_CW_POWER_W} W: the IEC 60825-1 class of a pulsed source depends on pulse energy, duration and ` +
        `repetition rate; it may be Class 3B or 4. ${SAFETY_DEFERRAL}`,
    })
  }
  return out
}
