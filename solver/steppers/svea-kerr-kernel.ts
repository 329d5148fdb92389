/*
 * Fast path with Kerr phases: one channel, SVEA, no noise. The steps of the contract in
 * interaction-kernel.ts, as `interactGeneral` computes them for that case, written flat per node (no
 * scratch, no calls) and with the general kernel's own rounding order, so the results are the same bits:
 *   p = u·v*,  D₀ = iK·p,  b̃ = E(b + h·D₀),  b̂ = ½(b + b̃),  b̄ = b̂ + hφ₃·K·c·w·b̂·(|u|² − |v|²)
 *   (the step-mean with D₁ − D₀ from the exchange to first order: steppers/step-mean.ts)
 *   φ_p = a_pp|u|² + a_ps|v|²,  φ_s = a_sp|u|² + a_ss|v|²  (first half step),  y = Re(b̂)·Im(p) − Im(b̂)·Re(p),
 *   θ = 2φ + d·y  (whole step, midpoint powers),  ψ = θ(1 + θ²/12),  Δφ = φ_s − φ_p   (kerr-phase.ts)
 *   r = 1/(((1 + q_e)(1 + q_r))((1 + q_p)(1 + q_s))),  q_e = |β|²/4, β = c·w·b̄,  q_r = Δφ²/4,  q_p,s = ψ_p,s²/4,
 *   a = (1 − q_e)(1 + q_r),  β' = β·((1 − q_r) + iΔφ)   (exchange in the first half step's frame, numerators)
 *   u ← ((1 − q_p) + iψ_p)·(1 + q_s)r·(a·u + iβ'·v),  v ← ((1 − q_s) + iψ_s)·(1 + q_p)r·(a·v + iβ'*·u),
 *   b ← E(b + h/2·D₀) + h/2·D₁.
 * The rotation does not wait for the exchange (its phase comes from the entry fields and b̂), so the chain of
 * dependent operations per node is barely longer than the plain step's, with one division.
 * tests/solver/kernel-bits.test.ts holds the general kernel's recorded hash of a Kerr run, which this path
 * must reproduce.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { kerrPhaseCoefficients, TWELFTH } from './kerr-phase'
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
  const { app, aps, asp, ass, dpc, dsc } = kerrPhaseCoefficients(fp, fs, kp, ks, c)
  const kc = K * c
  const { m2r, m2i } = sveaStepMean(Er, Ei, h)
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j]
    const br = bRe[j], bi = bIm[j]
    // p = u·v*: D₀ = iK·p, and the exchange's first-order change of the powers.
    const pr = ur * vr + ui * vi
    const pi = ui * vr - ur * vi
    const d0r = -K * pi
    const d0i = K * pr
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
    // Kerr phases: the first half step's from the entry powers, the whole step's at the midpoint powers.
    const phiP = app * uu + aps * vv
    const phiS = asp * uu + ass * vv
    const y = btr * pi - bti * pr
    const tp0 = 2 * phiP + dpc * y
    const ts0 = 2 * phiS + dsc * y
    const tp = tp0 * (1 + TWELFTH * tp0 * tp0)
    const ts = ts0 * (1 + TWELFTH * ts0 * ts0)
    const dphi = phiS - phiP
    const qr = 0.25 * dphi * dphi
    const qp = 0.25 * tp * tp
    const qs = 0.25 * ts * ts
    const dp = 1 + qp
    const ds = 1 + qs
    const betaR = c * bbr
    const betaI = c * bbi
    const qe = 0.25 * (betaR * betaR + betaI * betaI)
    const dr = 1 + qr
    const r = 1 / (((1 + qe) * dr) * (dp * ds))
    // The exchange in the first half step's frame: β turned by the Cayley factor of φ_s − φ_p (numerators).
    const a = (1 - qe) * dr
    const cr0 = 1 - qr
    const xr = betaR * cr0 - betaI * dphi
    const xi = betaR * dphi + betaI * cr0
    const eur = a * ur - xr * vi - xi * vr
    const eui = a * ui + xr * vr - xi * vi
    const evr = a * vr - xr * ui + xi * ur
    const evi = a * vi + xr * ur + xi * ui
    // The whole step's Kerr rotations, each over the shared reciprocal.
    const rp = ds * r
    const rs = dp * r
    let cr = (1 - qp) * rp
    let ci = tp * rp
    const nur = cr * eur - ci * eui
    const nui = cr * eui + ci * eur
    cr = (1 - qs) * rs
    ci = ts * rs
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
