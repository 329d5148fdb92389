/*
 * Constants of the multi-wave solver, built once per run from the wave set (shared/physics/wave-set.ts).
 *
 * Amplitudes are photon-flux scaled, a_w = A_w·√(ω_ref/ω_w) with ω_ref = ω_p, so |a_w|² is the photon flux of
 * wave w times ħω_p (Boyd, Nonlinear Optics, the Manley–Rowe relations in photon-flux form). A process couples a
 * higher wave h and a lower wave l through field b (Γ, Δ, G = η_pol g/A_eff, κ = ½√(GΓ)); with b frozen
 *   d a_h = i c b e^{iθ} a_l,   d a_l = i c (b e^{iθ})* a_h,   c = κ √(ω_h/ω_l)·v_g Δt per cell,
 * since with κ_h = (ω_h/ω_l)κ the higher row gives √(ω_ref/ω_h)·κ_h·√(ω_l/ω_ref) = κ√(ω_h/ω_l) and the lower row
 * √(ω_ref/ω_l)·κ·√(ω_h/ω_ref) = κ√(ω_h/ω_l): one coefficient, so the 2×2 generator is anti-Hermitian and Σ|a|²
 * is conserved. The field's source
 * iκ A_h A_l* e^{−iθ} is i·K·a_h a_l* e^{−iθ} with K = κ √(ω_h ω_l)/ω_ref.
 * Phase convention: θ = −Δk·z with Δk = β_s + β_as − 2β_p (shared/physics/resonances.ts). The anti-Stokes
 * polarisation A_p b carries e^{i(2β_p − β_s)z} against the anti-Stokes carrier e^{iβ_as z}, which leaves
 * e^{−iΔk z} on the higher (anti-Stokes) row. Every other process is phase matched (θ = 0).
 */
import { BOLTZMANN_J_PER_K, REDUCED_PLANCK_J_S } from '@shared/physics/physical-constants'
import { brillouinRates, type BrillouinRates, type GridChoice } from '@shared/physics/grid-step'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { ghzToHz, mhzToHz, um2ToM2 } from '@shared/physics/units'
import { waveSet, type WaveSet } from '@shared/physics/wave-set'
import { sveaPropagator, type SveaPropagator } from '../steppers/acoustic-propagator'

export interface NetworkWave {
  direction: 1 | -1
  omegaRadPerS: number
  /** P = |a|²·powerPerFlux, with powerPerFlux = ω_w/ω_ref. */
  powerPerFlux: number
  sqrtPowerPerFlux: number
  /** Kerr phase per unit power for a half step at a full-weight node, γ_w·v_g·Δt/2 (0 with Kerr off). */
  kerrHalf: number
}

export interface NetworkField {
  gammaPerS: number
  detuningRadPerS: number
  kappa: number
  svea: SveaPropagator
  /** ħω of the lower wave of the field's first process: |b|²/phononJ is phonons per metre. */
  phononJ: number
  /** Thermal noise (0 when off), as the plain model (problem/coupled-modes.ts) with this field's own Ω, Γ, ħω:
   *  rms of b per node √(ħω n/Δz), of the Ornstein–Uhlenbeck kick √(ħω n/Δz·(1 − e^{−ΓΔt})), and of the
   *  extra draw that gives the step mean b̄ its full variance √(ħω n/Δz·(1 − Re E)/2). */
  thermalRms: number
  noiseKickRms: number
  noiseMeanRms: number
}

export interface NetworkProcess {
  higher: number
  lower: number
  field: number
  /** Exchange per cell at full weight: β = c·b̄·e^{iθ}. */
  c: number
  /** Source of the field: i·K·a_h·a_l*·e^{−iθ}. */
  K: number
  /** e^{iθ(z_j)} per node; null when phase matched. */
  phaseRe: Float64Array | null
  phaseIm: Float64Array | null
}

export interface NetworkModel {
  set: WaveSet
  waves: NetworkWave[]
  fields: NetworkField[]
  processes: NetworkProcess[]
  nz: number
  nodes: number
  nt: number
  dtS: number
  dzM: number
  rates: BrillouinRates
  /** Amplitude loss per cell traversed, e^{−αΔz/2}. */
  lossPerCell: number
  kerr: boolean
  noise: boolean
}

export function buildNetworkModel(config: SimulationConfig, grid: GridChoice): NetworkModel {
  const { nz, nt, dtS, dzM } = grid
  const nodes = nz + 1
  const wg = config.waveguide
  const rates = brillouinRates(wg, config.detuningMHz, config.options.frequencyRatioOverride)
  const vg = rates.groupVelocityMPerS
  const set = waveSet(config)
  const omegaRef = rates.omegaPumpRadPerS
  const waves: NetworkWave[] = set.waves.map((w) => {
    // The first Stokes follows the ratio the plain model uses (its override is a bookkeeping test aid).
    const omega = w.key === 'stokes' ? omegaRef / rates.frequencyRatio : omegaRef + 2 * Math.PI * ghzToHz(w.offsetGHz)
    const powerPerFlux = omega / omegaRef
    // γ_w = n₂ω_w/(c A_eff); the first Stokes takes the plain model's value.
    const gamma = w.key === 'stokes' ? rates.kerrStokesPerWM : rates.kerrPumpPerWM * (omega / omegaRef)
    const kerrHalf = config.options.kerr ? 0.5 * gamma * vg * dtS : 0
    return { direction: w.direction, omegaRadPerS: omega, powerPerFlux, sqrtPowerPerFlux: Math.sqrt(powerPerFlux), kerrHalf }
  })
  const aEff = um2ToM2(wg.effectiveAreaUm2)
  const fields: NetworkField[] = set.fields.map((f, fi) => {
    const gain = (wg.polarisationFactor * f.gainCoefficientMPerW) / aEff
    const gamma = 2 * Math.PI * mhzToHz(f.linewidthMHz)
    const detuning = 2 * Math.PI * mhzToHz(f.detuningMHz)
    const first = set.processes.find((p) => p.field === fi)
    const lower = first ? waves[first.lower].omegaRadPerS : rates.omegaStokesRadPerS
    const phononJ = REDUCED_PLANCK_J_S * lower
    const svea = sveaPropagator(gamma, detuning, dtS)
    const noise = config.options.noise
    // Bose occupation of the field's own resonance; n_th + 1 with the zero-point term.
    const nTh = noise.enabled ? 1 / Math.expm1((REDUCED_PLANCK_J_S * 2 * Math.PI * ghzToHz(f.resonanceGHz)) / (BOLTZMANN_J_PER_K * noise.temperatureK)) : 0
    const variance = (phononJ * (noise.enabled && noise.zeroPoint ? nTh + 1 : nTh)) / dzM
    return {
      gammaPerS: gamma,
      detuningRadPerS: detuning,
      kappa: 0.5 * Math.sqrt(gain * gamma),
      svea,
      phononJ,
      thermalRms: Math.sqrt(variance),
      noiseKickRms: Math.sqrt(variance * -Math.expm1(-gamma * dtS)),
      noiseMeanRms: Math.sqrt((variance * (1 - svea.eRe)) / 2),
    }
  })
  const processes: NetworkProcess[] = set.processes.map((p) => {
    const wh = waves[p.higher].omegaRadPerS
    const wl = waves[p.lower].omegaRadPerS
    const kappa = fields[p.field].kappa
    let phaseRe: Float64Array | null = null
    let phaseIm: Float64Array | null = null
    if (p.mismatchPerM !== 0) {
      phaseRe = new Float64Array(nodes)
      phaseIm = new Float64Array(nodes)
      for (let j = 0; j < nodes; j++) {
        const theta = -p.mismatchPerM * j * dzM
        phaseRe[j] = Math.cos(theta)
        phaseIm[j] = Math.sin(theta)
      }
    }
    return { higher: p.higher, lower: p.lower, field: p.field, c: kappa * Math.sqrt(wh / wl) * vg * dtS, K: (kappa * Math.sqrt(wh * wl)) / omegaRef, phaseRe, phaseIm }
  })
  return { set, waves, fields, processes, nz, nodes, nt, dtS, dzM, rates, lossPerCell: Math.exp(-0.5 * rates.alphaPerM * dzM), kerr: config.options.kerr, noise: config.options.noise.enabled }
}
