/*
 * Local interaction step at grid nodes (the "L" part of the characteristic scheme; transport is an exact
 * shift done by the driver). Contract shared by both kernels:
 *  1. On entry, node j holds the pump and Stokes that have just arrived along their characteristics and the
 *     acoustic envelope b of that node; the kernel advances b by one full Δt and applies to the optical
 *     pair the exchange of `weight` characteristic cells (1 inside, ½ at the two facets: trapezoid weights,
 *     so a facet node gives the leaving wave its last half cell and the entering wave its first).
 *  2. Predictor: D₀ = iκAₚAₛ* from the entry fields; b̃ = e^{−λΔt}(b + Δt·D₀) (SVEA) or the ETD step with a
 *     constant source (higher order); the trapezoid mean b̂ = (b + b̃)/2. The step-mean the light sees adds the
 *     source's change over the step, the term the trapezoid's held source misses (steppers/step-mean.ts):
 *       b̄ = b̂ + Δt·φ₃(z)·(D₁ − D₀),  z = −λΔt  (SVEA; higher order: the (b, ∂t b) entry of Δt·φ₃ of the 2×2
 *       generator on (0, f)·(D₁ − D₀), acoustic-propagator.ts),
 *     with D₁ − D₀ = K·c·w·b̂·(|u|² − |v|²), the exchange to first order.
 *  3. Optical exchange with b̄ frozen, in Cayley (implicit-midpoint) form:
 *     (u, v) ← [[1 − |β|²/4, iβ], [iβ*, 1 − |β|²/4]](u, v)/(1 + |β|²/4),  β = √(κκp)·vg·Δt·weight·b̄.
 *     The matrix is exactly unitary, so |u|² + |v|² (photon flux) is kept to round-off: Manley–Rowe.
 *     Kerr phases, when on, are half steps before and after (Strang), computed as one exchange and one rotation
 *     (kerr-phase.ts): the first half step moved through the exchange turns β by the Cayley factor of φ_s − φ_p,
 *     then each field turns once by the whole step's phase θ at the midpoint powers (the exchange's power change to
 *     first order, from b̂), as the Cayley factor of θ(1 + θ²/12) (unit modulus, turns by θ to O(θ⁵)); one
 *     reciprocal per node (general-kernel.ts, docs/numerics.md). Their change of D over the step is left out of
 *     D₁ − D₀ (b̄ then keeps an O(Δt²) Kerr part: still order 2).
 *  4. Corrector: D₁ from the exchanged fields; b ← e^{−λΔt}(b + Δt/2·D₀) + Δt/2·D₁ (SVEA), or the ETD step
 *     with the linearly interpolated source (higher order).
 *  5. Thermal noise (when on): one complex normal draw per node and step, the exact Ornstein–Uhlenbeck kick X
 *     (SVEA) or a Langevin force F held over the step (higher order), enters both the predictor b̃ and the
 *     corrected b, so the step-averaged b̄ the light sees carries the step's noise (SVEA: plus an extra draw that
 *     gives b̄ its full variance). Facet nodes (weight ½) get twice the variance, as half cells. Both keep the
 *     noise observables second order.
 * Each part is second order, and the whole step is Strang-symmetric around the transport, so the scheme
 * is globally second order (shown in tests/solver/convergence.test.ts).
 */
import type { Model } from '../problem/coupled-modes'
import { SCRATCH_NODES, SCRATCH_PER_CHANNEL } from './general-kernel'
import { sveaStepMean } from './step-mean'

export { interactGeneral, noiseWeight } from './general-kernel'

export interface FieldState {
  uRe: Float64Array
  uIm: Float64Array
  vRe: Float64Array
  vIm: Float64Array
  bRe: Float64Array
  bIm: Float64Array
  /** ∂t b for the higher-order acoustic equation (length 0 otherwise). */
  wRe: Float64Array
  wIm: Float64Array
  /** Scratch of interactGeneral: SCRATCH_PER_CHANNEL numbers per channel and node of a block (layout there). */
  scratch: Float64Array
}

export function allocateState(m: Model): FieldState {
  const n = m.nCh * m.nodes
  const nw = m.higherOrder ? n : 0
  return {
    uRe: new Float64Array(n),
    uIm: new Float64Array(n),
    vRe: new Float64Array(n),
    vIm: new Float64Array(n),
    bRe: new Float64Array(n),
    bIm: new Float64Array(n),
    wRe: new Float64Array(nw),
    wIm: new Float64Array(nw),
    scratch: new Float64Array(SCRATCH_PER_CHANNEL * SCRATCH_NODES * m.nCh),
  }
}

/** True when the single-channel SVEA fast path applies. */
export function fastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder === null && m.kerrHalfPump === 0 && m.kerrHalfStokes === 0 && m.noiseKickRms === 0
}

/**
 * Fast path: one channel, SVEA, no Kerr, no noise. Same arithmetic as `interactGeneral` for that case,
 * written out flat (no allocation, no calls, no trig) for speed; cHalf = c·w/2, so c = 2·cHalf exactly.
 */
export function interactSvea(
  uRe: Float64Array,
  uIm: Float64Array,
  vRe: Float64Array,
  vIm: Float64Array,
  bRe: Float64Array,
  bIm: Float64Array,
  j0: number,
  j1: number,
  K: number,
  cHalf: number,
  Er: number,
  Ei: number,
  h: number,
): void {
  const hh = 0.5 * h
  const c = 2 * cHalf
  const kc = K * c
  const { m2r, m2i } = sveaStepMean(Er, Ei, h)
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j]
    const ui = uIm[j]
    const vr = vRe[j]
    const vi = vIm[j]
    const br = bRe[j]
    const bi = bIm[j]
    // D0 = iK·u·v*
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    // Trapezoid mean b̂ = (b + E(b + hD0))/2, then D1 − D0 ≈ K·c·b̂·(|u|² − |v|²) and b̄ = b̂ + hφ3·(D1 − D0).
    const btr = 0.5 * (br + (Er * tr - Ei * ti))
    const bti = 0.5 * (bi + (Er * ti + Ei * tr))
    const g = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
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
    // b ← E(b + h/2·D0) + h/2·D1
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si - hh * K * (nui * nvr - nur * nvi)
    bIm[j] = Er * si + Ei * sr + hh * K * (nur * nvr + nui * nvi)
  }
}

/** Upwind advection of b (and ∂t b) at v_A: first order, keeps the centroid speed exact; sound enters z = 0 as zero. */
export function advectAcoustic(m: Model, s: FieldState): void {
  const c = m.advectionCourant
  const arrays = m.higherOrder ? [s.bRe, s.bIm, s.wRe, s.wIm] : [s.bRe, s.bIm]
  for (const a of arrays) {
    for (let k = 0; k < m.nCh; k++) {
      const base = k * m.nodes
      for (let j = m.nodes - 1; j > 0; j--) a[base + j] -= c * (a[base + j] - a[base + j - 1])
      a[base] *= 1 - c
    }
  }
}
