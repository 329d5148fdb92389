// Small dense linear algebra for fits with a handful of parameters: normal matrices, their inverse and
// the parameter covariance s²(JᵀJ)⁻¹ (the usual estimate for unweighted least squares with unknown noise
// variance; e.g. Press et al., Numerical Recipes, §15.5).

/** Inverse of a small symmetric positive-definite matrix by Gauss–Jordan with partial pivoting; null if singular. */
export function invert(a: number[][]): number[][] | null {
  const n = a.length
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))])
  const scale = Math.max(1e-300, ...a.map((r, i) => Math.abs(r[i])))
  for (let c = 0; c < n; c++) {
    let p = c
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r
    // Relative pivot threshold: below it the parameters are not separately determined.
    if (Math.abs(m[p][c]) < 1e-13 * scale) return null
    ;[m[c], m[p]] = [m[p], m[c]]
    const pivot = m[c][c]
    for (let j = 0; j < 2 * n; j++) m[c][j] /= pivot
    for (let r = 0; r < n; r++) {
      if (r === c) continue
      const f = m[r][c]
      if (f !== 0) for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[c][j]
    }
  }
  return m.map((row) => row.slice(n))
}

/** JᵀJ of a Jacobian given as columns (one Float64Array of residual derivatives per parameter). */
export function normalMatrix(columns: ArrayLike<number>[]): number[][] {
  const k = columns.length
  const out = Array.from({ length: k }, () => new Array<number>(k).fill(0))
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s = 0
      const ca = columns[a]
      const cb = columns[b]
      for (let i = 0; i < ca.length; i++) s += ca[i] * cb[i]
      out[a][b] = out[b][a] = s
    }
  }
  return out
}

/**
 * One-sigma parameter uncertainties from the Jacobian columns and the residual sum of squares:
 * covariance = s²(JᵀJ)⁻¹ with s² = SSR/(N − k). Null entries where JᵀJ is singular or N ≤ k.
 */
export function parameterSigmas(columns: ArrayLike<number>[], ssr: number, points: number): (number | null)[] {
  const k = columns.length
  if (points <= k) return Array(k).fill(null)
  // Parameters in different units give JᵀJ entries many decades apart: invert D(JᵀJ)D with
  // D = diag(JᵀJ)^(−1/2) (Jacobi scaling), then (JᵀJ)⁻¹ = D (DAD)⁻¹ D.
  const a = normalMatrix(columns)
  const d = a.map((row, i) => (row[i] > 0 ? 1 / Math.sqrt(row[i]) : 0))
  if (d.some((v) => v === 0)) return Array(k).fill(null)
  const inv = invert(a.map((row, i) => row.map((v, j) => v * d[i] * d[j])))
  if (!inv) return Array(k).fill(null)
  const s2 = ssr / (points - k)
  return inv.map((row, i) => (row[i] >= 0 ? Math.sqrt(s2 * row[i]) * d[i] : null))
}

/** Akaike and Bayesian information criteria for least squares with Gaussian errors of unknown variance. */
export function informationCriteria(ssr: number, points: number, k: number): { aic: number; bic: number } {
  const base = points * Math.log(Math.max(ssr, 1e-300) / points)
  return { aic: base + 2 * k, bic: base + k * Math.log(points) }
}
