/*
 * Coefficients of the Kerr step (docs/numerics.md, "Kerr phases"). Over half a step at a node of weight w the
 * pump turns by φ_p = f_p(P_p + 2P_s + 2P_other) and the Stokes wave by φ_s = f_s(2P_p + P_s + 2P_other)
 * (self-phase 1, cross-phase 2; Agrawal, Nonlinear Fiber Optics, ch. 7), P_p = κ_p|u|², P_s = κ_s|v|²,
 * f = γ·v_g·Δt·w/2. On |u|², |v|² of the node's own pair:
 *   φ_p = a_pp|u|² + a_ps|v|²,  a_pp = f_pκ_p,  a_ps = 2f_pκ_s;   φ_s = a_sp|u|² + a_ss|v|²,  a_sp = 2f_sκ_p,  a_ss = f_sκ_s.
 * The exchange moves power between u and v: to first order in β = c·b̂, |u|² gains δ = 2c·y, y = Re(b̂)·Im(uv*) −
 * Im(b̂)·Re(uv*), and |v|² loses it. The whole step's phase at the midpoint powers (|u|² + δ/2, |v|² − δ/2) is
 *   θ_p = 2φ_p + d_p·y,  d_p = 2c(a_pp − a_ps);   θ_s = 2φ_s + d_s·y,  d_s = 2c(a_sp − a_ss).
 * A Cayley factor (1 − q + iψ)/(1 + q), q = ψ²/4, has unit modulus exactly but turns by 2·atan(ψ/2) = ψ − ψ³/12 + …;
 * with ψ = θ(1 + θ²/12) it turns by θ − θ⁵/120 + …, so one factor per step carries the whole step's phase (two half
 * steps' plain factors would miss θ³/48, a fourth of what one plain factor misses).
 * With several channels the other channels' power P_other = T − (P_p + P_s) (T the node's total) adds g_p·P_other to
 * φ_p, g_p = 2f_p, and its change under their exchanges, (κ_p − κ_s)·2c·Σ_{other} y, adds e_p·Σ_{other} y to θ_p,
 * e_p = 2c·g_p(κ_p − κ_s) (likewise for the Stokes wave with f_s). For one channel both are exact zeros, so the
 * general kernel's sums give the bits of the flat kernels' (svea-kerr-kernel.ts, engine/assembly/svea-step.ts).
 */

/** The tangent correction's 1/12 (multiplied, not divided, as every kernel and the engine compute it). */
export const TWELFTH = 1 / 12

export interface KerrPhaseCoefficients {
  app: number
  aps: number
  asp: number
  ass: number
  dpc: number
  dsc: number
  gp: number
  gs: number
  epc: number
  esc: number
}

/** The coefficients above for half-step factors fp, fs (γ·v_g·Δt·w/2), power per |amplitude|² kp, ks and exchange c·w. */
export function kerrPhaseCoefficients(fp: number, fs: number, kp: number, ks: number, c: number): KerrPhaseCoefficients {
  const app = fp * kp
  const aps = 2 * fp * ks
  const asp = 2 * fs * kp
  const ass = fs * ks
  const gp = 2 * fp
  const gs = 2 * fs
  return { app, aps, asp, ass, dpc: 2 * c * (app - aps), dsc: 2 * c * (asp - ass), gp, gs, epc: 2 * c * (gp * (kp - ks)), esc: 2 * c * (gs * (kp - ks)) }
}
