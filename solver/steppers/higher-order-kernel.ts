/*
 * Fast path with the higher-order acoustic equation: one channel, Kerr and thermal noise each on or off. The steps
 * of the contract in interaction-kernel.ts as `interactGeneral` computes them for that case (predictAcoustic,
 * drawThermalNoise, averageAcoustic, stepMean, exchangeOptics or kerrExchange, correctHigherOrder), written flat per node with the
 * general kernel's rounding order and draws, so the results are the same bits. y = (b, w = ∂t b); the ETD
 * step of y' = A y + g with the 2×2 propagator E = e^{AΔt} and its φ-function weights P₀, P₁ (coupled-modes.ts):
 *   D = iK·u·v*,  g = (0, f)·D = (−f·Im D, f·Re D),  f = −2Ω
 *   predictor  b̃ = E₀₀b + E₀₁w + P₀,b·g₀ (+ P₀,b·(0, f)·F with noise),  b̂ = ½(b + b̃)
 *   step-mean  b̄ = b̂ + M₁·(0, f)·K·c·w_node·b̂·(|u|² − |v|²), M₁ the (b, ∂t b) entry of Δt·φ₃(AΔt): the source's
 *              change over the step, D₁ − D₀ from the exchange to first order (steppers/step-mean.ts, acoustic-propagator.ts)
 *   exchange with β = c·w_node·b̄ (Cayley, unitary); with Kerr the one-channel Kerr exchange of svea-kerr-kernel.ts
 *   (phases from the entry powers and y = Re(b̂)·Im(uv*) − Im(b̂)·Re(uv*), one rotation per field: kerr-phase.ts)
 *   corrector  y ← E y + (P₀ − P₁) g₀ + P₁ g₁ (+ P₀·(0, f)·F),  F = σ_w(ξ₁ + iξ₂)/√2 the Langevin force
 *   held over the step, σ_w = σ_force/√w_node.
 * tests/solver/higher-order-kernel.test.ts compares it with the general kernel bit for bit.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { noiseWeight } from './general-kernel'
import { kerrPhaseCoefficients, TWELFTH, type KerrPhaseCoefficients } from './kerr-phase'
import { drawNormals, type NormalSource } from './seeded-random'

/** Nodes per block of draws with noise: the block's deviates are drawn first (in the general kernel's order), then used. */
const BLOCK_NODES = 256
const draws = new Float64Array(2 * BLOCK_NODES)

/** True when the single-channel higher-order path applies (higher-order term on; Kerr and noise either way). */
export function higherOrderFastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder !== null
}

/** The interaction step at nodes j0..j1 of trapezoid weight `weight`; `rng` null without noise. */
export function interactHigherOrder(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource | null): void {
  if (rng === null) return stepBlock(m, s, j0, j1, weight, false)
  for (let a0 = j0; a0 <= j1; a0 += BLOCK_NODES) {
    const a1 = Math.min(j1, a0 + BLOCK_NODES - 1)
    drawNormals(rng, draws, 2 * (a1 - a0 + 1))
    stepBlock(m, s, a0, a1, weight, true)
  }
}

/** Nodes j0..j1; with `noise`, node j's Langevin force from draws[2(j − j0)], draws[2(j − j0) + 1]. */
function stepBlock(m: Model, s: FieldState, j0: number, j1: number, weight: number, noise: boolean): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm } = s
  const ho = m.higherOrder!
  const K = m.driveK
  const f = ho.sourceFactor[1]
  const c = m.exchangePerB * weight
  const sd = m.noiseForceRms * Math.SQRT1_2 * noiseWeight(weight)
  const e00r = ho.e00[0], e00i = ho.e00[1], e01r = ho.e01[0], e01i = ho.e01[1]
  const e10r = ho.e10[0], e10i = ho.e10[1], e11r = ho.e11[0], e11i = ho.e11[1]
  const p0br = ho.p0b[0], p0bi = ho.p0b[1], p0wr = ho.p0w[0], p0wi = ho.p0w[1]
  const p1br = ho.p1b[0], p1bi = ho.p1b[1], p1wr = ho.p1w[0], p1wi = ho.p1w[1]
  const qbr = p0br - p1br, qbi = p0bi - p1bi
  const qwr = p0wr - p1wr, qwi = p0wi - p1wi
  const kc = K * c
  const [q1r, q1i] = ho.meanG1
  const kerr = m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0
  const kp = kerr ? kerrPhaseCoefficients(m.kerrHalfPump * weight, m.kerrHalfStokes * weight, m.kappaP, m.rates.kappa, c) : null
  for (let j = j0, d = 0; j <= j1; j++, d += 2) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j], wr = wRe[j], wi = wIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const g0r = -f * d0i
    const g0i = f * d0r
    // E₀₀b + E₀₁w, the free part of both the predictor and the corrector (the same partial sums there).
    const ebr = e00r * br - e00i * bi + e01r * wr - e01i * wi
    const ebi = e00r * bi + e00i * br + e01r * wi + e01i * wr
    let tbr = ebr + p0br * g0r - p0bi * g0i
    let tbi = ebi + p0br * g0i + p0bi * g0r
    let gfr = 0, gfi = 0
    if (noise) {
      const xr = sd * draws[d]
      const xi = sd * draws[d + 1]
      gfr = -f * xi
      gfi = f * xr
      tbr += p0br * gfr - p0bi * gfi
      tbi += p0br * gfi + p0bi * gfr
    }
    const btr = 0.5 * (br + tbr)
    const bti = 0.5 * (bi + tbi)
    const gk = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
    const er = gk * btr
    const ei = gk * bti
    const ger = -f * ei, gei = f * er
    const bbr = btr + (q1r * ger - q1i * gei)
    const bbi = bti + (q1r * gei + q1i * ger)
    // Exchange with b̄ frozen (with Kerr, in the frame of the first half step, then the whole step's rotation).
    const betaR = c * bbr
    const betaI = c * bbi
    if (kp === null) {
      const q = 0.25 * (betaR * betaR + betaI * betaI)
      const den = 1 / (1 + q)
      const a = 1 - q
      uRe[j] = (a * ur - betaR * vi - betaI * vr) * den
      uIm[j] = (a * ui + betaR * vr - betaI * vi) * den
      vRe[j] = (a * vr - betaR * ui + betaI * ur) * den
      vIm[j] = (a * vi + betaR * ur + betaI * ui) * den
    } else kerrExchangeAt(uRe, uIm, vRe, vIm, j, betaR, betaI, btr, bti, kp)
    const nur = uRe[j], nui = uIm[j], nvr = vRe[j], nvi = vIm[j]
    // Corrector: the ETD step with the source interpolated linearly over the step.
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const g1r = -f * d1i
    const g1i = f * d1r
    let nbr = ebr + qbr * g0r - qbi * g0i + p1br * g1r - p1bi * g1i
    let nbi = ebi + qbr * g0i + qbi * g0r + p1br * g1i + p1bi * g1r
    let nwr = e10r * br - e10i * bi + e11r * wr - e11i * wi + qwr * g0r - qwi * g0i + p1wr * g1r - p1wi * g1i
    let nwi = e10r * bi + e10i * br + e11r * wi + e11i * wr + qwr * g0i + qwi * g0r + p1wr * g1i + p1wi * g1r
    if (noise) {
      nbr += p0br * gfr - p0bi * gfi
      nbi += p0br * gfi + p0bi * gfr
      nwr += p0wr * gfr - p0wi * gfi
      nwi += p0wr * gfi + p0wi * gfr
    }
    bRe[j] = nbr
    bIm[j] = nbi
    wRe[j] = nwr
    wIm[j] = nwi
  }
}

/**
 * The one-channel Kerr exchange at node j (svea-kerr-kernel.ts, the same operations in the same order): β = c·w·b̄,
 * the phases from the entry powers, y from b̂ = (btr, bti).
 */
function kerrExchangeAt(
  uRe: Float64Array, uIm: Float64Array, vRe: Float64Array, vIm: Float64Array, j: number,
  betaR: number, betaI: number, btr: number, bti: number, k: KerrPhaseCoefficients,
): void {
  const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j]
  const pr = ur * vr + ui * vi
  const pi = ui * vr - ur * vi
  const uu = ur * ur + ui * ui
  const vv = vr * vr + vi * vi
  const phiP = k.app * uu + k.aps * vv
  const phiS = k.asp * uu + k.ass * vv
  const y = btr * pi - bti * pr
  const tp0 = 2 * phiP + k.dpc * y
  const ts0 = 2 * phiS + k.dsc * y
  const tp = tp0 * (1 + TWELFTH * tp0 * tp0)
  const ts = ts0 * (1 + TWELFTH * ts0 * ts0)
  const dphi = phiS - phiP
  const qr = 0.25 * dphi * dphi
  const qp = 0.25 * tp * tp
  const qs = 0.25 * ts * ts
  const dp = 1 + qp
  const ds = 1 + qs
  const qe = 0.25 * (betaR * betaR + betaI * betaI)
  const dr = 1 + qr
  const r = 1 / (((1 + qe) * dr) * (dp * ds))
  const a = (1 - qe) * dr
  const cr0 = 1 - qr
  const xr = betaR * cr0 - betaI * dphi
  const xi = betaR * dphi + betaI * cr0
  const eur = a * ur - xr * vi - xi * vr
  const eui = a * ui + xr * vr - xi * vi
  const evr = a * vr - xr * ui + xi * ur
  const evi = a * vi + xr * ur + xi * ui
  const rp = ds * r
  const rs = dp * r
  let cr = (1 - qp) * rp
  let ci = tp * rp
  uRe[j] = cr * eur - ci * eui
  uIm[j] = cr * eui + ci * eur
  cr = (1 - qs) * rs
  ci = ts * rs
  vRe[j] = cr * evr - ci * evi
  vIm[j] = cr * evi + ci * evr
}
