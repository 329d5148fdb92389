/*
 * Fast path with Kerr phases and thermal noise together: one channel, SVEA. The steps of the contract in
 * interaction-kernel.ts, as `interactGeneral` computes them for that case (predictAcoustic, drawThermalNoise,
 * averageAcoustic, stepMean, kerrExchange, correctSvea), written flat per node with the general kernel's rounding
 * order and its order of draws (per node: the kick's real and imaginary parts, then the mean's), so the results
 * are the same bits. It is the noise kernel's acoustic step (svea-noise-kernel.ts) around the Kerr kernel's
 * exchange (svea-kerr-kernel.ts):
 *   p = u·v*,  D₀ = iK·p,  b̃ = E(b + h·D₀) + X,  b̂ = ½(b + b̃) + Y,  b̄ = b̂ + hφ₃·K·c·w·b̂·(|u|² − |v|²)
 *   (X the step's Ornstein–Uhlenbeck kick, Y the draw that restores ⟨|b̄|²⟩; docs/numerics.md)
 *   φ = a·(|u|², |v|²) (first half step),  θ = 2φ + d·y,  y = Re(b̂)·Im(p) − Im(b̂)·Re(p),  ψ = θ(1 + θ²/12)
 *   (kerr-phase.ts), the exchange with β' = β·((1 − q_r) + iΔφ) and both rotations over one reciprocal,
 *   b ← E(b + h/2·D₀) + h/2·D₁ + X.
 * tests/solver/flat-kernels.test.ts compares it with the general kernel bit for bit.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { noiseWeight } from './general-kernel'
import { kerrPhaseCoefficients, TWELFTH, type KerrPhaseCoefficients } from './kerr-phase'
import { drawNormals, type NormalSource } from './seeded-random'
import { sveaStepMean, type StepMean } from './step-mean'

/** Nodes per block of draws: the block's deviates are drawn first (in the general kernel's order), then used. */
const BLOCK_NODES = 256
const draws = new Float64Array(4 * BLOCK_NODES)

/** True when the single-channel SVEA path with Kerr phases and thermal noise applies (no higher-order term). */
export function kerrNoiseFastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder === null && (m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0)
}

/** The interaction step with Kerr phases and thermal noise at nodes j0..j1 of trapezoid weight `weight`, in node order. */
export function interactSveaKerrNoise(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource): void {
  const c = m.exchangePerB * weight
  const kerr = kerrPhaseCoefficients(m.kerrHalfPump * weight, m.kerrHalfStokes * weight, m.kappaP, m.rates.kappa, c)
  const sd = m.noiseKickRms * Math.SQRT1_2 * noiseWeight(weight)
  const sdMean = m.noiseMeanRms * Math.SQRT1_2 * noiseWeight(weight)
  const mean = sveaStepMean(m.svea.eRe, m.svea.eIm, m.dtS)
  for (let a0 = j0; a0 <= j1; a0 += BLOCK_NODES) {
    const a1 = Math.min(j1, a0 + BLOCK_NODES - 1)
    drawNormals(rng, draws, 4 * (a1 - a0 + 1))
    stepBlock(m, s, a0, a1, c, sd, sdMean, mean, kerr)
  }
}

function stepBlock(m: Model, s: FieldState, j0: number, j1: number, c: number, sd: number, sdMean: number, mean: StepMean, kerr: KerrPhaseCoefficients): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const K = m.driveK
  const h = m.dtS
  const hh = 0.5 * h
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const kc = K * c
  const { m2r, m2i } = mean
  const { app, aps, asp, ass, dpc, dsc } = kerr
  for (let j = j0, d = 0; j <= j1; j++, d += 4) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    const pr = ur * vr + ui * vi
    const pi = ui * vr - ur * vi
    const d0r = -K * pi
    const d0i = K * pr
    const tr = br + h * d0r
    const ti = bi + h * d0i
    const xr = sd * draws[d]
    const xi = sd * draws[d + 1]
    const tbr = Er * tr - Ei * ti + xr
    const tbi = Er * ti + Ei * tr + xi
    const mr = sdMean * draws[d + 2]
    const mi = sdMean * draws[d + 3]
    const btr = 0.5 * (br + tbr) + mr
    const bti = 0.5 * (bi + tbi) + mi
    const uu = ur * ur + ui * ui
    const vv = vr * vr + vi * vi
    const g = kc * (uu - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const bbr = btr + (m2r * er - m2i * ei)
    const bbi = bti + (m2r * ei + m2i * er)
    // Kerr phases: the first half step's from the entry powers, the whole step's at the midpoint powers.
    const phiP = app * uu + aps * vv
    const phiS = asp * uu + ass * vv
    const y = btr * pi - bti * pr
    const tp0 = 2 * phiP + dpc * y
    const ts0 = 2 * phiS + dsc * y
    const tp = tp0 * (1 + TWELFTH * tp0 * tp0)
    const ts = ts0 * (1 + TWELFTH * ts0 * ts0)
    const dphi = phiS - phiP
    const qr = 0.25 * dphi * dphi
    const qp = 0.25 * tp * tp
    const qs = 0.25 * ts * ts
    const dp = 1 + qp
    const ds = 1 + qs
    const betaR = c * bbr
    const betaI = c * bbi
    const qe = 0.25 * (betaR * betaR + betaI * betaI)
    const dr = 1 + qr
    const r = 1 / (((1 + qe) * dr) * (dp * ds))
    // The exchange in the first half step's frame (numerators), then the whole step's rotations over r.
    const a = (1 - qe) * dr
    const cr0 = 1 - qr
    const zr = betaR * cr0 - betaI * dphi
    const zi = betaR * dphi + betaI * cr0
    const eur = a * ur - zr * vi - zi * vr
    const eui = a * ui + zr * vr - zi * vi
    const evr = a * vr - zr * ui + zi * ur
    const evi = a * vi + zr * ur + zi * ui
    const rp = ds * r
    const rs = dp * r
    let cr = (1 - qp) * rp
    let ci = tp * rp
    const nur = cr * eur - ci * eui
    const nui = cr * eui + ci * eur
    cr = (1 - qs) * rs
    ci = ts * rs
    const nvr = cr * evr - ci * evi
    const nvi = cr * evi + ci * evr
    uRe[j] = nur
    uIm[j] = nui
    vRe[j] = nvr
    vIm[j] = nvi
    // Corrector plus the step's kick.
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si + hh * d1r + xr
    bIm[j] = Er * si + Ei * sr + hh * d1i + xi
  }
}
