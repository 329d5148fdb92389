/*
 * The SVEA interaction step and the transport for a waveguide with a longitudinal profile: the arithmetic of
 * interactSvea (interaction-kernel.ts, steps 2–4 of its contract) with the constants read per node,
 *
 *   D₀ = iK_j u v*,  b̃ = E_j(b + Δt D₀),  b̂ = (b + b̃)/2,  c_j = 2·cHalf_j   (cHalf_j carries the trapezoid weight)
 *   b̄ = b̂ + Δt φ₃(z_j)·K_j c_j b̂ (|u|² − |v|²),  β_j = c_j b̄   (steppers/step-mean.ts)
 *   (u, v) ← Cayley exchange with β_j,   b ← E_j(b + Δt/2 D₀) + Δt/2 D₁
 *
 * and the shift along the characteristics with the loss of the cell each wave crosses. With per-node values
 * equal to the uniform ones every operation is the fast path's, in the same order: the results agree bit for bit.
 */
import type { ProfileArrays } from '../problem/profile-model'
import type { FieldState } from './interaction-kernel'
import { sveaStepMean } from './step-mean'

/** Interaction at nodes 0..nz of the single channel. */
export function interactProfile(s: FieldState, p: ProfileArrays, nz: number, h: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const { cHalf: C, K: Ks, eRe, eIm } = p
  const hh = 0.5 * h
  for (let j = 0; j <= nz; j++) {
    const K = Ks[j]
    const cHalf = C[j]
    const Er = eRe[j]
    const Ei = eIm[j]
    const ur = uRe[j]
    const ui = uIm[j]
    const vr = vRe[j]
    const vi = vIm[j]
    const br = bRe[j]
    const bi = bIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    // The step-mean's coefficients of this node's E_j (kept from node to node while E_j does not change).
    const { m2r, m2i } = sveaStepMean(Er, Ei, h)
    const c = 2 * cHalf
    const btr = 0.5 * (br + (Er * tr - Ei * ti))
    const bti = 0.5 * (bi + (Er * ti + Ei * tr))
    const g = K * c * (ur * ur + ui * ui - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const betaR = c * (btr + (m2r * er - m2i * ei))
    const betaI = c * (bti + (m2r * ei + m2i * er))
    const q = 0.25 * (betaR * betaR + betaI * betaI)
    const den = 1 / (1 + q)
    const a = 1 - q
    const nur = (a * ur - betaR * vi - betaI * vr) * den
    const nui = (a * ui + betaR * vr - betaI * vi) * den
    const nvr = (a * vr - betaR * ui + betaI * ur) * den
    const nvi = (a * vi + betaR * ur + betaI * ui) * den
    uRe[j] = nur
    uIm[j] = nui
    vRe[j] = nvr
    vIm[j] = nvi
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si - hh * K * (nui * nvr - nur * nvi)
    bIm[j] = Er * si + Ei * sr + hh * K * (nur * nvr + nui * nvi)
  }
}

/** Pump j → j+1 and Stokes j+1 → j, each multiplied by the loss of the cell it crossed. */
export function transportProfile(s: FieldState, p: ProfileArrays, nz: number): void {
  const loss = p.lossCell
  s.uRe.copyWithin(1, 0, nz)
  s.uIm.copyWithin(1, 0, nz)
  s.vRe.copyWithin(0, 1, nz + 1)
  s.vIm.copyWithin(0, 1, nz + 1)
  for (let j = 1; j <= nz; j++) (s.uRe[j] *= loss[j]), (s.uIm[j] *= loss[j])
  for (let j = 0; j < nz; j++) (s.vRe[j] *= loss[j + 1]), (s.vIm[j] *= loss[j + 1])
}
