/*
 * Acoustic update over one step h, matched to the optical characteristics (docs/model.md, equations).
 *
 * SVEA:  ∂t b = −λ b + S,  λ = Γ_B/2 − iΔ.  Integrating-factor trapezoid (Heun on the factored form):
 *        b₁ = E·b₀ + (h/2)(E·S₀ + S₁),  E = e^{−λh}  (decay and detuning exact; source second order).
 *
 * Higher order (beyond SVEA):  ∂t² b + (Γ_B − 2iΩ)∂t b + (Ω_B² − Ω² − iΩΓ_B) b = −2iΩ·S,  Ω = ω_p − ω_s.
 *        y = (b, ∂t b), y' = M y + (0, g), g = −2iΩ S. Exponential time differencing with a linearly
 *        interpolated source (Cox & Matthews 2002): y₁ = e^{Mh} y₀ + P₀ g₀ + P₁ (g₁ − g₀) with
 *        P₀ = ∫₀ʰ e^{M(h−s)} ds, P₁ = (1/h)∫₀ʰ e^{M(h−s)} s ds, from Sylvester's formula on the two
 *        eigenvalues λ± = −Γ_B/2 + i(Ω ± √(Ω_B² − Γ_B²/4)) (the slow one is −Γ_B/2 + iΔ, the fast one ≈ 2iΩ).
 *        Step-mean of b with the source linear over the step: the first row of
 *        (1/h)∫₀ʰ y dt = φ₁(Mh) y₀ + h φ₂(Mh) g₀ + h φ₃(Mh)(g₁ − g₀)   (steppers/step-mean.ts).
 */

export interface SveaPropagator {
  /** E = e^{−(Γ_B/2 − iΔ)h}. */
  eRe: number
  eIm: number
  h: number
}

export function sveaPropagator(gammaB: number, detuning: number, h: number): SveaPropagator {
  const mag = Math.exp(-0.5 * gammaB * h)
  return { eRe: mag * Math.cos(detuning * h), eIm: mag * Math.sin(detuning * h), h }
}

type C = [number, number]
const cadd = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]]
const csub = (a: C, b: C): C => [a[0] - b[0], a[1] - b[1]]
const cmul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]]
const cdiv = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1]
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d]
}
const cexp = (a: C): C => {
  const m = Math.exp(a[0])
  return [m * Math.cos(a[1]), m * Math.sin(a[1])]
}
const cscale = (a: C, s: number): C => [a[0] * s, a[1] * s]

/** (e^z − 1)/z, by series near 0 where the difference cancels. */
function phi1(z: C): C {
  if (Math.hypot(z[0], z[1]) < 1e-3) {
    // 1 + z/2 + z²/6 + z³/24
    const z2 = cmul(z, z)
    return cadd(cadd([1, 0], cscale(z, 0.5)), cadd(cscale(z2, 1 / 6), cscale(cmul(z2, z), 1 / 24)))
  }
  return cdiv(csub(cexp(z), [1, 0]), z)
}
/** (e^z − 1 − z)/z². */
function phi2(z: C): C {
  if (Math.hypot(z[0], z[1]) < 1e-3) {
    const z2 = cmul(z, z)
    return cadd(cadd([0.5, 0], cscale(z, 1 / 6)), cadd(cscale(z2, 1 / 24), cscale(cmul(z2, z), 1 / 120)))
  }
  return cdiv(csub(csub(cexp(z), [1, 0]), z), cmul(z, z))
}

/** Second-order acoustic propagator; complex entries stored as [re, im]. */
export interface HigherOrderPropagator {
  h: number
  e00: C
  e01: C
  e10: C
  e11: C
  /** Second columns of P₀ and P₁ (the source acts on ∂t b only). */
  p0b: C
  p0w: C
  p1b: C
  p1w: C
  /** g = sourceFactor·S. */
  sourceFactor: C
  /**
   * Step-mean of b (steppers/step-mean.ts, the same φ-functions of the 2×2 generator): b̄ = meanB·b + meanW·∂t b +
   * meanG0·g₀ + meanG1·(g₁ − g₀), the first row of φ₁(MΔt) and the (b, ∂t b) entries of Δt·φ₂(MΔt), Δt·φ₃(MΔt).
   */
  meanB: C
  meanW: C
  meanG0: C
  meanG1: C
}

/** φ_k(z) = Σ zⁿ/(n + k)!: the series (20 terms) for |z| < ½, else φ_k = (φ_{k−1} − 1/(k−1)!)/z from φ₀ = e^z. */
function phiK(z: C, k: number): C {
  if (Math.hypot(z[0], z[1]) < 0.5) {
    let acc: C = [0, 0]
    let pw: C = [1, 0]
    let fact = 1
    for (let i = 2; i <= k; i++) fact *= i
    for (let n = 0; n < 20; n++) {
      acc = cadd(acc, cscale(pw, 1 / fact))
      pw = cmul(pw, z)
      fact *= n + k + 1
    }
    return acc
  }
  let p = cexp(z)
  let fact = 1
  for (let i = 1; i <= k; i++) {
    p = cdiv(csub(p, [1 / fact, 0]), z)
    fact *= i
  }
  return p
}

export function higherOrderPropagator(gammaB: number, omegaB: number, omega: number, h: number): HigherOrderPropagator {
  // M = [[0, 1], [−c0, −c1]], c1 = Γ − 2iΩ, c0 = Ω_B² − Ω² − iΩΓ
  const c1: C = [gammaB, -2 * omega]
  const c0: C = [omegaB * omegaB - omega * omega, -omega * gammaB]
  const root = Math.sqrt(omegaB * omegaB - 0.25 * gammaB * gammaB)
  const l1: C = [-0.5 * gammaB, omega - root]
  const l2: C = [-0.5 * gammaB, omega + root]
  const d = csub(l1, l2)
  // f(M) = [f(λ1)(M − λ2) − f(λ2)(M − λ1)]/(λ1 − λ2), entries of M − λ: [[−λ, 1], [−c0, −c1 − λ]]
  const fm = (f1: C, f2: C) => {
    const a = cdiv(f1, d)
    const b = cdiv(f2, d)
    const m00 = csub(cmul(a, cscale(l2, -1)), cmul(b, cscale(l1, -1)))
    const m01 = csub(a, b)
    const m10 = csub(cmul(a, cscale(c0, -1)), cmul(b, cscale(c0, -1)))
    const m11 = csub(cmul(a, csub(cscale(c1, -1), l2)), cmul(b, csub(cscale(c1, -1), l1)))
    return { m00, m01, m10, m11 }
  }
  const z1 = cscale(l1, h)
  const z2 = cscale(l2, h)
  const E = fm(cexp(z1), cexp(z2))
  const P0 = fm(cscale(phi1(z1), h), cscale(phi1(z2), h))
  const P1 = fm(cscale(phi2(z1), h), cscale(phi2(z2), h))
  return {
    h,
    e00: E.m00,
    e01: E.m01,
    e10: E.m10,
    e11: E.m11,
    p0b: P0.m01,
    p0w: P0.m11,
    p1b: P1.m01,
    p1w: P1.m11,
    sourceFactor: [0, -2 * omega],
    meanB: fm(phiK(z1, 1), phiK(z2, 1)).m00,
    meanW: fm(phiK(z1, 1), phiK(z2, 1)).m01,
    meanG0: fm(cscale(phiK(z1, 2), h), cscale(phiK(z2, 2), h)).m01,
    meanG1: fm(cscale(phiK(z1, 3), h), cscale(phiK(z2, 3), h)).m01,
  }
}

/** One SVEA step of a single envelope with sources S₀, S₁ at the step ends (reference form for tests). */
export function sveaStep(p: SveaPropagator, b: C, s0: C, s1: C): C {
  const hh = 0.5 * p.h
  const E: C = [p.eRe, p.eIm]
  return cadd(cmul(E, cadd(b, cscale(s0, hh))), cscale(s1, hh))
}

/** One higher-order step of y = (b, ∂t b) with sources S₀, S₁ (reference form for tests). */
export function higherOrderStep(p: HigherOrderPropagator, b: C, w: C, s0: C, s1: C): [C, C] {
  const g0 = cmul(p.sourceFactor, s0)
  const g1 = cmul(p.sourceFactor, s1)
  const dg = csub(g1, g0)
  const nb = cadd(cadd(cmul(p.e00, b), cmul(p.e01, w)), cadd(cmul(p.p0b, g0), cmul(p.p1b, dg)))
  const nw = cadd(cadd(cmul(p.e10, b), cmul(p.e11, w)), cadd(cmul(p.p0w, g0), cmul(p.p1w, dg)))
  return [nb, nw]
}
