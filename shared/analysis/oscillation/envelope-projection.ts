/*
 * Linear algebra of the envelope basis B (sparse: a few functions touch each sample) and the linear part of
 * the joint model y ≈ Bc + a·e^{−γt}cos 2πft + b·e^{−γt}sin 2πft for fixed (f, γ). With S = [s₁ s₂] the two
 * ripple columns and G = (BᵀB)⁻¹ (inverted once), the Schur complement gives
 *   (SᵀS − SᵀBGBᵀS)(a, b)ᵀ = Sᵀy − SᵀBGBᵀy,   c = G Bᵀ(y − S(a, b)ᵀ)
 * (Golub & Van Loan, Matrix Computations, block elimination), so each (f, γ) costs O(N) plus O(K²).
 */
import { invert } from '../least-squares'
import type { SplineBasis } from './envelope-basis'

/** Inverse of a symmetric positive-definite matrix with Jacobi scaling (entries many decades apart). */
export function invertScaled(a: number[][]): number[][] | null {
  const d = a.map((row, i) => (row[i] > 0 ? 1 / Math.sqrt(row[i]) : 0))
  if (d.some((v) => v === 0)) return null
  const inv = invert(a.map((row, i) => row.map((v, j) => v * d[i] * d[j])))
  return inv ? inv.map((row, i) => row.map((v, j) => v * d[i] * d[j])) : null
}

/** Bᵀv for the sparse basis. */
export function basisT(basis: SplineBasis, v: ArrayLike<number>): Float64Array {
  const out = new Float64Array(basis.count)
  const { slots, index, value } = basis
  for (let i = 0; i < v.length; i++) for (let k = slots * i; k < slots * i + slots; k++) out[index[k]] += value[k] * v[i]
  return out
}

export function basisTimes(basis: SplineBasis, c: ArrayLike<number>, n: number): Float64Array {
  const out = new Float64Array(n)
  const { slots, index, value } = basis
  for (let i = 0; i < n; i++) {
    let acc = 0
    for (let k = slots * i; k < slots * i + slots; k++) acc += value[k] * c[index[k]]
    out[i] = acc
  }
  return out
}

export function gram(basis: SplineBasis, n: number): number[][] {
  const g = Array.from({ length: basis.count }, () => new Array<number>(basis.count).fill(0))
  const { slots, index, value } = basis
  for (let i = 0; i < n; i++) {
    for (let p = slots * i; p < slots * i + slots; p++) for (let q = slots * i; q < slots * i + slots; q++) g[index[p]][index[q]] += value[p] * value[q]
  }
  return g
}

export function matVec(m: number[][], v: ArrayLike<number>): Float64Array {
  const out = new Float64Array(m.length)
  for (let i = 0; i < m.length; i++) {
    const row = m[i]
    let acc = 0
    for (let j = 0; j < row.length; j++) acc += row[j] * v[j]
    out[i] = acc
  }
  return out
}

export function dot(u: ArrayLike<number>, v: ArrayLike<number>): number {
  let acc = 0
  for (let j = 0; j < u.length; j++) acc += u[j] * v[j]
  return acc
}

/** e^{−γt} cos 2πft and e^{−γt} sin 2πft on the uniform grid t, by a rotating, shrinking phasor. */
export function dampedPhasor(t: Float64Array, f: number, gamma: number): [Float64Array, Float64Array] {
  const n = t.length
  const dt = n > 1 ? t[1] - t[0] : 0
  const c = new Float64Array(n)
  const s = new Float64Array(n)
  const shrink = Math.exp(-gamma * dt)
  const wr = shrink * Math.cos(2 * Math.PI * f * dt)
  const wi = shrink * Math.sin(2 * Math.PI * f * dt)
  let zr = 1
  let zi = 0
  for (let i = 0; i < n; i++) {
    // Re-anchor now and then so rounding does not accumulate over long records.
    if ((i & 1023) === 0) {
      const e = Math.exp(-gamma * t[i])
      zr = e * Math.cos(2 * Math.PI * f * t[i])
      zi = e * Math.sin(2 * Math.PI * f * t[i])
    }
    c[i] = zr
    s[i] = zi
    const x = zr * wr - zi * wi
    zi = zr * wi + zi * wr
    zr = x
  }
  return [c, s]
}

/** The envelope curve fitted alone (the starting point, before the ripple is known). */
export function envelopeAlone(t: Float64Array, basis: SplineBasis, y: ArrayLike<number>): Float64Array | null {
  const G = invertScaled(gram(basis, t.length))
  return G ? basisTimes(basis, matVec(G, basisT(basis, y)), t.length) : null
}

/** Solves the linear part for fixed (f, γ): envelope coefficients c and ripple (a, b). */
export function makeProjector(t: Float64Array, basis: SplineBasis) {
  const n = t.length
  const G = invertScaled(gram(basis, n))
  return (y: ArrayLike<number>, f: number, gamma: number) => {
    if (!G) return null
    const [s1, s2] = dampedPhasor(t, f, gamma)
    const by = basisT(basis, y)
    const b1 = basisT(basis, s1)
    const b2 = basisT(basis, s2)
    const g1 = matVec(G, b1)
    const g2 = matVec(G, b2)
    const gy = matVec(G, by)
    let s11 = 0, s12 = 0, s22 = 0, s1y = 0, s2y = 0
    for (let i = 0; i < n; i++) ((s11 += s1[i] * s1[i]), (s12 += s1[i] * s2[i]), (s22 += s2[i] * s2[i]), (s1y += s1[i] * y[i]), (s2y += s2[i] * y[i]))
    // Schur complement: (SᵀS − SᵀB G BᵀS) g = Sᵀy − SᵀB G Bᵀy.
    const m11 = s11 - dot(b1, g1)
    const m12 = s12 - dot(b1, g2)
    const m22 = s22 - dot(b2, g2)
    const r1 = s1y - dot(b1, gy)
    const r2 = s2y - dot(b2, gy)
    const det = m11 * m22 - m12 * m12
    if (!(det > 1e-14 * m11 * m22)) return null
    const a = (m22 * r1 - m12 * r2) / det
    const b = (m11 * r2 - m12 * r1) / det
    const c = gy.map((v, k) => v - g1[k] * a - g2[k] * b)
    const envelope = basisTimes(basis, c, n)
    return { a, b, c, envelope, s1, s2 }
  }
}

