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
 *  1. Predictor for every field from the entry waves: b̃ = E(b + Δt·D₀), E = e^{−(Γ/2 − iΔ)Δt}; b̄ = (b + b̃)/2.
 *  2. Optical exchange with every b̄ frozen: exact-unitary Cayley 2×2 rotations, processes 1 … P−1 at half
 *     weight, P at full weight, then P−1 … 1 at half weight (Strang symmetric, so second order; one process is
 *     one rotation, the plain kernel's). Each rotation keeps |a_h|² + |a_l|²: total photon flux is kept to
 *     round-off (Manley–Rowe; Boyd, Nonlinear Optics).
 *  3. Corrector from the exchanged waves: b ← E(b + Δt/2·D₀) + Δt/2·D₁.
 *  Node weight: 1 inside, ½ at the two facets (trapezoid along every characteristic).
 */
import type { NetworkModel } from './network-model'

export interface NetworkState {
  aRe: Float64Array[]
  aIm: Float64Array[]
  bRe: Float64Array[]
  bIm: Float64Array[]
  /** Per field: D₀ and b̄ of the node in hand. */
  scratch: Float64Array
}

export function allocateNetworkState(m: NetworkModel): NetworkState {
  const arrays = (n: number) => Array.from({ length: n }, () => new Float64Array(m.nodes))
  return { aRe: arrays(m.waves.length), aIm: arrays(m.waves.length), bRe: arrays(m.fields.length), bIm: arrays(m.fields.length), scratch: new Float64Array(4 * m.fields.length) }
}

/** Adds i·K·a_h a_l*·e^{−iθ} of every process at node j into d (re at 2f, im at 2f + 1). */
function sources(m: NetworkModel, s: NetworkState, j: number, d: Float64Array, offset: number): void {
  const F = m.fields.length
  for (let f = 0; f < F; f++) (d[offset + 2 * f] = 0), (d[offset + 2 * f + 1] = 0)
  for (const p of m.processes) {
    const hr = s.aRe[p.higher][j], hi = s.aIm[p.higher][j]
    const lr = s.aRe[p.lower][j], li = s.aIm[p.lower][j]
    let xr = hr * lr + hi * li
    let xi = hi * lr - hr * li
    if (p.phaseRe) {
      const cr = p.phaseRe[j], ci = p.phaseIm![j]
      const yr = xr * cr + xi * ci
      xi = xi * cr - xr * ci
      xr = yr
    }
    d[offset + 2 * p.field] -= p.K * xi
    d[offset + 2 * p.field + 1] += p.K * xr
  }
}

/** Cayley rotation of (a_h, a_l) with generator i[[0, β], [β*, 0]]; β = scale·b̄·e^{iθ}. */
function rotate(s: NetworkState, j: number, h: number, l: number, betaR: number, betaI: number): void {
  const ur = s.aRe[h][j], ui = s.aIm[h][j], vr = s.aRe[l][j], vi = s.aIm[l][j]
  const q = 0.25 * (betaR * betaR + betaI * betaI)
  const den = 1 / (1 + q)
  const a = 1 - q
  s.aRe[h][j] = (a * ur - betaR * vi - betaI * vr) * den
  s.aIm[h][j] = (a * ui + betaR * vr - betaI * vi) * den
  s.aRe[l][j] = (a * vr - betaR * ui + betaI * ur) * den
  s.aIm[l][j] = (a * vi + betaR * ur + betaI * ui) * den
}

export function interactNetwork(m: NetworkModel, s: NetworkState, j0: number, j1: number, weight: number): void {
  const F = m.fields.length
  const P = m.processes.length
  const h = m.dtS
  const hh = 0.5 * h
  const d = s.scratch
  // d: D₀ at [0, 2F), b̄ at [2F, 4F)
  const bb = 2 * F
  for (let j = j0; j <= j1; j++) {
    sources(m, s, j, d, 0)
    for (let f = 0; f < F; f++) {
      const { eRe: Er, eIm: Ei } = m.fields[f].svea
      const br = s.bRe[f][j], bi = s.bIm[f][j]
      const tr = br + h * d[2 * f], ti = bi + h * d[2 * f + 1]
      d[bb + 2 * f] = 0.5 * (br + Er * tr - Ei * ti)
      d[bb + 2 * f + 1] = 0.5 * (bi + Er * ti + Ei * tr)
    }
    for (let k = 0; k < 2 * P - 1; k++) {
      const pi = k < P ? k : 2 * P - 2 - k
      const p = m.processes[pi]
      const c = (pi === P - 1 ? 1 : 0.5) * weight * p.c
      let betaR = c * d[bb + 2 * p.field]
      let betaI = c * d[bb + 2 * p.field + 1]
      if (p.phaseRe) {
        const cr = p.phaseRe[j], ci = p.phaseIm![j]
        const r = betaR * cr - betaI * ci
        betaI = betaR * ci + betaI * cr
        betaR = r
      }
      rotate(s, j, p.higher, p.lower, betaR, betaI)
    }
    // b ← E(b + h/2·D₀) + h/2·D₁ ; D₁ overwrites b̄ (no longer needed)
    sources(m, s, j, d, bb)
    for (let f = 0; f < F; f++) {
      const { eRe: Er, eIm: Ei } = m.fields[f].svea
      const sr = s.bRe[f][j] + hh * d[2 * f], si = s.bIm[f][j] + hh * d[2 * f + 1]
      s.bRe[f][j] = Er * sr - Ei * si + hh * d[bb + 2 * f]
      s.bIm[f][j] = Er * si + Ei * sr + hh * d[bb + 2 * f + 1]
    }
  }
}
