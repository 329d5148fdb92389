/*
 * Fast path with Kerr phases: one channel, SVEA, no noise. The steps of the contract in
 * interaction-kernel.ts, as `interactGeneral` computes them for that case, written flat per node (no
 * scratch, no calls) and with the general kernel's own rounding order, so the results are the same bits:
 *   D₀ = iK·u·v*,  b̃ = E(b + h·D₀),  b̂ = ½(b + b̃),  b̄ = b̂ + hφ₃·K·c·w·b̂·(|u|² − |v|²)
 *   (the step-mean with D₁ − D₀ from the exchange to first order: steppers/step-mean.ts)
 *   Kerr half step:  φ_p = κ_p,Kerr·w·(2P − P_p),  φ_s = κ_s,Kerr·w·(2P − P_s),  P = P_p + P_s,
 *                    P_p = κ_p|u|²,  P_s = κ|v|²,  A ← A·(1 − q + iφ)/(1 + q),  q = φ²/4   (Cayley, unit modulus)
 *   exchange with β = c·w·b̄ (Cayley, unitary): (u, v) ← (a·u + iβ·v, a·v + iβ*·u)/(1 + q_e),  a = 1 − q_e,  q_e = |β|²/4,
 *   Kerr half step again with the exchanged fields,  b ← E(b + h/2·D₀) + h/2·D₁.
 * Divisions set the cost of this step, so the quotients share reciprocals (two divisions where nine stood):
 *   first half step and exchange:  r = 1/((1 + q_e)·((1 + q_p)(1 + q_s))),  ũ = ((1 − q_p) + iφ_p)(1 + q_s)·u,
 *                                  ṽ = ((1 − q_s) + iφ_s)(1 + q_p)·v,  (u, v) ← (a·ũ + iβ·ṽ, a·ṽ + iβ*·ũ)·r
 *   second half step:              r = 1/((1 + q_p)(1 + q_s)),  u ← u·((1 − q_p) + iφ_p)·(1 + q_s)r,
 *                                  v ← v·((1 − q_s) + iφ_s)·(1 + q_p)r
 * tests/solver/kernel-bits.test.ts holds the general kernel's recorded hash of a Kerr run, which this path
 * must reproduce.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { sveaStepMean } from './step-mean'

/** True when the single-channel SVEA path with Kerr phases applies (Kerr on, no noise, no higher-order term). */
export function kerrFastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder === null && (m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0) && m.noiseKickRms === 0
}

/** The interaction step at nodes j0..j1 of trapezoid weight `weight`. */
export function interactSveaKerr(m: Model, s: FieldState, j0: number, j1: number, weight: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const K = m.driveK
  const h = m.dtS
  const hh = 0.5 * h
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const c = m.exchangePerB * weight
  const kp = m.kappaP
  const ks = m.rates.kappa
  const fp = m.kerrHalfPump * weight
  const fs = m.kerrHalfStokes * weight
  const kc = K * c
  const { m2r, m2i } = sveaStepMean(Er, Ei, h)
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j]
    const br = bRe[j], bi = bIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    const btr = 0.5 * (br + (Er * tr - Ei * ti))
    const bti = 0.5 * (bi + (Er * ti + Ei * tr))
    const uu = ur * ur + ui * ui
    const vv = vr * vr + vi * vi
    const g = kc * (uu - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const bbr = btr + (m2r * er - m2i * ei)
    const bbi = bti + (m2r * ei + m2i * er)
    // Kerr half step and exchange with b̄ frozen over one reciprocal.
    let pp = kp * uu
    let ps = ks * vv
    let total = pp + ps
    let phiP = fp * (2 * total - pp)
    let phiS = fs * (2 * total - ps)
    let qp = 0.25 * phiP * phiP
    let qs = 0.25 * phiS * phiS
    let dp = 1 + qp
    let ds = 1 + qs
    const betaR = c * bbr
    const betaI = c * bbi
    const qe = 0.25 * (betaR * betaR + betaI * betaI)
    const a = 1 - qe
    const den = 1 / ((1 + qe) * (dp * ds))
    let cr = (1 - qp) * ds
    let ci = phiP * ds
    const kur = cr * ur - ci * ui
    const kui = cr * ui + ci * ur
    cr = (1 - qs) * dp
    ci = phiS * dp
    const kvr = cr * vr - ci * vi
    const kvi = cr * vi + ci * vr
    const eur = (a * kur - betaR * kvi - betaI * kvr) * den
    const eui = (a * kui + betaR * kvr - betaI * kvi) * den
    const evr = (a * kvr - betaR * kui + betaI * kur) * den
    const evi = (a * kvi + betaR * kur + betaI * kui) * den
    // Kerr half step after the exchange.
    pp = kp * (eur * eur + eui * eui)
    ps = ks * (evr * evr + evi * evi)
    total = pp + ps
    phiP = fp * (2 * total - pp)
    phiS = fs * (2 * total - ps)
    qp = 0.25 * phiP * phiP
    qs = 0.25 * phiS * phiS
    dp = 1 + qp
    ds = 1 + qs
    const r = 1 / (dp * ds)
    const rp = ds * r
    const rs = dp * r
    cr = (1 - qp) * rp
    ci = phiP * rp
    const nur = cr * eur - ci * eui
    const nui = cr * eui + ci * eur
    cr = (1 - qs) * rs
    ci = phiS * rs
    const nvr = cr * evr - ci * evi
    const nvi = cr * evi + ci * evr
    uRe[j] = nur
    uIm[j] = nui
    vRe[j] = nvr
    vIm[j] = nvi
    // Corrector.
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si + hh * d1r
    bIm[j] = Er * si + Ei * sr + hh * d1i
  }
}
