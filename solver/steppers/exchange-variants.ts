/*
 * Variants of the local step of the one-channel SVEA case (contract at the top of interaction-kernel.ts), to
 * measure where the error constant of the step comes from. The driver runs one of them, the Cayley exchange with
 * the trapezoid mean plus the linearised source's change ('trapezoid-linearised' = interactSvea, DEFAULT_VARIANT);
 * the others, the plain trapezoid mean that was the step before it included, are run only by the error-constant
 * benchmark and its tests (exchange-variant-run.ts).
 *
 * The optical exchange at a node with the acoustic field frozen at b̄ over the step is the linear system
 *     d(u, v)/ds = G (u, v),  G = [[0, iβ], [iβ*, 0]],  s ∈ [0, 1],  β = c·b̄ (c = √(κκp)·vg·Δt·weight).
 * G is anti-Hermitian and G² = [[iβ·iβ*, 0], [0, iβ*·iβ]] = −|β|² I, so the exponential series splits into
 * its even and odd powers, G^{2k} = (−|β|²)^k I and G^{2k+1} = (−|β|²)^k G:
 *     exp(G) = cos|β| I + (sin|β|/|β|) G
 *            = [[cos|β|, i(β/|β|) sin|β|], [i(β*)/|β| sin|β|, cos|β|]]          ('exact').
 * The default Cayley (implicit-midpoint) map is (I − G/2)⁻¹(I + G/2) = ((1 − q) I + G)/(1 + q), q = |β|²/4
 * (using (I − G/2)(I + G/2) = (1 + q) I), i.e. the same rotation with cos θ = (1 − q)/(1 + q),
 * sin θ/|β| = 1/(1 + q): the angle θ = 2·atan(|β|/2) = |β| − |β|³/12 + O(|β|⁵)                ('cayley').
 * Both are exactly unitary (photon flux |u|² + |v|² kept to round-off); they differ by O(|β|³) per step.
 *
 * Average of b over the step ('average'):
 *  'trapezoid' (default): b̄ = (b + b̃)/2, b̃ = E(b + Δt·D₀), E = e^{−λΔt}, i.e. the source held at D₀.
 *  'linear-source': the exact mean over the step of the solution of ∂t b = −λb + D(t) with D interpolated
 *     linearly between D₀ and D₁ (D₁ from a first exchange with the trapezoid b̄), then the exchange is
 *     redone from the entry fields with it:
 *       b̄ = φ₁(z)·b + Δt·φ₂(z)·D₀ + Δt·φ₃(z)·(D₁ − D₀),  z = −λΔt,
 *       φ₁ = (e^z − 1)/z, φ₂ = (e^z − 1 − z)/z², φ₃ = (e^z − 1 − z − z²/2)/z³   (→ 1, ½, ⅙ as z → 0).
 *     The trapezoid b̄ misses the source's change over the step, Δt(D₀ − D₁)/6: an O(Δt²) error of b̄ and an
 *     O(Δt³) local error of the exchange. Costs a second exchange per node and step.
 *  'linearised-source': the same mean with D₁ − D₀ taken from the exchange to first order instead of a first
 *     exchange: (u₁, v₁) = (u + iβv, v + iβ*u) + O(β²) gives u₁v₁* = uv* + iβ(|v|² − |u|²) + O(β²), so
 *       D₁ − D₀ = K·β·(|u|² − |v|²) + O(Δt²),  β = c·b̄ (trapezoid b̄),
 *     which changes b̄ by O(Δt³) only: the same order of accuracy at one exchange per node and step.
 *  'constant-source': the exact mean with the source held at D₀, b̄ = φ₁(z)·b + Δt·φ₂(z)·D₀ (the D₁ − D₀ term left
 *     out): separates what the exact φ-weights do from what the source's change over the step does.
 *  'trapezoid-linearised': the trapezoid mean plus the linearised source's change, b̄ = b̂ + Δt·φ₃(z)·K·β̂·(|u|² − |v|²)/c
 *     (β̂ = c·b̂): the D₁ − D₀ term without the exact weights.
 * The corrector of b is the default one in every variant: b ← E(b + Δt/2·D₀) + Δt/2·D₁.
 */
import { interactSvea } from './interaction-kernel'

export type ExchangeForm = 'cayley' | 'exact'
export type SourceAverage = 'trapezoid' | 'linear-source' | 'linearised-source' | 'constant-source' | 'trapezoid-linearised'

export interface StepVariant {
  exchange: ExchangeForm
  average: SourceAverage
}

/** The driver's step: the variant every user gets (interactSvea). */
export const DEFAULT_VARIANT: StepVariant = { exchange: 'cayley', average: 'trapezoid-linearised' }

/** The step before the source's change was added to the mean, kept for side-by-side measurements. */
export const TRAPEZOID_VARIANT: StepVariant = { exchange: 'cayley', average: 'trapezoid' }

/** Coefficients of the 'linear-source' mean: φ₁(z), Δt·φ₂(z), Δt·φ₃(z) as [re, im], z = −λΔt = (−Γ_B/2 + iΔ)Δt. */
export interface MeanCoefficients {
  m0: [number, number]
  m1: [number, number]
  m2: [number, number]
}

export function meanCoefficients(eRe: number, eIm: number, h: number): MeanCoefficients {
  // z from E = e^z: log|E| + i·arg E (|zi| = |Δ|Δt < π on every grid the step rules allow).
  const zr = Math.log(Math.hypot(eRe, eIm))
  const zi = Math.atan2(eIm, eRe)
  const mul = (a: [number, number], b: [number, number]): [number, number] => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]]
  const z: [number, number] = [zr, zi]
  const az = Math.hypot(zr, zi)
  if (az < 0.5) {
    // Taylor: φ_k(z) = Σ z^n/(n + k)!; the closed forms below lose digits to cancellation for small z
    // (φ₃'s numerator is ≈ z³/6), twenty terms are exact to round-off for |z| < 0.5.
    const phi = (k: number): [number, number] => {
      let acc: [number, number] = [0, 0]
      let pw: [number, number] = [1, 0]
      let fact = 1
      for (let i = 1; i <= k; i++) fact *= i
      for (let n = 0; n < 20; n++) {
        acc = [acc[0] + pw[0] / fact, acc[1] + pw[1] / fact]
        pw = mul(pw, z)
        fact *= n + k + 1
      }
      return acc
    }
    const p1 = phi(1), p2 = phi(2), p3 = phi(3)
    return { m0: p1, m1: [h * p2[0], h * p2[1]], m2: [h * p3[0], h * p3[1]] }
  }
  const div = (a: [number, number], b: [number, number]): [number, number] => {
    const d = b[0] * b[0] + b[1] * b[1]
    return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d]
  }
  const ez: [number, number] = [eRe, eIm]
  const z2 = mul(z, z)
  const p1 = div([ez[0] - 1, ez[1]], z)
  const p2 = div([ez[0] - 1 - zr, ez[1] - zi], z2)
  const p3 = div([ez[0] - 1 - zr - 0.5 * z2[0], ez[1] - zi - 0.5 * z2[1]], mul(z2, z))
  return { m0: p1, m1: [h * p2[0], h * p2[1]], m2: [h * p3[0], h * p3[1]] }
}

/**
 * cos|β| (returned) and sin|β|/|β| (left in sinOverX) of the exact rotation, or the Cayley pair
 * (1 − q)/(1 + q), 1/(1 + q). Taylor below |β|² = 1e-8, where sin x/x is exact to round-off but 0/0 must be
 * avoided. A module slot instead of a returned pair keeps the hot loop free of allocation.
 */
let sinOverX = 1
function rotationCos(x2: number, exact: boolean): number {
  if (!exact) {
    const den = 1 / (1 + 0.25 * x2)
    sinOverX = den
    return (1 - 0.25 * x2) * den
  }
  if (x2 < 1e-8) {
    sinOverX = 1 - x2 / 6 + (x2 * x2) / 120
    return 1 - 0.5 * x2 + (x2 * x2) / 24
  }
  const x = Math.sqrt(x2)
  sinOverX = Math.sin(x) / x
  return Math.cos(x)
}

/**
 * The one-channel SVEA step at nodes j0..j1 with exchange constant cHalf = c/2 (c = exchangePerB·weight), in
 * the chosen variant. The default variant runs interactSvea itself, so its numbers are the driver's bit for bit;
 * the Cayley trapezoid variant runs the previous step as it was written (interactSveaTrapezoid).
 */
export function interactSveaVariant(
  f: { uRe: Float64Array; uIm: Float64Array; vRe: Float64Array; vIm: Float64Array; bRe: Float64Array; bIm: Float64Array },
  j0: number,
  j1: number,
  K: number,
  cHalf: number,
  Er: number,
  Ei: number,
  h: number,
  variant: StepVariant,
  mean: MeanCoefficients | null,
): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = f
  if (variant.exchange === 'cayley' && variant.average === 'trapezoid') return interactSveaTrapezoid(f, j0, j1, K, cHalf, Er, Ei, h)
  if (variant.exchange === 'cayley' && variant.average === 'trapezoid-linearised') return interactSvea(uRe, uIm, vRe, vIm, bRe, bIm, j0, j1, K, cHalf, Er, Ei, h)
  if (variant.exchange === 'cayley' && variant.average === 'linearised-source') return interactSveaLinearised(f, j0, j1, K, cHalf, Er, Ei, h, mean!)
  const exact = variant.exchange === 'exact'
  const linear = variant.average === 'linear-source'
  const linearised = variant.average === 'linearised-source'
  const constant = variant.average === 'constant-source'
  const trapLin = variant.average === 'trapezoid-linearised'
  if ((linear || linearised || constant || trapLin) && !mean) throw new Error('The linear-source average needs its mean coefficients')
  const c = 2 * cHalf
  const hh = 0.5 * h
  const m0r = mean?.m0[0] ?? 0, m0i = mean?.m0[1] ?? 0
  const m1r = mean?.m1[0] ?? 0, m1i = mean?.m1[1] ?? 0
  const m2r = mean?.m2[0] ?? 0, m2i = mean?.m2[1] ?? 0
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    // D0 = iK·u·v*
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    let betaR = cHalf * (br + Er * tr - Ei * ti)
    let betaI = cHalf * (bi + Er * ti + Ei * tr)
    if (linearised || constant) {
      // D₁ − D₀ = K·β·(|u|² − |v|²) from the trapezoid β (none with the source held), then β from the mean.
      const g = constant ? 0 : K * (ur * ur + ui * ui - vr * vr - vi * vi)
      const er = g * betaR, ei = g * betaI
      betaR = c * (m0r * br - m0i * bi + m1r * d0r - m1i * d0i + m2r * er - m2i * ei)
      betaI = c * (m0r * bi + m0i * br + m1r * d0i + m1i * d0r + m2r * ei + m2i * er)
    }
    if (trapLin) {
      const g = K * (ur * ur + ui * ui - vr * vr - vi * vi)
      const er = g * betaR, ei = g * betaI
      betaR += c * (m2r * er - m2i * ei)
      betaI += c * (m2r * ei + m2i * er)
    }
    let cs = rotationCos(betaR * betaR + betaI * betaI, exact)
    let sn = sinOverX
    let nur = cs * ur - sn * (betaR * vi + betaI * vr)
    let nui = cs * ui + sn * (betaR * vr - betaI * vi)
    let nvr = cs * vr - sn * (betaR * ui - betaI * ur)
    let nvi = cs * vi + sn * (betaR * ur + betaI * ui)
    if (linear) {
      const d1r = -K * (nui * nvr - nur * nvi)
      const d1i = K * (nur * nvr + nui * nvi)
      const er = d1r - d0r, ei = d1i - d0i
      const mr = m0r * br - m0i * bi + m1r * d0r - m1i * d0i + m2r * er - m2i * ei
      const mi = m0r * bi + m0i * br + m1r * d0i + m1i * d0r + m2r * ei + m2i * er
      betaR = c * mr
      betaI = c * mi
      cs = rotationCos(betaR * betaR + betaI * betaI, exact)
      sn = sinOverX
      nur = cs * ur - sn * (betaR * vi + betaI * vr)
      nui = cs * ui + sn * (betaR * vr - betaI * vi)
      nvr = cs * vr - sn * (betaR * ui - betaI * ur)
      nvi = cs * vi + sn * (betaR * ur + betaI * ui)
    }
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

/**
 * Cayley exchange with the 'linearised-source' mean, written flat as interactSvea is (no branches, no calls),
 * so that its cost per node-step is what adopting it would cost.
 */
function interactSveaLinearised(
  f: { uRe: Float64Array; uIm: Float64Array; vRe: Float64Array; vIm: Float64Array; bRe: Float64Array; bIm: Float64Array },
  j0: number,
  j1: number,
  K: number,
  cHalf: number,
  Er: number,
  Ei: number,
  h: number,
  mean: MeanCoefficients,
): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = f
  const c = 2 * cHalf
  const hh = 0.5 * h
  // c folded into the mean's coefficients, and K into the D₁ − D₀ one.
  const m0r = c * mean.m0[0], m0i = c * mean.m0[1]
  const m1r = c * mean.m1[0], m1i = c * mean.m1[1]
  const m2r = c * K * mean.m2[0], m2i = c * K * mean.m2[1]
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    // Trapezoid β, then D₁ − D₀ = K·β·(|u|² − |v|²) and the linear-source mean.
    const b1r = cHalf * (br + Er * tr - Ei * ti)
    const b1i = cHalf * (bi + Er * ti + Ei * tr)
    const g = ur * ur + ui * ui - vr * vr - vi * vi
    const er = g * b1r, ei = g * b1i
    const betaR = m0r * br - m0i * bi + m1r * d0r - m1i * d0i + m2r * er - m2i * ei
    const betaI = m0r * bi + m0i * br + m1r * d0i + m1i * d0r + m2r * ei + m2i * er
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

/**
 * The previous one-channel step, Cayley exchange with the trapezoid mean b̄ = (b + b̃)/2, written flat as it stood
 * in interactSvea (the same operations in the same order), so that its cost per node-step is measured alike.
 */
function interactSveaTrapezoid(
  f: { uRe: Float64Array; uIm: Float64Array; vRe: Float64Array; vIm: Float64Array; bRe: Float64Array; bIm: Float64Array },
  j0: number,
  j1: number,
  K: number,
  cHalf: number,
  Er: number,
  Ei: number,
  h: number,
): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = f
  const hh = 0.5 * h
  for (let j = j0; j <= j1; j++) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
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
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si - hh * K * (nui * nvr - nur * nvi)
    bIm[j] = Er * si + Ei * sr + hh * K * (nur * nvr + nui * nvi)
  }
}
