/*
 * Fast path with thermal noise: one channel, SVEA, no Kerr. The steps of the contract in interaction-kernel.ts,
 * as `interactGeneral` computes them for that case (predictAcoustic, drawThermalNoise, averageAcoustic,
 * exchangeOptics, correctSvea), written flat per node with the general kernel's rounding order and its order
 * of draws (per node: the kick's real and imaginary parts, then the mean's), so the results are the same bits:
 *   D₀ = iK·u·v*,  b̃ = E(b + h·D₀) + X,  X = σ_w(ξ₁ + iξ₂)/√2,  σ_w = σ_kick/√w
 *   b̂ = ½(b + b̃) + Y,  Y = σ̄_w(ξ₃ + iξ₄)/√2   (restores ⟨|b̄|²⟩ lost to the trapezoid mean; docs/numerics.md)
 *   b̄ = b̂ + hφ₃·K·c·w·b̂·(|u|² − |v|²)   (b̂ carries X/2 + Y; steppers/step-mean.ts)
 *   exchange with β = c·w·b̄ (Cayley, unitary),  b ← E(b + h/2·D₀) + h/2·D₁ + X.
 * tests/solver/svea-noise-kernel.test.ts compares it with the general kernel bit for bit.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { noiseWeight } from './general-kernel'
import { drawNormals, type NormalSource } from './seeded-random'
import { sveaStepMean, type StepMean } from './step-mean'

/** Nodes per block of draws: the block's deviates are drawn first (in the general kernel's order), then used. */
const BLOCK_NODES = 256
const draws = new Float64Array(4 * BLOCK_NODES)

/** True when the single-channel SVEA path with thermal noise applies (noise on, no Kerr, no higher-order term). */
export function noiseFastPathApplies(m: Model): boolean {
  return m.nCh === 1 && m.higherOrder === null && m.kerrHalfPump === 0 && m.kerrHalfStokes === 0
}

/** The interaction step with thermal noise at nodes j0..j1 of trapezoid weight `weight`, in node order. */
export function interactSveaNoise(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const K = m.driveK
  const h = m.dtS
  const hh = 0.5 * m.dtS
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const c = m.exchangePerB * weight
  const sd = m.noiseKickRms * Math.SQRT1_2 * noiseWeight(weight)
  const sdMean = m.noiseMeanRms * Math.SQRT1_2 * noiseWeight(weight)
  for (let a0 = j0; a0 <= j1; a0 += BLOCK_NODES) {
    const a1 = Math.min(j1, a0 + BLOCK_NODES - 1)
    drawNormals(rng, draws, 4 * (a1 - a0 + 1))
    stepBlock(uRe, uIm, vRe, vIm, bRe, bIm, a0, a1, K, h, hh, Er, Ei, c, sd, sdMean, sveaStepMean(Er, Ei, h))
  }
}

function stepBlock(
  uRe: Float64Array, uIm: Float64Array, vRe: Float64Array, vIm: Float64Array, bRe: Float64Array, bIm: Float64Array,
  j0: number, j1: number, K: number, h: number, hh: number, Er: number, Ei: number, c: number, sd: number, sdMean: number, mean: StepMean,
): void {
  const kc = K * c
  const { m2r, m2i } = mean
  for (let j = j0, d = 0; j <= j1; j++, d += 4) {
    const ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
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
    const g = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const bbr = btr + (m2r * er - m2i * ei)
    const bbi = bti + (m2r * ei + m2i * er)
    // Exchange with b̄ frozen.
    const betaR = c * bbr
    const betaI = c * bbi
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
    // Corrector plus the step's kick.
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    bRe[j] = Er * sr - Ei * si + hh * d1r + xr
    bIm[j] = Er * si + Ei * sr + hh * d1i + xi
  }
}
