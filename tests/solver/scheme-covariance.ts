/*
 * The exact stationary covariance of the solver's own scheme for a linear(ised) problem, without random
 * numbers. With a CW pump that the Stokes light does not deplete, one time step is an affine map of the
 * Stokes envelope v and the acoustic envelope b at every node, driven by the step's normal draws ζ:
 *
 *   x_{n+1} = M x_n + G ζ_n,      y_n = C x_n + D ζ_n      (x = [Re v, Im v, Re b, Im b] over the nodes,
 *                                                            y = the Stokes output at z = 0, in √W)
 *
 * M, G, C and D are read off the real kernel (SimulationRun.advance) by applying it to unit inputs: central
 * differences in x (the exchange is odd in the small fields, so they are exact to O(ε²)) and unit draws
 * through the run's normal source. The stationary state covariance P solves the discrete Lyapunov
 * equation P = M P Mᵀ + G Gᵀ (solved by the doubling iteration, e.g. Anderson & Moore, Optimal
 * Filtering, 1979), and the output covariance is C P Cᵀ + D Dᵀ.
 */
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { planGrid, SimulationRun } from '../../solver/driver'

/** Row-major dense real matrix. */
export interface Matrix {
  rows: number
  cols: number
  data: Float64Array
}

const matrix = (rows: number, cols: number): Matrix => ({ rows, cols, data: new Float64Array(rows * cols) })

export function multiply(a: Matrix, b: Matrix, transposeB = false): Matrix {
  const cols = transposeB ? b.rows : b.cols
  const c = matrix(a.rows, cols)
  const A = a.data, B = b.data, C = c.data
  if (transposeB) {
    for (let i = 0; i < a.rows; i++)
      for (let j = 0; j < b.rows; j++) {
        let s = 0
        for (let k = 0; k < a.cols; k++) s += A[i * a.cols + k] * B[j * b.cols + k]
        C[i * cols + j] = s
      }
  } else {
    for (let i = 0; i < a.rows; i++)
      for (let k = 0; k < a.cols; k++) {
        const x = A[i * a.cols + k]
        if (x === 0) continue
        for (let j = 0; j < cols; j++) C[i * cols + j] += x * B[k * cols + j]
      }
  }
  return c
}

/** P = Σ_{k≥0} Aᵏ Q (Aᵏ)ᵀ by doubling: P ← P + A P Aᵀ, A ← A²; needs spectral radius < 1. */
export function discreteLyapunov(a: Matrix, q: Matrix, relTol = 1e-14, maxIter = 60): Matrix {
  let A = a
  const P = { ...q, data: q.data.slice() }
  for (let it = 0; it < maxIter; it++) {
    const add = multiply(multiply(A, P), A, true)
    let change = 0, size = 0
    for (let i = 0; i < P.data.length; i++) {
      P.data[i] += add.data[i]
      change = Math.max(change, Math.abs(add.data[i]))
      size = Math.max(size, Math.abs(P.data[i]))
    }
    if (change <= relTol * size) return P
    A = multiply(A, A)
  }
  throw new Error('discrete Lyapunov iteration did not converge (is the map stable?)')
}

/** Unit draws on demand: the kernel reads its normal deviates from here. */
class ScriptedNormals {
  draws: Float64Array = new Float64Array(0)
  index = 0
  normal(): number {
    return this.index < this.draws.length ? this.draws[this.index++] : (this.index++, 0)
  }
}

export interface SchemeMaps {
  M: Matrix
  G: Matrix
  C: Matrix
  D: Matrix
  nodes: number
  run: SimulationRun
}

/**
 * Reads the one-step maps off the kernel for a configuration with thermal noise on and a CW pump (and no
 * Stokes input). The pump is held at its launched value at every node: it is not changed to first order.
 */
export function schemeMaps(config: SimulationConfig): SchemeMaps {
  const source = new ScriptedNormals()
  const run = new SimulationRun(config, planGrid(config), { normalSource: source, forceGeneralKernel: true })
  const m = run.model
  const nodes = m.nodes
  const s = run.state
  const u0Re = s.uRe[0], u0Im = s.uIm[0]
  // With the higher-order acoustic term ∂t b (w) is state too.
  const fields = m.higherOrder ? [s.vRe, s.vIm, s.bRe, s.bIm, s.wRe, s.wIm] : [s.vRe, s.vIm, s.bRe, s.bIm]
  const dim = fields.length * nodes
  // How many normal deviates one step takes: counted, not assumed, so the map follows the kernel.
  source.draws = new Float64Array(0)
  source.index = 0
  run.n = 0
  run.advance(1)
  const draws = source.index
  const eps = 1e-6 * Math.max(1e-30, Math.hypot(u0Re, u0Im)) || 1e-6

  const step = (x: Float64Array, zeta: Float64Array): { next: Float64Array; out: [number, number] } => {
    s.uRe.fill(u0Re)
    s.uIm.fill(u0Im)
    for (let f = 0; f < fields.length; f++) fields[f].set(x.subarray(f * nodes, (f + 1) * nodes))
    source.draws = zeta
    source.index = 0
    run.n = 0
    run.advance(1)
    const next = new Float64Array(dim)
    for (let f = 0; f < fields.length; f++) next.set(fields[f], f * nodes)
    const out = run.traces[0].stokesOut
    return { next, out: [out[0], out[1]] }
  }

  const M = matrix(dim, dim), C = matrix(2, dim)
  const noDraws = new Float64Array(draws)
  for (let i = 0; i < dim; i++) {
    const x = new Float64Array(dim)
    x[i] = eps
    const plus = step(x, noDraws)
    x[i] = -eps
    const minus = step(x, noDraws)
    for (let r = 0; r < dim; r++) M.data[r * dim + i] = (plus.next[r] - minus.next[r]) / (2 * eps)
    for (let r = 0; r < 2; r++) C.data[r * dim + i] = (plus.out[r] - minus.out[r]) / (2 * eps)
  }
  const G = matrix(dim, draws), D = matrix(2, draws)
  const zero = new Float64Array(dim)
  for (let i = 0; i < draws; i++) {
    const zeta = new Float64Array(draws)
    zeta[i] = 1
    const r1 = step(zero, zeta)
    for (let r = 0; r < dim; r++) G.data[r * draws + i] = r1.next[r]
    for (let r = 0; r < 2; r++) D.data[r * draws + i] = r1.out[r]
  }
  return { M, G, C, D, nodes, run }
}

/** Stationary covariance of the state and the mean output power (W) of the scheme. */
export function stationaryNoise(maps: SchemeMaps): { P: Matrix; stokesOutW: number } {
  const Q = multiply(maps.G, maps.G, true)
  const P = discreteLyapunov(maps.M, Q)
  const Y = multiply(multiply(maps.C, P), maps.C, true)
  const Dd = multiply(maps.D, maps.D, true)
  return { P, stokesOutW: Y.data[0] + Y.data[3] + Dd.data[0] + Dd.data[3] }
}

/** ⟨|b_j|²⟩ at every node from the state covariance. */
export function acousticVariance(maps: SchemeMaps, P: Matrix): Float64Array {
  const n = maps.nodes
  const dim = P.rows
  const out = new Float64Array(n)
  for (let j = 0; j < n; j++) out[j] = P.data[(2 * n + j) * dim + 2 * n + j] + P.data[(3 * n + j) * dim + 3 * n + j]
  return out
}

/**
 * Closed form of the spontaneous Stokes power leaving z = 0 of a lossless waveguide with an undepleted
 * CW pump on resonance, from thermal phonons (classical Langevin source of strength Γ_B ħω_s n_th):
 *
 *   P_s = ħω_s n_th ∫ (e^{g(ν) L} − 1) dν,   g(ν) = G_B P (Γ_B/2)² / ((2πν)² + (Γ_B/2)²)
 *
 * (noise-initiated SBS: Boyd, Rzążewski & Narum, Phys. Rev. A 42, 5514 (1990); the spectral form as in
 * Kobyakov, Sauer & Chowdhury, Adv. Opt. Photon. 2, 1 (2010)). With 2πν = (Γ_B/2) tan θ the integral is
 * (Γ_B/4π) ∫ expm1(G₀cos²θ)/cos²θ dθ over (−π/2, π/2), G₀ = G_B P L: a smooth periodic integrand that the
 * trapezoid rule integrates to round-off.
 */
export function spontaneousStokesClosedFormW(photonJ: number, nTh: number, gammaBPerS: number, g0: number, points = 4096): number {
  let sum = 0
  for (let k = 0; k < points; k++) {
    const theta = -Math.PI / 2 + (Math.PI * k) / points
    const c2 = Math.cos(theta) ** 2
    sum += c2 < 1e-300 ? g0 : Math.expm1(g0 * c2) / c2
  }
  return photonJ * nTh * (gammaBPerS / (4 * Math.PI)) * sum * (Math.PI / points)
}
