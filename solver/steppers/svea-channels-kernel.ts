/*
 * Fast path for several channels: SVEA, no Kerr, no thermal noise, no higher-order term, 2 to 8 pump–Stokes
 * pairs, each with its own grating b_k. The steps of the contract in interaction-kernel.ts, as `interactGeneral`
 * computes them for that case (predictAcoustic, averageAcoustic, fieldSeenByOptics, stepMean, exchangeOptics,
 * correctSvea), written flat per node with the general kernel's rounding order, so the results are the same bits.
 * At node z_j, with phases p_k = e^{i q_k z_j} (Model.phaseRe/phaseIm):
 *   D₀,k = iK·u_k·v_k*,  b̃_k = E(b_k + h·D₀,k),  b̂_k = ½(b_k + b̃_k)
 *   B̂_k = p_k*·Σ_m b̂_m p_m   (every channel's grating as channel k's light sees it)
 *   b̄_k = b̂_k + hφ₃·K·c·w·B̂_k·(|u_k|² − |v_k|²)   (the step-mean: steppers/step-mean.ts)
 *   B_k = p_k*·Σ_m b̄_m p_m,  exchange of (u_k, v_k) with β = c·w·B_k (Cayley, unitary)
 *   b_k ← E(b_k + h/2·D₀,k) + h/2·D₁,k.
 * The sum over channels is formed once per node and rotated for each k, where the general kernel forms it again
 * for each k: the same operations in the same order, so the same bits, with O(channels) work per node instead of
 * O(channels²). tests/solver/flat-kernels.test.ts compares whole runs with the general kernel bit for bit.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { sveaStepMean } from './step-mean'

/** The configuration's limit on channels (shared/physics/simulation-config.ts). */
const MAX_CHANNELS = 8
/** Per channel of the present node: D₀ (re, im), b̂, then b̄ (re, im). */
const d0 = new Float64Array(2 * MAX_CHANNELS)
const mean = new Float64Array(2 * MAX_CHANNELS)

/** True when the several-channel SVEA path applies (no Kerr, no noise, no higher-order term). */
export function channelsFastPathApplies(m: Model): boolean {
  return m.nCh > 1 && m.nCh <= MAX_CHANNELS && m.higherOrder === null && m.kerrHalfPump === 0 && m.kerrHalfStokes === 0 && m.noiseKickRms === 0
}

/** The interaction step at nodes j0..j1 of trapezoid weight `weight`, every channel. */
export function interactSveaChannels(m: Model, s: FieldState, j0: number, j1: number, weight: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const pr = m.phaseRe!, pim = m.phaseIm!
  const nCh = m.nCh
  const nodes = m.nodes
  const K = m.driveK
  const h = m.dtS
  const hh = 0.5 * m.dtS
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const c = m.exchangePerB * weight
  const kc = K * c
  const { m2r, m2i } = sveaStepMean(Er, Ei, h)
  for (let j = j0; j <= j1; j++) {
    // Predictor and trapezoid mean of every channel, and their sum Σ b̂_m p_m.
    let sr = 0, si = 0
    for (let k = 0, i = j; k < nCh; k++, i += nodes) {
      const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
      const d0r = -K * (ui * vr - ur * vi)
      const d0i = K * (ur * vr + ui * vi)
      const tr = br + h * d0r
      const ti = bi + h * d0i
      const x = 0.5 * (br + (Er * tr - Ei * ti))
      const y = 0.5 * (bi + (Er * ti + Ei * tr))
      d0[2 * k] = d0r
      d0[2 * k + 1] = d0i
      mean[2 * k] = x
      mean[2 * k + 1] = y
      const cr = pr[i], ci = pim[i]
      sr += x * cr - y * ci
      si += x * ci + y * cr
    }
    // Step-mean of every channel from the trapezoid field its light sees, and the new sum Σ b̄_m p_m.
    let tr = 0, ti = 0
    for (let k = 0, i = j; k < nCh; k++, i += nodes) {
      const kr = pr[i], ki = pim[i]
      const Br = sr * kr + si * ki
      const Bi = si * kr - sr * ki
      const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
      const g = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
      const er = g * Br
      const ei = g * Bi
      const x = mean[2 * k] + (m2r * er - m2i * ei)
      const y = mean[2 * k + 1] + (m2r * ei + m2i * er)
      tr += x * kr - y * ki
      ti += x * ki + y * kr
    }
    // Exchange with B_k frozen, then the corrector, channel by channel.
    for (let k = 0, i = j; k < nCh; k++, i += nodes) {
      const kr = pr[i], ki = pim[i]
      const betaR = c * (tr * kr + ti * ki)
      const betaI = c * (ti * kr - tr * ki)
      const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
      const q = 0.25 * (betaR * betaR + betaI * betaI)
      const den = 1 / (1 + q)
      const a = 1 - q
      const nur = (a * ur - betaR * vi - betaI * vr) * den
      const nui = (a * ui + betaR * vr - betaI * vi) * den
      const nvr = (a * vr - betaR * ui + betaI * ur) * den
      const nvi = (a * vi + betaR * ur + betaI * ui) * den
      uRe[i] = nur
      uIm[i] = nui
      vRe[i] = nvr
      vIm[i] = nvi
      const d1r = -K * (nui * nvr - nur * nvi)
      const d1i = K * (nur * nvr + nui * nvi)
      const br = bRe[i], bi = bIm[i]
      const sbr = br + hh * d0[2 * k]
      const sbi = bi + hh * d0[2 * k + 1]
      bRe[i] = Er * sbr - Ei * sbi + hh * d1r
      bIm[i] = Er * sbi + Ei * sbr + hh * d1i
    }
  }
}
