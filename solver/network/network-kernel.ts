/*
 * Local interaction step of the multi-wave solver at grid nodes (transport is an exact shift done by the run:
 * +z waves one cell forward, −z waves one cell back per step, Δz = v_g Δt). Equations (docs/model.md, "Waves in
 * both directions, forward scattering, several resonances and cascades"), for every process (h, l, b):
 *
 *   (σ_h ∂z + ∂t/v_g) A_h = −(α/2) A_h + i κ_h A_l b e^{iθ}          κ_h = (ω_h/ω_l) κ,  κ = ½√(GΓ)
 *   (σ_l ∂z + ∂t/v_g) A_l = −(α/2) A_l + i κ   A_h b* e^{−iθ}
 *   ∂t b = −(Γ/2 − iΔ) b + i Σ_processes of b κ A_h A_l* e^{−iθ}
 *
 * (backward and forward Brillouin scattering: Agrawal, Nonlinear Fiber Optics, ch. 9; forward scattering and
 * Stokes cascades: Kobyakov, Sauer & Chowdhury 2010, Adv. Opt. Photon. 2, 1). Scaled amplitudes and θ:
 * network-model.ts. Same contract as steppers/interaction-kernel.ts:
 *  1. Predictor for every field from the entry waves: b̃ = E(b + Δt·D₀), E = e^{−(Γ/2 − iΔ)Δt}; b̂ = (b + b̃)/2.
 *     Step-mean (steppers/step-mean.ts): b̄ = b̂ + Δt·φ₃(z)·(D₁ − D₀), z = −(Γ/2 − iΔ)Δt, the trapezoid mean plus
 *     the source's change over the step, where D₁ − D₀ is the change of the sources under one step's exchanges
 *     to first order, taken with b̂: every process p turns its pair by
 *     δa_h = iβ_p a_l, δa_l = iβ_p* a_h (β_p = c_p·w·b̂·e^{iθ}, its whole weight over the step), and
 *     D₁ − D₀ = Σ_p iK_p (δa_h a_l* + a_h δa_l*) e^{−iθ}  (one process: K·c·w·b̂·(|a_h|² − |a_l|²), the plain
 *     kernel's). Kerr's change of the sources is left out, as in the plain kernel.
 *  2. Optical exchange with every b̄ frozen: exact-unitary Cayley 2×2 rotations, processes 1 … P−1 at half
 *     weight, P at full weight, then P−1 … 1 at half weight (Strang symmetric, so second order; one process is
 *     one rotation, the plain kernel's). Each rotation keeps |a_h|² + |a_l|²: total photon flux is kept to
 *     round-off (Manley–Rowe; Boyd, Nonlinear Optics).
 *     With Kerr on, self- and cross-phase half steps before and after the exchange: wave w turns by
 *     φ_w = γ_w(P_w + 2Σ_{v≠w} P_v)·v_g Δt/2 (cross-phase factor 2 for every other wave; Agrawal ch. 7). As in the
 *     pump–Stokes kernels (steppers/kerr-phase.ts, general-kernel.ts): the first half step, a diagonal rotation, is
 *     moved through the exchanges, turning each process's β by the Cayley factor of φ_l − φ_h (first half step's
 *     phases, entry powers); then each wave turns once, a ← a·(1 − q + iθ)/(1 + q), q = θ²/4, by the whole step's
 *     θ_w = 2φ_w + γ_w·v_gΔt/2·(2ΔT − ΔP_w), the phase at the midpoint powers, where ΔP_w = 2·Re(a_w*·δa_w)·P/|a|²
 *     is the wave's first-order power change under the step's exchanges (δa of the step-mean, 1.) and ΔT their sum,
 *     its Cayley angle taken as θ(1 + θ²/12), so that the factor turns by θ to O(θ⁵) (steppers/kerr-phase.ts).
 *     (The pump–Stokes kernels share reciprocals differently, so the two agree to round-off.)
 *  3. Corrector from the exchanged waves: b ← E(b + Δt/2·D₀) + Δt/2·D₁.
 *  Thermal noise (when on), per field as the plain kernel (steppers/general-kernel.ts): the exact
 *  Ornstein–Uhlenbeck kick x enters b̃ and the corrected b, and an independent draw gives b̄ its full variance
 *  (b̂, and so b̄, carries x/2 and that draw);
 *  facet nodes get twice the variance (half cells). Draws in field order, then node order.
 *  Node weight: 1 inside, ½ at the two facets (trapezoid along every characteristic).
 */
import type { NormalSource } from '../steppers/seeded-random'
import { noiseWeight } from '../steppers/general-kernel'
import { TWELFTH } from '../steppers/kerr-phase'
import { sveaStepMean } from '../steppers/step-mean'
import type { NetworkModel } from './network-model'

export interface NetworkState {
  aRe: Float64Array[]
  aIm: Float64Array[]
  bRe: Float64Array[]
  bIm: Float64Array[]
  /** Per field and node: the source D₀, and b̄ (later D₁). */
  dRe: Float64Array[]
  dIm: Float64Array[]
  mRe: Float64Array[]
  mIm: Float64Array[]
  /** Total power per node and its first-order change over the step, for the Kerr phases. */
  total: Float64Array
  totalChange: Float64Array
  /** Per wave and node with Kerr on: the first half step's phase φ and the whole step's θ. */
  phi: Float64Array[]
  theta: Float64Array[]
  /** Per field and node: the step's noise kick (empty with noise off). */
  xRe: Float64Array[]
  xIm: Float64Array[]
  /** Per wave and node: its change under one step's exchanges, to first order; per field: D₁ − D₀ from it. */
  daRe: Float64Array[]
  daIm: Float64Array[]
  eRe: Float64Array[]
  eIm: Float64Array[]
}

export function allocateNetworkState(m: NetworkModel): NetworkState {
  const arrays = (n: number) => Array.from({ length: n }, () => new Float64Array(m.nodes))
  const W = m.waves.length, F = m.fields.length
  return {
    aRe: arrays(W), aIm: arrays(W), bRe: arrays(F), bIm: arrays(F), dRe: arrays(F), dIm: arrays(F), mRe: arrays(F), mIm: arrays(F), total: new Float64Array(m.nodes),
    totalChange: new Float64Array(m.nodes), phi: m.kerr ? arrays(W) : [], theta: m.kerr ? arrays(W) : [],
    xRe: m.noise ? arrays(F) : [], xIm: m.noise ? arrays(F) : [],
    daRe: arrays(W), daIm: arrays(W), eRe: arrays(F), eIm: arrays(F),
  }
}

/** Sets (outRe, outIm) of every field to Σ_processes i·K·a_h a_l*·e^{−iθ} over nodes j0..j1. */
function sources(m: NetworkModel, s: NetworkState, j0: number, j1: number, outRe: Float64Array[], outIm: Float64Array[]): void {
  for (let f = 0; f < outRe.length; f++) outRe[f].fill(0, j0, j1 + 1), outIm[f].fill(0, j0, j1 + 1)
  for (const p of m.processes) {
    const hRe = s.aRe[p.higher], hIm = s.aIm[p.higher], lRe = s.aRe[p.lower], lIm = s.aIm[p.lower]
    const dr = outRe[p.field], di = outIm[p.field]
    const K = p.K
    const cRe = p.phaseRe, cIm = p.phaseIm
    for (let j = j0; j <= j1; j++) {
      const hr = hRe[j], hi = hIm[j], lr = lRe[j], li = lIm[j]
      let xr = hr * lr + hi * li
      let xi = hi * lr - hr * li
      if (cRe !== null) {
        const cr = cRe[j], ci = cIm![j]
        const yr = xr * cr + xi * ci
        xi = xi * cr - xr * ci
        xr = yr
      }
      dr[j] -= K * xi
      di[j] += K * xr
    }
  }
}

/**
 * Cayley rotation of (a_h, a_l) with generator i[[0, β], [β*, 0]], β = c·b̄·e^{iθ}, over nodes j0..j1; with Kerr on,
 * in the first Kerr half step's frame: β' = β·((1 − q_r) + iΔφ)/(1 + q_r), Δφ = φ_l − φ_h, q_r = Δφ²/4.
 */
function rotate(s: NetworkState, p: NetworkModel['processes'][number], c: number, j0: number, j1: number, kerr: boolean): void {
  const hRe = s.aRe[p.higher], hIm = s.aIm[p.higher], lRe = s.aRe[p.lower], lIm = s.aIm[p.lower]
  const mRe = s.mRe[p.field], mIm = s.mIm[p.field]
  const cRe = p.phaseRe, cIm = p.phaseIm
  for (let j = j0; j <= j1; j++) {
    let betaR = c * mRe[j]
    let betaI = c * mIm[j]
    if (cRe !== null) {
      const cr = cRe[j], ci = cIm![j]
      const r = betaR * cr - betaI * ci
      betaI = betaR * ci + betaI * cr
      betaR = r
    }
    const ur = hRe[j], ui = hIm[j], vr = lRe[j], vi = lIm[j]
    const q = 0.25 * (betaR * betaR + betaI * betaI)
    let den: number
    let a: number
    if (kerr) {
      const dphi = s.phi[p.lower][j] - s.phi[p.higher][j]
      const qr = 0.25 * dphi * dphi
      const cr0 = 1 - qr
      const r = betaR * cr0 - betaI * dphi
      betaI = betaR * dphi + betaI * cr0
      betaR = r
      den = 1 / ((1 + q) * (1 + qr))
      a = (1 - q) * (1 + qr)
    } else {
      den = 1 / (1 + q)
      a = 1 - q
    }
    hRe[j] = (a * ur - betaR * vi - betaI * vr) * den
    hIm[j] = (a * ui + betaR * vr - betaI * vi) * den
    lRe[j] = (a * vr - betaR * ui + betaI * ur) * den
    lIm[j] = (a * vi + betaR * ur + betaI * ui) * den
  }
}

/**
 * Kerr phases at nodes j0..j1 (contract, 2.): φ_w of the first half step from the entry powers, and the whole step's
 * θ_w at the midpoint powers, from the waves' first-order changes δa over the step (left by stepMean).
 */
function kerrPhases(m: NetworkModel, s: NetworkState, j0: number, j1: number, weight: number): void {
  const { total, totalChange } = s
  total.fill(0, j0, j1 + 1)
  totalChange.fill(0, j0, j1 + 1)
  m.waves.forEach((w, k) => {
    const re = s.aRe[k], im = s.aIm[k], dre = s.daRe[k], dim = s.daIm[k], ppf = w.powerPerFlux
    for (let j = j0; j <= j1; j++) {
      total[j] += ppf * (re[j] * re[j] + im[j] * im[j])
      totalChange[j] += 2 * ppf * (re[j] * dre[j] + im[j] * dim[j])
    }
  })
  m.waves.forEach((w, k) => {
    const re = s.aRe[k], im = s.aIm[k], dre = s.daRe[k], dim = s.daIm[k], ppf = w.powerPerFlux, g = w.kerrHalf * weight
    const phi = s.phi[k], theta = s.theta[k]
    for (let j = j0; j <= j1; j++) {
      const r = re[j], x = im[j]
      const f = g * (2 * total[j] - ppf * (r * r + x * x))
      phi[j] = f
      const t = 2 * f + g * (2 * totalChange[j] - 2 * ppf * (r * dre[j] + x * dim[j]))
      theta[j] = t * (1 + TWELFTH * t * t)
    }
  })
}

/** Each wave turned by its whole step's Kerr phase θ: a ← a·(1 − q + iθ)/(1 + q), q = θ²/4 (unit modulus; θ tangent-corrected). */
function kerrRotation(m: NetworkModel, s: NetworkState, j0: number, j1: number): void {
  m.waves.forEach((_, k) => {
    const re = s.aRe[k], im = s.aIm[k], theta = s.theta[k]
    for (let j = j0; j <= j1; j++) {
      const r = re[j], x = im[j], t = theta[j]
      const q = 0.25 * t * t
      const rec = 1 / (1 + q)
      const cr = (1 - q) * rec
      const ci = t * rec
      re[j] = cr * r - ci * x
      im[j] = cr * x + ci * r
    }
  })
}

/**
 * The step-mean b̄ of every field (contract, 1), written over the trapezoid mean b̂ in (mRe, mIm): the waves'
 * first-order changes under every process's exchange with b̂, the sources' change D₁ − D₀ from them, then b̄.
 */
function stepMean(m: NetworkModel, s: NetworkState, j0: number, j1: number, weight: number): void {
  for (let k = 0; k < m.waves.length; k++) s.daRe[k].fill(0, j0, j1 + 1), s.daIm[k].fill(0, j0, j1 + 1)
  for (let f = 0; f < m.fields.length; f++) s.eRe[f].fill(0, j0, j1 + 1), s.eIm[f].fill(0, j0, j1 + 1)
  // δa_h += iβ a_l, δa_l += iβ* a_h, β = c·w·b̂·e^{iθ}.
  for (const p of m.processes) {
    const hRe = s.aRe[p.higher], hIm = s.aIm[p.higher], lRe = s.aRe[p.lower], lIm = s.aIm[p.lower]
    const dhRe = s.daRe[p.higher], dhIm = s.daIm[p.higher], dlRe = s.daRe[p.lower], dlIm = s.daIm[p.lower]
    const mRe = s.mRe[p.field], mIm = s.mIm[p.field]
    const cRe = p.phaseRe, cIm = p.phaseIm
    const c = weight * p.c
    for (let j = j0; j <= j1; j++) {
      let betaR = c * mRe[j]
      let betaI = c * mIm[j]
      if (cRe !== null) {
        const cr = cRe[j], ci = cIm![j]
        const r = betaR * cr - betaI * ci
        betaI = betaR * ci + betaI * cr
        betaR = r
      }
      const hr = hRe[j], hi = hIm[j], lr = lRe[j], li = lIm[j]
      dhRe[j] -= betaR * li + betaI * lr
      dhIm[j] += betaR * lr - betaI * li
      dlRe[j] -= betaR * hi - betaI * hr
      dlIm[j] += betaR * hr + betaI * hi
    }
  }
  // D₁ − D₀ = Σ_p iK (δa_h a_l* + a_h δa_l*) e^{−iθ}.
  for (const p of m.processes) {
    const hRe = s.aRe[p.higher], hIm = s.aIm[p.higher], lRe = s.aRe[p.lower], lIm = s.aIm[p.lower]
    const dhRe = s.daRe[p.higher], dhIm = s.daIm[p.higher], dlRe = s.daRe[p.lower], dlIm = s.daIm[p.lower]
    const er = s.eRe[p.field], ei = s.eIm[p.field]
    const K = p.K
    const cRe = p.phaseRe, cIm = p.phaseIm
    for (let j = j0; j <= j1; j++) {
      const hr = hRe[j], hi = hIm[j], lr = lRe[j], li = lIm[j], dhr = dhRe[j], dhi = dhIm[j], dlr = dlRe[j], dli = dlIm[j]
      let yr = dhr * lr + dhi * li + hr * dlr + hi * dli
      let yi = dhi * lr - dhr * li + hi * dlr - hr * dli
      if (cRe !== null) {
        const cr = cRe[j], ci = cIm![j]
        const t = yr * cr + yi * ci
        yi = yi * cr - yr * ci
        yr = t
      }
      er[j] -= K * yi
      ei[j] += K * yr
    }
  }
  for (let f = 0; f < m.fields.length; f++) {
    const { eRe: Er, eIm: Ei } = m.fields[f].svea
    const { m2r, m2i } = sveaStepMean(Er, Ei, m.dtS)
    const mRe = s.mRe[f], mIm = s.mIm[f], eRe = s.eRe[f], eIm = s.eIm[f]
    for (let j = j0; j <= j1; j++) {
      const er = eRe[j], ei = eIm[j]
      mRe[j] = mRe[j] + (m2r * er - m2i * ei)
      mIm[j] = mIm[j] + (m2r * ei + m2i * er)
    }
  }
}

/** One interaction step at nodes j0..j1 of equal weight (array-wise per field and process: tight loops). */
export function interactNetwork(m: NetworkModel, s: NetworkState, j0: number, j1: number, weight: number, rng: NormalSource | null = null): void {
  const F = m.fields.length
  const P = m.processes.length
  const h = m.dtS
  const hh = 0.5 * h
  sources(m, s, j0, j1, s.dRe, s.dIm)
  for (let f = 0; f < F; f++) {
    const { eRe: Er, eIm: Ei } = m.fields[f].svea
    const bRe = s.bRe[f], bIm = s.bIm[f], dRe = s.dRe[f], dIm = s.dIm[f], mRe = s.mRe[f], mIm = s.mIm[f]
    for (let j = j0; j <= j1; j++) {
      const br = bRe[j], bi = bIm[j]
      const tr = br + h * dRe[j], ti = bi + h * dIm[j]
      mRe[j] = 0.5 * (br + Er * tr - Ei * ti)
      mIm[j] = 0.5 * (bi + Er * ti + Ei * tr)
    }
    if (rng !== null) {
      // b̃ += x, so b̄ += x/2, plus the mean's own draw.
      const sd = m.fields[f].noiseKickRms * Math.SQRT1_2 * noiseWeight(weight)
      const sdMean = m.fields[f].noiseMeanRms * Math.SQRT1_2 * noiseWeight(weight)
      const xRe = s.xRe[f], xIm = s.xIm[f]
      for (let j = j0; j <= j1; j++) {
        const xr = sd * rng.normal(), xi = sd * rng.normal()
        xRe[j] = xr
        xIm[j] = xi
        const yr = sdMean * rng.normal(), yi = sdMean * rng.normal()
        mRe[j] = 0.5 * (bRe[j] + (Er * (bRe[j] + h * dRe[j]) - Ei * (bIm[j] + h * dIm[j]) + xr)) + yr
        mIm[j] = 0.5 * (bIm[j] + (Er * (bIm[j] + h * dIm[j]) + Ei * (bRe[j] + h * dRe[j]) + xi)) + yi
      }
    }
  }
  stepMean(m, s, j0, j1, weight)
  if (m.kerr) kerrPhases(m, s, j0, j1, weight)
  for (let k = 0; k < 2 * P - 1; k++) {
    const pi = k < P ? k : 2 * P - 2 - k
    const p = m.processes[pi]
    rotate(s, p, (pi === P - 1 ? 1 : 0.5) * weight * p.c, j0, j1, m.kerr)
  }
  if (m.kerr) kerrRotation(m, s, j0, j1)
  // b ← E(b + h/2·D₀) + h/2·D₁, with D₁ written over b̄ (no longer needed).
  sources(m, s, j0, j1, s.mRe, s.mIm)
  for (let f = 0; f < F; f++) {
    const { eRe: Er, eIm: Ei } = m.fields[f].svea
    const bRe = s.bRe[f], bIm = s.bIm[f], dRe = s.dRe[f], dIm = s.dIm[f], mRe = s.mRe[f], mIm = s.mIm[f]
    for (let j = j0; j <= j1; j++) {
      const sr = bRe[j] + hh * dRe[j], si = bIm[j] + hh * dIm[j]
      bRe[j] = Er * sr - Ei * si + hh * mRe[j]
      bIm[j] = Er * si + Ei * sr + hh * mIm[j]
    }
    if (rng !== null) {
      const xRe = s.xRe[f], xIm = s.xIm[f]
      for (let j = j0; j <= j1; j++) (bRe[j] += xRe[j]), (bIm[j] += xIm[j])
    }
  }
}
