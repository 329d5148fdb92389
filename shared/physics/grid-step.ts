// Step-size rules (docs/numerics.md), shared by the solver and the browser's resource estimate so
// both always agree on the grid a configuration will get.
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'
import { dbPerMToPerM, ghzToHz, mhzToHz, nmToM, um2ToM2 } from './units'
import { pulseFeatureNs, type SimulationConfig } from './simulation-config'
import type { Waveguide } from './waveguide'
import { MIN_AUTO_STEPS } from './grid-limits'
import { shortestFeaturePath, strongestPowerPath, widestOffsetPath } from './grid-binding'
import { SOURCE_GRID_RULES, sourceStepBound } from './source-grid-rules'
import { profileStepBound } from './profile-grid-rules'
import { sensingStepBound } from './sensing-grid-rules'
import { networkStepBounds } from './network-grid-rules'

/** Rates of the coupled-mode equations in SI units (see docs/model.md, conventions). */
export interface BrillouinRates {
  groupVelocityMPerS: number
  /** Optical power loss α (1/m). */
  alphaPerM: number
  /** G_B = η_pol·g_B/A_eff (1/(W m)). */
  gainPerWM: number
  /** Γ_B = 2πΔν_B: gain FWHM in rad/s = phonon energy decay rate (1/s). */
  gammaBPerS: number
  omegaBRadPerS: number
  omegaPumpRadPerS: number
  omegaStokesRadPerS: number
  /** κ = ½√(G_B Γ_B) (1/√(W s m)). */
  kappa: number
  /** ω_p/ω_s, or the override used to test the photon bookkeeping. */
  frequencyRatio: number
  detuningRadPerS: number
  /** γ = n₂ω/(c A_eff) for the pump and the Stokes carrier (1/(W m)). */
  kerrPumpPerWM: number
  kerrStokesPerWM: number
  /** v_A given, else from ν_B = 2 n v_A/λ. */
  acousticVelocityMPerS: number
}

export function brillouinRates(wg: Waveguide, detuningMHz = 0, frequencyRatioOverride?: number): BrillouinRates {
  const c = SPEED_OF_LIGHT_M_PER_S
  const lambdaM = nmToM(wg.wavelengthNm)
  const omegaP = (2 * Math.PI * c) / lambdaM
  const omegaB = 2 * Math.PI * ghzToHz(wg.brillouinShiftGHz)
  const detuning = 2 * Math.PI * mhzToHz(detuningMHz)
  // Δ = (ω_p − ω_s) − Ω_B fixes the Stokes carrier.
  const omegaS = omegaP - omegaB - detuning
  const gainPerWM = (wg.polarisationFactor * wg.gainCoefficientMPerW) / um2ToM2(wg.effectiveAreaUm2)
  const gammaB = 2 * Math.PI * mhzToHz(wg.linewidthMHz)
  const aEff = um2ToM2(wg.effectiveAreaUm2)
  return {
    groupVelocityMPerS: c / wg.groupIndex,
    alphaPerM: dbPerMToPerM(wg.lossDbPerM),
    gainPerWM,
    gammaBPerS: gammaB,
    omegaBRadPerS: omegaB,
    omegaPumpRadPerS: omegaP,
    omegaStokesRadPerS: omegaS,
    kappa: 0.5 * Math.sqrt(gainPerWM * gammaB),
    frequencyRatio: frequencyRatioOverride ?? omegaP / omegaS,
    detuningRadPerS: detuning,
    kerrPumpPerWM: (wg.kerrN2M2PerW * omegaP) / (c * aEff),
    kerrStokesPerWM: (wg.kerrN2M2PerW * omegaS) / (c * aEff),
    acousticVelocityMPerS: wg.acousticVelocityMPerS ?? (ghzToHz(wg.brillouinShiftGHz) * lambdaM) / (2 * wg.phaseIndex),
  }
}

/** Tuning constants of the step rules (docs/numerics.md), named so the UI can quote them. */
export const GRID_RULES = {
  stepsPerShortestFeature: 20,
  maxGainPerCell: 0.05,
  maxCouplingPerStep: 0.05,
  maxKerrPhasePerCell: 0.01,
  /** With the higher-order acoustic term: Δt ≤ 1/(20 ν_B). */
  stepsPerAcousticPeriod: 20,
  /** Cells per 2π of the inter-channel phase mismatch e^{iΔq z}. */
  cellsPerMismatchPeriod: 10,
  /** Common practice: enough cells for a readable map and a second-order scheme out of its start-up. */
  minCells: 16,
  minSteps: MIN_AUTO_STEPS,
} as const

export interface GridChoice {
  dtS: number
  dzM: number
  /** Cells along z; there are nz + 1 nodes. */
  nz: number
  /** Time steps; there are nt + 1 time samples 0, Δt, … nt·Δt ≥ window. */
  nt: number
  /** Every rule that bounded Δt, the binding one first ("user" when the step was given). */
  reasons: string[]
  /** The step the binding rule asked for before rounding (s), and the config field that rule depends on. */
  binding: { targetDtS: number; field: string; rule: string }
}

/** Largest power in any port (peak of the largest pulse plus the continuous background) (W). */
export function maxPortPowerW(config: SimulationConfig): number {
  let p = 0
  for (const ch of config.channels) {
    for (const port of [ch.pump, ch.stokes]) {
      const peak = port.pulses.reduce((m, pulse) => Math.max(m, pulse.peakPowerW), 0)
      const amp = Math.sqrt(peak) + Math.sqrt(port.backgroundPowerW)
      p = Math.max(p, amp * amp)
    }
  }
  return p
}

/** Shortest time feature over all pulses (ns), Infinity for CW-only runs. */
export function shortestFeatureNs(config: SimulationConfig): number {
  let t = Infinity
  for (const ch of config.channels) for (const pulse of [...ch.pump.pulses, ...ch.stokes.pulses]) t = Math.min(t, pulseFeatureNs(pulse))
  return t
}

/** Wavenumber mismatch between the gratings of two channels: q_k − q_j ≈ 2 n_g Δω/c (docs/model.md, options). */
export function channelMismatchPerM(config: SimulationConfig, offsetGHz: number): number {
  return (2 * config.waveguide.groupIndex * 2 * Math.PI * ghzToHz(offsetGHz)) / SPEED_OF_LIGHT_M_PER_S
}

export function chooseGrid(config: SimulationConfig): GridChoice {
  const wg = config.waveguide
  const rates = brillouinRates(wg, config.detuningMHz, config.options.frequencyRatioOverride)
  const vg = rates.groupVelocityMPerS
  const lengthM = wg.lengthM
  const windowS = config.windowNs * 1e-9
  const pMax = maxPortPowerW(config)
  const tMinS = shortestFeatureNs(config) * 1e-9
  const bounds: { dtS: number; reason: string; field: string }[] = []
  const ps = (s: number) => `${(s * 1e12).toPrecision(3)} ps`

  // A long time-of-flight sensing fibre needs its pulse resolved only as finely as its map (sensing-grid-rules.ts).
  const sensing = Number.isFinite(tMinS) ? sensingStepBound(config) : null
  if (sensing && sensing.dtS > tMinS / GRID_RULES.stepsPerShortestFeature) bounds.push({ dtS: sensing.dtS, reason: sensing.reason, field: shortestFeaturePath(config) })
  else if (Number.isFinite(tMinS)) bounds.push({ dtS: tMinS / GRID_RULES.stepsPerShortestFeature, reason: `Δt ≤ shortest pulse feature/20 = ${ps(tMinS / 20)}`, field: shortestFeaturePath(config) })
  if (pMax > 0) {
    const field = strongestPowerPath(config)
    const pulseFactor = Number.isFinite(tMinS) ? Math.min(1, rates.gammaBPerS * tMinS) : 1
    const dz = GRID_RULES.maxGainPerCell / (rates.gainPerWM * pMax * pulseFactor)
    bounds.push({ dtS: dz / vg, reason: `G_B·P_max·Δz·min(1, Γ_B·T) ≤ 0.05 gives Δt ≤ ${ps(dz / vg)}`, field })
    const dt = GRID_RULES.maxCouplingPerStep / (rates.kappa * Math.sqrt(vg * pMax))
    bounds.push({ dtS: dt, reason: `κ√(v_g P_max)·Δt ≤ 0.05 gives Δt ≤ ${ps(dt)}`, field })
    if (config.options.kerr && rates.kerrPumpPerWM > 0) {
      const dzK = GRID_RULES.maxKerrPhasePerCell / (rates.kerrPumpPerWM * pMax)
      bounds.push({ dtS: dzK / vg, reason: `γ·P_max·Δz ≤ 0.01 gives Δt ≤ ${ps(dzK / vg)}`, field })
    }
  }
  bounds.push(...networkStepBounds(config, vg, tMinS))
  if (config.options.higherOrderAcoustic) {
    const dt = 1 / (GRID_RULES.stepsPerAcousticPeriod * ghzToHz(wg.brillouinShiftGHz))
    bounds.push({ dtS: dt, reason: `higher-order acoustic term: Δt ≤ 1/(20 ν_B) = ${ps(dt)}`, field: 'options.higherOrderAcoustic' })
  }
  const source = sourceStepBound(config)
  if (source) {
    const reason =
      source.kind === 'modulation'
        ? `frequency modulation: ${SOURCE_GRID_RULES.samplesPerCarsonBandwidth} steps per Carson bandwidth 2(Δf + f_m) gives Δt ≤ ${ps(source.dtS)}`
        : `broadband source: 2πΔν·Δt ≤ ${SOURCE_GRID_RULES.phaseVariancePerStep} rad² gives Δt ≤ ${ps(source.dtS)}`
    bounds.push({ dtS: source.dtS, reason, field: source.path.join('.') })
  }
  const feature = profileStepBound(config)
  if (feature) bounds.push({ dtS: feature.dtS, reason: `longitudinal profile: ${feature.feature.name} spans ≥ 2 cells, Δt ≤ ${ps(feature.dtS)}`, field: feature.feature.path.join('.') })
  let maxDq = 0
  for (const a of config.channels) for (const b of config.channels) maxDq = Math.max(maxDq, Math.abs(channelMismatchPerM(config, a.offsetGHz - b.offsetGHz)))
  if (maxDq > 0) {
    const dz = (2 * Math.PI) / (GRID_RULES.cellsPerMismatchPeriod * maxDq)
    bounds.push({ dtS: dz / vg, reason: `inter-channel mismatch: Δz ≤ 2π/(10|Δq|) gives Δt ≤ ${ps(dz / vg)}`, field: widestOffsetPath(config) })
  }
  bounds.push({ dtS: lengthM / (GRID_RULES.minCells * vg), reason: `at least ${GRID_RULES.minCells} cells along the waveguide`, field: 'waveguide.lengthM' })
  bounds.push({ dtS: windowS / GRID_RULES.minSteps, reason: `at least ${GRID_RULES.minSteps} time steps`, field: 'windowNs' })
  bounds.sort((a, b) => a.dtS - b.dtS)

  const userDtS = config.grid.timeStepPs !== undefined ? config.grid.timeStepPs * 1e-12 : undefined
  const targetDtS = userDtS ?? bounds[0].dtS
  // Δz = v_g Δt must tile L exactly, so Δt is rounded down to the next whole number of cells.
  const nz = Math.max(2, Math.ceil(lengthM / (vg * targetDtS) - 1e-9))
  const dzM = lengthM / nz
  const dtS = dzM / vg
  const nt = Math.max(1, Math.ceil(windowS / dtS - 1e-9))
  const reasons = bounds.map((b) => b.reason)
  if (userDtS !== undefined) reasons.unshift(`user: Δt = ${ps(userDtS)}, rounded to ${ps(dtS)} so that Δz tiles L`)
  const binding = userDtS !== undefined ? { targetDtS: userDtS, field: 'grid.timeStepPs', rule: 'the step you set' } : { targetDtS: bounds[0].dtS, field: bounds[0].field, rule: bounds[0].reason }
  return { dtS, dzM, nz, nt, reasons, binding }
}
