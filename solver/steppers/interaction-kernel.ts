/*
 * Local interaction step at grid nodes (the "L" part of the characteristic scheme; transport is an exact
 * shift done by the driver). Contract shared by both kernels:
 *  1. On entry, node j holds the pump and Stokes that have just arrived along their characteristics and the
 *     acoustic envelope b of that node; the kernel advances b by one full Δt and applies to the optical
 *     pair the exchange of `weight` characteristic cells (1 inside, ½ at the two facets: trapezoid weights,
 *     so a facet node gives the leaving wave its last half cell and the entering wave its first).
 *  2. Predictor: D₀ = iκAₚAₛ* from the entry fields; b̃ = e^{−λΔt}(b + Δt·D₀) (SVEA) or the ETD step with a
 *     constant source (higher order); b̄ = (b + b̃)/2.
 *  3. Optical exchange with b̄ frozen, in Cayley (implicit-midpoint) form:
 *     (u, v) ← [[1 − |β|²/4, iβ], [iβ*, 1 − |β|²/4]](u, v)/(1 + |β|²/4),  β = √(κκp)·vg·Δt·weight·b̄.
 *     The matrix is exactly unitary, so |u|² + |v|² (photon flux) is kept to round-off: Manley–Rowe.
 *     Kerr phases, when on, are applied as half steps before and after, also in Cayley form (unit modulus).
 *  4. Corrector: D₁ from the exchanged fields; b ← e^{−λΔt}(b + Δt/2·D₀) + Δt/2·D₁ (SVEA), or the ETD step
 *     with the linearly interpolated source (higher order).
 *  5. Thermal noise (when on): one complex normal draw per node and step, the exact Ornstein–Uhlenbeck kick
 *     (SVEA) or a Langevin force held over the step (higher order), enters both the predictor b̃ and the
 *     corrected b, so the step-averaged b̄ the light sees carries the step's noise. Facet nodes (weight ½)
 *     get twice the variance, as half cells. Both keep the noise observables second order.
 * Each part is second order, and the whole step is Strang-symmetric around the transport, so the scheme
 * is globally second order (shown in tests/solver/convergence.test.ts).
 */
import type { Model } from '../problem/coupled-modes'
import type { NormalSource } from '../noise/random'

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
  /** Per-channel scratch: 8 numbers per channel. */
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
    scratch: new Float64Array(8 * m.nCh),
  }
}

/** True when the single-channel SVEA fast path applies. */
export function fastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder === null && m.kerrHalfPump === 0 && m.kerrHalfStokes === 0 && m.noiseKickRms === 0
}

/**
 * Fast path: one channel, SVEA, no Kerr, no noise. Same arithmetic as `interactGeneral` for that case,
 * written out flat (no allocation, no calls, no trig) for speed.
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
    // β = c·(b + E(b + hD0))/2
    const betaR = cHalf * (br + Er * tr - Ei * ti)
    const betaI = cHalf * (bi + Er * ti + Ei * tr)
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

/** General path: any number of channels, optional higher-order acoustics, Kerr and thermal noise. */
export function interactGeneral(m: Model, s: FieldState, j: number, weight: number, rng: NormalSource | null): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const K = m.driveK
  const h = m.dtS
  const hh = 0.5 * h
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const ho = m.higherOrder
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm, scratch } = s
  // scratch per channel k: [0,1] b̄, [2,3] D0, [4,5] B seen by this channel's optics, [6,7] the step's noise draw
  for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    let bpr: number, bpi: number
    if (ho === null) {
      const tr = br + h * d0r
      const ti = bi + h * d0i
      bpr = Er * tr - Ei * ti
      bpi = Er * ti + Ei * tr
    } else {
      // g0 = (0, f)·D0 = (−f·D0i, f·D0r), f = −2Ω
      const g0r = -ho.sourceFactor[1] * d0i
      const g0i = ho.sourceFactor[1] * d0r
      const wr = wRe[i], wi = wIm[i]
      bpr = ho.e00[0] * br - ho.e00[1] * bi + ho.e01[0] * wr - ho.e01[1] * wi + ho.p0b[0] * g0r - ho.p0b[1] * g0i
      bpi = ho.e00[0] * bi + ho.e00[1] * br + ho.e01[0] * wi + ho.e01[1] * wr + ho.p0b[0] * g0i + ho.p0b[1] * g0r
    }
    const o = 8 * k
    if (rng !== null) {
      // The step's random kick is drawn before the predictor and enters b̃ too, so b̄ carries the noise of
      // the whole step (docs/numerics.md, "Thermal noise"); adding it only after the corrector would scale
      // the noise that the light sees by (1 + E)/2, a first-order error in the spontaneous Stokes power.
      const sd = (ho === null ? m.noiseKickRms : m.noiseForceRms) * Math.SQRT1_2 * noiseWeight(weight)
      const xr = sd * rng.normal(), xi = sd * rng.normal()
      scratch[o + 6] = xr
      scratch[o + 7] = xi
      if (ho === null) {
        bpr += xr
        bpi += xi
      } else {
        // Langevin force held constant over the step: g = (0, f)·F enters like the light's source.
        const f = ho.sourceFactor[1]
        const gr = -f * xi, gi = f * xr
        bpr += ho.p0b[0] * gr - ho.p0b[1] * gi
        bpi += ho.p0b[0] * gi + ho.p0b[1] * gr
      }
    }
    scratch[o] = 0.5 * (br + bpr)
    scratch[o + 1] = 0.5 * (bi + bpi)
    if (rng !== null && ho === null) {
      // The trapezoid mean (b + b̃)/2 of the noisy path has the right low-frequency spectrum but a variance
      // short by V(1 − Re E)/2 (its high-frequency part, ≈ Γ_B Δt/4): an independent white draw of that
      // variance restores ⟨|b̄|²⟩ = V without touching the spectrum near the gain line.
      const sd = m.noiseMeanRms * Math.SQRT1_2 * noiseWeight(weight)
      scratch[o] += sd * rng.normal()
      scratch[o + 1] += sd * rng.normal()
    }
    scratch[o + 2] = d0r
    scratch[o + 3] = d0i
  }
  if (m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0) kerrHalfStep(m, s, j, weight)
  const c = m.exchangePerB * weight
  for (let k = 0; k < nCh; k++) {
    const o = 8 * k
    let Br = scratch[o], Bi = scratch[o + 1]
    if (nCh > 1) {
      // B_k = e^{−i q_k z} Σ_m b̄_m e^{i q_m z}
      const pr = m.phaseRe!, pim = m.phaseIm!
      let sr = 0, si = 0
      for (let mm = 0; mm < nCh; mm++) {
        const x = scratch[8 * mm], y = scratch[8 * mm + 1]
        const cr = pr[mm * nodes + j], ci = pim[mm * nodes + j]
        sr += x * cr - y * ci
        si += x * ci + y * cr
      }
      const kr = pr[k * nodes + j], ki = pim[k * nodes + j]
      Br = sr * kr + si * ki
      Bi = si * kr - sr * ki
    }
    scratch[o + 4] = Br
    scratch[o + 5] = Bi
  }
  for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = 8 * k
    const betaR = c * scratch[o + 4], betaI = c * scratch[o + 5]
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
    const q = 0.25 * (betaR * betaR + betaI * betaI)
    const den = 1 / (1 + q)
    const a = 1 - q
    uRe[i] = (a * ur - betaR * vi - betaI * vr) * den
    uIm[i] = (a * ui + betaR * vr - betaI * vi) * den
    vRe[i] = (a * vr - betaR * ui + betaI * ur) * den
    vIm[i] = (a * vi + betaR * ur + betaI * ui) * den
  }
  if (m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0) kerrHalfStep(m, s, j, weight)
  for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = 8 * k
    const nur = uRe[i], nui = uIm[i], nvr = vRe[i], nvi = vIm[i]
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const d0r = scratch[o + 2], d0i = scratch[o + 3]
    const br = bRe[i], bi = bIm[i]
    if (ho === null) {
      const sr = br + hh * d0r
      const si = bi + hh * d0i
      let nbr = Er * sr - Ei * si + hh * d1r
      let nbi = Er * si + Ei * sr + hh * d1i
      if (rng !== null) {
        // Exact Ornstein–Uhlenbeck kick, the one drawn for the predictor.
        nbr += scratch[o + 6]
        nbi += scratch[o + 7]
      }
      bRe[i] = nbr
      bIm[i] = nbi
    } else {
      const f = ho.sourceFactor[1]
      // g = (0, f)·D = (−f·Di, f·Dr); y₁ = E y₀ + (P₀ − P₁) g₀ + P₁ g₁
      let g0r = -f * d0i, g0i = f * d0r
      const g1r = -f * d1i, g1i = f * d1r
      const wr = wRe[i], wi = wIm[i]
      const qbr = ho.p0b[0] - ho.p1b[0], qbi = ho.p0b[1] - ho.p1b[1]
      const qwr = ho.p0w[0] - ho.p1w[0], qwi = ho.p0w[1] - ho.p1w[1]
      let nbr = ho.e00[0] * br - ho.e00[1] * bi + ho.e01[0] * wr - ho.e01[1] * wi + qbr * g0r - qbi * g0i + ho.p1b[0] * g1r - ho.p1b[1] * g1i
      let nbi = ho.e00[0] * bi + ho.e00[1] * br + ho.e01[0] * wi + ho.e01[1] * wr + qbr * g0i + qbi * g0r + ho.p1b[0] * g1i + ho.p1b[1] * g1r
      let nwr = ho.e10[0] * br - ho.e10[1] * bi + ho.e11[0] * wr - ho.e11[1] * wi + qwr * g0r - qwi * g0i + ho.p1w[0] * g1r - ho.p1w[1] * g1i
      let nwi = ho.e10[0] * bi + ho.e10[1] * br + ho.e11[0] * wi + ho.e11[1] * wr + qwr * g0i + qwi * g0r + ho.p1w[0] * g1i + ho.p1w[1] * g1r
      if (rng !== null) {
        // The Langevin force drawn for the predictor: g = (0, f)·F, F complex normal, E|F|² = noiseForceRms².
        const Fr = scratch[o + 6], Fi = scratch[o + 7]
        g0r = -f * Fi
        g0i = f * Fr
        nbr += ho.p0b[0] * g0r - ho.p0b[1] * g0i
        nbi += ho.p0b[0] * g0i + ho.p0b[1] * g0r
        nwr += ho.p0w[0] * g0r - ho.p0w[1] * g0i
        nwi += ho.p0w[0] * g0i + ho.p0w[1] * g0r
      }
      bRe[i] = nbr
      bIm[i] = nbi
      wRe[i] = nwr
      wIm[i] = nwi
    }
  }
}

/**
 * Noise amplitude factor of a node of trapezoid weight w: a facet node stands for half a cell, so its
 * acoustic field carries twice the variance per node (ħω_s n_th/(wΔz)), which keeps the noise per unit
 * length right at the facets.
 */
export function noiseWeight(weight: number): number {
  return weight === 1 ? 1 : Math.sqrt(1 / weight)
}

/** SPM + XPM (factor 2 for every other wave present) over half a step, as a Cayley rotation. */
function kerrHalfStep(m: Model, s: FieldState, j: number, weight: number): void {
  const { uRe, uIm, vRe, vIm } = s
  let total = 0
  for (let k = 0; k < m.nCh; k++) {
    const i = k * m.nodes + j
    total += m.kappaP * (uRe[i] * uRe[i] + uIm[i] * uIm[i]) + m.rates.kappa * (vRe[i] * vRe[i] + vIm[i] * vIm[i])
  }
  for (let k = 0; k < m.nCh; k++) {
    const i = k * m.nodes + j
    const pp = m.kappaP * (uRe[i] * uRe[i] + uIm[i] * uIm[i])
    const ps = m.rates.kappa * (vRe[i] * vRe[i] + vIm[i] * vIm[i])
    rotate(uRe, uIm, i, m.kerrHalfPump * weight * (2 * total - pp))
    rotate(vRe, vIm, i, m.kerrHalfStokes * weight * (2 * total - ps))
  }
}

/** Multiply element i by (1 + iφ/2)/(1 − iφ/2): unit modulus, phase 2·atan(φ/2) = φ + O(φ³). */
function rotate(re: Float64Array, im: Float64Array, i: number, phi: number): void {
  const q = 0.25 * phi * phi
  const cr = (1 - q) / (1 + q)
  const ci = phi / (1 + q)
  const r = re[i], x = im[i]
  re[i] = cr * r - ci * x
  im[i] = cr * x + ci * r
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
