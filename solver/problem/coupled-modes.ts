/*
 * Backward SBS coupled-mode equations (docs/model.md, equations; Agrawal, Nonlinear Fiber Optics ch. 9):
 *
 *   ( ∂z + ∂t/vg) Ap = −(α/2) Ap + i κp As b  + iγ(|Ap|² + 2|As|²) Ap
 *   (−∂z + ∂t/vg) As = −(α/2) As + i κ  Ap b* + iγ(|As|² + 2|Ap|²) As
 *   ∂t b = −(ΓB/2 − iΔ) b + i κ Ap As* + f
 *
 * with κ = ½√(G_B Γ_B), κp = (ω_p/ω_s)κ. The solver works in the scaled fields u = Ap/√κp, v = As/√κ, in
 * which the optical exchange with b frozen is i√(κκp)·vg·[[0, b], [b*, 0]] (anti-Hermitian), so
 * |u|² + |v|² = Pp/κp + Ps/κ (the photon flux, up to a constant) is conserved by every exchange.
 * This builds every constant the kernels need, once per run.
 */
import { BOLTZMANN_J_PER_K, REDUCED_PLANCK_J_S } from '@shared/physics/physical-constants'
import { brillouinRates, channelMismatchPerM, type BrillouinRates, type GridChoice } from '@shared/physics/grid-step'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { higherOrderPropagator, sveaPropagator, type HigherOrderPropagator, type SveaPropagator } from '../steppers/acoustic-propagator'

export interface Model {
  nCh: number
  nz: number
  nodes: number
  nt: number
  dtS: number
  dzM: number
  rates: BrillouinRates
  kappaP: number
  sqrtKappa: number
  sqrtKappaP: number
  /** β = exchangePerB·b̄ for a full-weight node. */
  exchangePerB: number
  /** D = i·driveK·u·v* is the acoustic source iκ Ap As* in scaled fields. */
  driveK: number
  /** Amplitude loss per cell traversed, e^{−αΔz/2}. */
  lossPerCell: number
  svea: SveaPropagator
  higherOrder: HigherOrderPropagator | null
  /** Thermal occupation n_th of the bath; 0 with noise off. */
  thermalOccupation: number
  /** Occupation behind the Langevin source: n_th, or n_th + 1 with the zero-point term; 0 with noise off. */
  noiseOccupation: number
  /** b's rms per node, √(ħω_s n/Δz) with n the noise occupation. */
  thermalRms: number
  /** SVEA Ornstein–Uhlenbeck kick rms per step, √(ħω_s n_th/Δz·(1 − e^{−Γ_B Δt})). */
  noiseKickRms: number
  /** SVEA: rms of the extra draw that gives the step-mean b̄ its full variance, √(ħω_s n_th/Δz·(1 − Re E)/2). */
  noiseMeanRms: number
  /** Higher-order: rms of the Langevin force, held constant over one step, √(Γ_B ħω_s n_th/(Δz Δt)). */
  noiseForceRms: number
  noiseSeed: number
  /** Kerr phase per unit power for a half step at a full-weight node: γ·vg·Δt/2 (0 when off). */
  kerrHalfPump: number
  kerrHalfStokes: number
  /** Courant number v_A Δt/Δz of the upwind advection (0 when off). */
  advectionCourant: number
  /** e^{i q_k z_j} per channel, [k·nodes + j]; null for one channel. */
  phaseRe: Float64Array | null
  phaseIm: Float64Array | null
  /** ħω_s: converts |b|² (J/m) to phonons per metre. */
  stokesPhotonJ: number
}

export function buildModel(config: SimulationConfig, grid: GridChoice): Model {
  const { nz, nt, dtS, dzM } = grid
  const rates = brillouinRates(config.waveguide, config.detuningMHz, config.options.frequencyRatioOverride)
  const nCh = config.channels.length
  const nodes = nz + 1
  const kappa = rates.kappa
  const kappaP = rates.frequencyRatio * kappa
  const sK = Math.sqrt(kappa * kappaP)
  const vg = rates.groupVelocityMPerS
  const opts = config.options
  const stokesPhotonJ = REDUCED_PLANCK_J_S * rates.omegaStokesRadPerS

  let nTh = 0
  if (opts.noise.enabled) nTh = 1 / Math.expm1((REDUCED_PLANCK_J_S * rates.omegaBRadPerS) / (BOLTZMANN_J_PER_K * opts.noise.temperatureK))
  const nNoise = opts.noise.enabled && opts.noise.zeroPoint ? nTh + 1 : nTh
  const thermalVar = (stokesPhotonJ * nNoise) / dzM

  let phaseRe: Float64Array | null = null
  let phaseIm: Float64Array | null = null
  if (nCh > 1) {
    phaseRe = new Float64Array(nCh * nodes)
    phaseIm = new Float64Array(nCh * nodes)
    for (let k = 0; k < nCh; k++) {
      const q = channelMismatchPerM(config, config.channels[k].offsetGHz)
      for (let j = 0; j < nodes; j++) {
        phaseRe[k * nodes + j] = Math.cos(q * j * dzM)
        phaseIm[k * nodes + j] = Math.sin(q * j * dzM)
      }
    }
  }
  const omega = rates.omegaBRadPerS + rates.detuningRadPerS
  const svea = sveaPropagator(rates.gammaBPerS, rates.detuningRadPerS, dtS)
  return {
    nCh,
    nz,
    nodes,
    nt,
    dtS,
    dzM,
    rates,
    kappaP,
    sqrtKappa: Math.sqrt(kappa),
    sqrtKappaP: Math.sqrt(kappaP),
    exchangePerB: sK * vg * dtS,
    driveK: kappa * sK,
    lossPerCell: Math.exp(-0.5 * rates.alphaPerM * dzM),
    svea,
    higherOrder: opts.higherOrderAcoustic ? higherOrderPropagator(rates.gammaBPerS, rates.omegaBRadPerS, omega, dtS) : null,
    thermalOccupation: nTh,
    noiseOccupation: nNoise,
    thermalRms: Math.sqrt(thermalVar),
    noiseKickRms: Math.sqrt(thermalVar * -Math.expm1(-rates.gammaBPerS * dtS)),
    noiseMeanRms: Math.sqrt((thermalVar * (1 - svea.eRe)) / 2),
    noiseForceRms: Math.sqrt((rates.gammaBPerS * thermalVar) / dtS),
    noiseSeed: opts.noise.seed,
    kerrHalfPump: opts.kerr ? 0.5 * rates.kerrPumpPerWM * vg * dtS : 0,
    kerrHalfStokes: opts.kerr ? 0.5 * rates.kerrStokesPerWM * vg * dtS : 0,
    advectionCourant: opts.acousticAdvection ? (rates.acousticVelocityMPerS * dtS) / dzM : 0,
    phaseRe,
    phaseIm,
    stokesPhotonJ,
  }
}
