// Step rules for runs with further waves and fields (shared/physics/wave-set.ts), added to those of grid-step.ts.
// The same rules as for the main resonance, applied to every resonance with the light that can reach any wave:
// every process trades photons one for one, so no wave carries more than all inputs together (Manley–Rowe).
//   Δt ≤ T_min/20 over every wave's pulses,   γ·P_all·Δz ≤ 0.01 with Kerr,   G_r·P_all·Δz·min(1, Γ_r·T) ≤ 0.05,   κ_r√(v_g P_all)·Δt ≤ 0.05,   |Δk|·Δz ≤ 2π/10 for a mismatched anti-Stokes.
import { pulseFeatureNs, type SimulationConfig } from './simulation-config'
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'
import { mhzToHz, um2ToM2 } from './units'
import { usesWaveNetwork, waveSet } from './wave-set'

export interface StepBound {
  dtS: number
  reason: string
  field: string
}

const MAX_GAIN_PER_CELL = 0.05
const MAX_COUPLING_PER_STEP = 0.05
const CELLS_PER_MISMATCH_PERIOD = 10
const MAX_KERR_PHASE_PER_CELL = 0.01

/** Bounds on Δt for a multi-wave run (none for the plain pump–Stokes pair); tMinS: shortest pulse feature (s) or Infinity. */
export function networkStepBounds(config: SimulationConfig, vg: number, tMinS: number): StepBound[] {
  if (!usesWaveNetwork(config)) return []
  const wg = config.waveguide
  const set = waveSet(config)
  const ps = (s: number) => `${(s * 1e12).toPrecision(3)} ps`
  let pAll = 0
  for (const w of set.waves) pAll += w.input.backgroundPowerW + w.input.pulses.reduce((m, p) => Math.max(m, p.peakPowerW), 0)
  const bounds: StepBound[] = []
  // Pulses of the further waves (the pump's and Stokes' are in grid-step.ts already).
  set.waves.slice(2).forEach((w) => {
    for (const p of w.input.pulses) {
      const t = pulseFeatureNs(p) * 1e-9
      tMinS = Math.min(tMinS, t)
      bounds.push({ dtS: t / 20, reason: `Δt ≤ shortest pulse feature/20 = ${ps(t / 20)} (${w.label})`, field: 'channels.0' })
    }
  })
  const paths = [
    'waveguide.gainCoefficientMPerW',
    ...(wg.additionalResonances ?? []).map((_, i) => `waveguide.additionalResonances.${i}.gainCoefficientMPerW`),
    ...(wg.forwardResonances ?? []).map((_, i) => `waveguide.forwardResonances.${i}.gainCoefficientMPerW`),
  ]
  const resonances = [wg, ...(wg.additionalResonances ?? []), ...(wg.forwardResonances ?? [])]
  if (pAll > 0)
    resonances.forEach((r, i) => {
      const gain = (wg.polarisationFactor * r.gainCoefficientMPerW) / um2ToM2(wg.effectiveAreaUm2)
      const gamma = 2 * Math.PI * mhzToHz(r.linewidthMHz)
      const dz = MAX_GAIN_PER_CELL / (gain * pAll * (Number.isFinite(tMinS) ? Math.min(1, gamma * tMinS) : 1))
      bounds.push({ dtS: dz / vg, reason: `G·P_all·Δz·min(1, Γ·T) ≤ 0.05 over all resonances and waves gives Δt ≤ ${ps(dz / vg)}`, field: paths[i] })
      const dt = MAX_COUPLING_PER_STEP / (0.5 * Math.sqrt(gain * gamma) * Math.sqrt(vg * pAll))
      bounds.push({ dtS: dt, reason: `κ√(v_g P_all)·Δt ≤ 0.05 over all resonances and waves gives Δt ≤ ${ps(dt)}`, field: paths[i] })
    })
  if (config.options.kerr && pAll > 0 && wg.kerrN2M2PerW > 0) {
    // γ of the highest carrier, n₂ω/(c A_eff), with all the light: γ·P_all·Δz ≤ 0.01 as in grid-step.ts.
    const omegaMax = 2 * Math.PI * (SPEED_OF_LIGHT_M_PER_S / (wg.wavelengthNm * 1e-9) + Math.max(...set.waves.map((w) => w.offsetGHz)) * 1e9)
    const dz = MAX_KERR_PHASE_PER_CELL / (((wg.kerrN2M2PerW * omegaMax) / (SPEED_OF_LIGHT_M_PER_S * um2ToM2(wg.effectiveAreaUm2))) * pAll)
    bounds.push({ dtS: dz / vg, reason: `γ·P_all·Δz ≤ 0.01 over all waves gives Δt ≤ ${ps(dz / vg)}`, field: 'options.kerr' })
  }
  if (config.options.forwardAntiStokes)
    (wg.forwardResonances ?? []).forEach((f, i) => {
      if (f.antiStokesMismatchPerM === 0) return
      const dz = (2 * Math.PI) / (CELLS_PER_MISMATCH_PERIOD * Math.abs(f.antiStokesMismatchPerM))
      bounds.push({ dtS: dz / vg, reason: `anti-Stokes mismatch: Δz ≤ 2π/(10|Δk|) gives Δt ≤ ${ps(dz / vg)}`, field: `waveguide.forwardResonances.${i}.antiStokesMismatchPerM` })
    })
  return bounds
}
