/*
 * Fast path for several channels: SVEA or the higher-order acoustic term, Kerr and thermal noise each on or off,
 * 2 to 8 pump–Stokes pairs, each with its own grating b_k. The steps of the contract in interaction-kernel.ts, as
 * `interactGeneral` computes them (predictAcoustic, drawThermalNoise, averageAcoustic, fieldSeenByOptics, stepMean,
 * exchangeOptics or kerrExchange, correctSvea or correctHigherOrder), written flat per node with the general
 * kernel's rounding order and its order of draws, so the results are the same bits.
 * At node z_j, with phases p_k = e^{i q_k z_j} (Model.phaseRe/phaseIm):
 *   D₀,k = iK·u_k·v_k*,  b̃_k = E(b_k + h·D₀,k),  b̂_k = ½(b_k + b̃_k)
 *   B̂_k = p_k*·Σ_m b̂_m p_m   (every channel's grating as channel k's light sees it)
 *   b̄_k = b̂_k + hφ₃·K·c·w·B̂_k·(|u_k|² − |v_k|²)   (the step-mean: steppers/step-mean.ts)
 *   B_k = p_k*·Σ_m b̄_m p_m,  exchange of (u_k, v_k) with β = c·w·B_k (Cayley, unitary)
 *   b_k ← E(b_k + h/2·D₀,k) + h/2·D₁,k.
 * With thermal noise, per node and channel the kick X_k = σ_w(ξ₁ + iξ₂)/√2 and the mean's draw Y_k = σ̄_w(ξ₃ + iξ₄)/√2
 * (svea-noise-kernel.ts): b̃_k gains X_k, b̂_k gains Y_k, the corrector's b_k gains X_k. The block's deviates are
 * drawn first, node by node and channel by channel (the general kernel's order), then used.
 * With the higher-order term, y_k = (b_k, ∂t b_k) takes the ETD step of higher-order-kernel.ts per channel (predictor
 * b̃_k = E₀₀b_k + E₀₁w_k + P₀,b·g₀,k, the step-mean through M₁, the corrector y_k ← E y_k + (P₀ − P₁)g₀,k + P₁g₁,k),
 * and with noise a Langevin force F_k = σ_w(ξ₁ + iξ₂)/√2 per node and channel, held over the step (two deviates).
 * With Kerr, the general kernel's kerrExchange in place of the exchange (kerr-phase.ts): the node's total power T and
 * Σ_m y_m (y_k = Re(B̂_k)·Im(u_k v_k*) − Im(B̂_k)·Re(u_k v_k*)) are summed over the channels in order, then each
 * channel's phases take the other channels' share, T − P_k and Σy − y_k; always in blocks, also for two channels.
 * The sum over channels is formed once per node and rotated for each k, where the general kernel forms it again
 * for each k: the same operations in the same order, so the same bits, with O(channels) work per node instead of
 * O(channels²). Each pass runs over a block of one channel's nodes (contiguous in memory), channel after channel,
 * so every node's sums still run over the channels in order. tests/solver/flat-kernels.test.ts compares whole runs
 * with the general kernel bit for bit.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from './interaction-kernel'
import { noiseWeight } from './general-kernel'
import { kerrPhaseCoefficients, TWELFTH } from './kerr-phase'
import { drawNormals, type NormalSource } from './seeded-random'
import { sveaStepMean } from './step-mean'

/** The configuration's limit on channels (shared/physics/simulation-config.ts). */
const MAX_CHANNELS = 8
/** Nodes per block: each pass runs over one channel's nodes of the block (contiguous), the scratch stays in cache. */
const BLOCK = 256
/** Per channel and node of the block: D₀ and b̂ (re, im), at k·BLOCK + node. */
const d0Re = new Float64Array(MAX_CHANNELS * BLOCK)
const d0Im = new Float64Array(MAX_CHANNELS * BLOCK)
const hatRe = new Float64Array(MAX_CHANNELS * BLOCK)
const hatIm = new Float64Array(MAX_CHANNELS * BLOCK)
/** |u|² − |v|² from the entry fields, for the step-mean. */
const powerDiff = new Float64Array(MAX_CHANNELS * BLOCK)
/** With Kerr: per channel and node y_k; per node the total power and Σ_m y_m (kerr-phase.ts). */
const yk = new Float64Array(MAX_CHANNELS * BLOCK)
const totalPower = new Float64Array(BLOCK)
const ySum = new Float64Array(BLOCK)
/** Per node of the block: Σ_m b̂_m p_m, then Σ_m b̄_m p_m. */
const sumRe = new Float64Array(BLOCK)
const sumIm = new Float64Array(BLOCK)
const barSumRe = new Float64Array(BLOCK)
const barSumIm = new Float64Array(BLOCK)
/** With thermal noise: the block's deviates, `perNode` (4 SVEA, 2 higher order) per node and channel at perNode·(node·N_ch + k). */
const draws = new Float64Array(4 * MAX_CHANNELS * BLOCK)

/** The noise's standard deviations per real part, kick (or force) and mean (general-kernel.ts, drawThermalNoise); null without noise. */
interface NoiseSd {
  sd: number
  sdMean: number
  nCh: number
  perNode: number
}

/** True when the several-channel path applies (every option on or off). */
export function channelsFastPathApplies(m: Model): boolean {
  return m.nCh > 1 && m.nCh <= MAX_CHANNELS
}

/** The interaction step at nodes j0..j1 of trapezoid weight `weight`, every channel; `rng` null without noise. */
export function interactSveaChannels(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource | null): void {
  const kerr = m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0
  const ho = m.higherOrder !== null
  if (m.nCh === 2 && !kerr && rng === null && !ho) return interactTwoChannels(m, s, j0, j1, weight)
  const nw = noiseWeight(weight)
  const noise: NoiseSd | null = rng === null ? null
    : ho ? { sd: m.noiseForceRms * Math.SQRT1_2 * nw, sdMean: 0, nCh: m.nCh, perNode: 2 }
    : { sd: m.noiseKickRms * Math.SQRT1_2 * nw, sdMean: m.noiseMeanRms * Math.SQRT1_2 * nw, nCh: m.nCh, perNode: 4 }
  for (let a = j0; a <= j1; a += BLOCK) {
    const n = Math.min(j1, a + BLOCK - 1) - a + 1
    if (noise !== null) drawNormals(rng!, draws, noise.perNode * m.nCh * n)
    sumRe.fill(0, 0, n)
    sumIm.fill(0, 0, n)
    barSumRe.fill(0, 0, n)
    barSumIm.fill(0, 0, n)
    if (kerr) totalPower.fill(0, 0, n), ySum.fill(0, 0, n)
    // Channel by channel, so that every node's sums are taken over the channels in order 0, 1, …, as in the general kernel.
    for (let k = 0; k < m.nCh; k++) predictBlock(m, s, k * m.nodes + a, k, n, kerr, noise)
    for (let k = 0; k < m.nCh; k++) stepMeanBlock(m, s, k * m.nodes + a, k * BLOCK, n, weight, kerr)
    for (let k = 0; k < m.nCh; k++) {
      if (kerr) kerrExchangeBlock(m, s, k * m.nodes + a, k, n, weight)
      else exchangeBlock(m, s, k * m.nodes + a, k, n, weight)
      // The higher-order corrector after the exchange (the SVEA one runs inside it), and the SVEA kick added to the
      // corrector's stored sum (one more rounded addition, as the general kernel's +=): node by node the same operations.
      if (ho) correctHigherOrderBlock(m, s, k * m.nodes + a, k, n, noise)
      else if (noise !== null) addKickBlock(s, k * m.nodes + a, k, n, noise)
    }
  }
}

/**
 * D₀, b̂ = ½(b + E(b + h·D₀)) of channel k's nodes i0..i0+n−1 (with noise ½(b + E(b + h·D₀) + X) + Y; higher order
 * ½(b + b̃), b̃ = E₀₀b + E₀₁w + P₀,b·g₀ (+ P₀,b·(0, f)·F with noise)), and Σ b̂_m p_m (with Kerr also the total power).
 */
function predictBlock(m: Model, s: FieldState, i0: number, k: number, n: number, kerr: boolean, noise: NoiseSd | null): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm } = s
  const pr = m.phaseRe!, pim = m.phaseIm!
  const K = m.driveK, h = m.dtS, Er = m.svea.eRe, Ei = m.svea.eIm
  const ho = m.higherOrder
  const f = ho === null ? 0 : ho.sourceFactor[1]
  const [e00r, e00i] = ho === null ? [0, 0] : ho.e00
  const [e01r, e01i] = ho === null ? [0, 0] : ho.e01
  const [p0br, p0bi] = ho === null ? [0, 0] : ho.p0b
  const o = k * BLOCK
  for (let t = 0; t < n; t++) {
    const i = i0 + t
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    let x: number, y: number
    // Separate expressions, not a zero kick added: −0 + 0 is +0, and the bits must be the general kernel's.
    if (ho !== null) {
      const wr = wRe[i], wi = wIm[i]
      const g0r = -f * d0i
      const g0i = f * d0r
      let tbr = e00r * br - e00i * bi + e01r * wr - e01i * wi + p0br * g0r - p0bi * g0i
      let tbi = e00r * bi + e00i * br + e01r * wi + e01i * wr + p0br * g0i + p0bi * g0r
      if (noise !== null) {
        const d = 2 * (t * noise.nCh + k)
        const gfr = -f * (noise.sd * draws[d + 1])
        const gfi = f * (noise.sd * draws[d])
        tbr += p0br * gfr - p0bi * gfi
        tbi += p0br * gfi + p0bi * gfr
      }
      x = 0.5 * (br + tbr)
      y = 0.5 * (bi + tbi)
    } else {
      const tr = br + h * d0r
      const ti = bi + h * d0i
      if (noise === null) {
        x = 0.5 * (br + (Er * tr - Ei * ti))
        y = 0.5 * (bi + (Er * ti + Ei * tr))
      } else {
        const d = 4 * (t * noise.nCh + k)
        x = 0.5 * (br + (Er * tr - Ei * ti + noise.sd * draws[d])) + noise.sdMean * draws[d + 2]
        y = 0.5 * (bi + (Er * ti + Ei * tr + noise.sd * draws[d + 1])) + noise.sdMean * draws[d + 3]
      }
    }
    d0Re[o + t] = d0r
    d0Im[o + t] = d0i
    hatRe[o + t] = x
    hatIm[o + t] = y
    powerDiff[o + t] = ur * ur + ui * ui - vr * vr - vi * vi
    const cr = pr[i], ci = pim[i]
    sumRe[t] += x * cr - y * ci
    sumIm[t] += x * ci + y * cr
    if (kerr) totalPower[t] += m.kappaP * (ur * ur + ui * ui) + m.rates.kappa * (vr * vr + vi * vi)
  }
}

/**
 * b̄ = b̂ + hφ₃·K·c·w·B̂·(|u|² − |v|²) of one channel, B̂ its light's view of Σ b̂_m p_m; adds b̄ p to Σ b̄_m p_m
 * (with Kerr also y = Re(B̂)·Im(uv*) − Im(B̂)·Re(uv*) and its sum).
 */
function stepMeanBlock(m: Model, s: FieldState, i0: number, o: number, n: number, weight: number, kerr: boolean): void {
  const pr = m.phaseRe!, pim = m.phaseIm!
  const kc = m.driveK * (m.exchangePerB * weight)
  const { m2r, m2i } = sveaStepMean(m.svea.eRe, m.svea.eIm, m.dtS)
  // Higher order: M₁ on (0, f)·ΔD in place of hφ₃ on ΔD (steppers/step-mean.ts).
  const ho = m.higherOrder
  const f = ho === null ? 0 : ho.sourceFactor[1]
  const q1r = ho === null ? 0 : ho.meanG1[0], q1i = ho === null ? 0 : ho.meanG1[1]
  for (let t = 0; t < n; t++) {
    const i = i0 + t
    const kr = pr[i], ki = pim[i]
    const sr = sumRe[t], si = sumIm[t]
    const Br = sr * kr + si * ki
    const Bi = si * kr - sr * ki
    const g = kc * powerDiff[o + t]
    const er = g * Br
    const ei = g * Bi
    if (kerr) {
      const ur = s.uRe[i], ui = s.uIm[i], vr = s.vRe[i], vi = s.vIm[i]
      const y = Br * (ui * vr - ur * vi) - Bi * (ur * vr + ui * vi)
      yk[o + t] = y
      ySum[t] += y
    }
    let x: number, y: number
    if (ho === null) {
      x = hatRe[o + t] + (m2r * er - m2i * ei)
      y = hatIm[o + t] + (m2r * ei + m2i * er)
    } else {
      const ger = -f * ei, gei = f * er
      x = hatRe[o + t] + (q1r * ger - q1i * gei)
      y = hatIm[o + t] + (q1r * gei + q1i * ger)
    }
    barSumRe[t] += x * kr - y * ki
    barSumIm[t] += x * ki + y * kr
  }
}

/** Exchange of channel k's (u, v) with β = c·w·B, B its light's view of Σ b̄_m p_m; then (SVEA) the corrector of its b. */
function exchangeBlock(m: Model, s: FieldState, i0: number, k: number, n: number, weight: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const o = k * BLOCK
  const pr = m.phaseRe!, pim = m.phaseIm!
  const K = m.driveK, hh = 0.5 * m.dtS, Er = m.svea.eRe, Ei = m.svea.eIm
  const c = m.exchangePerB * weight
  const ho = m.higherOrder !== null
  for (let t = 0; t < n; t++) {
    const i = i0 + t
    const kr = pr[i], ki = pim[i]
    const sr = barSumRe[t], si = barSumIm[t]
    const betaR = c * (sr * kr + si * ki)
    const betaI = c * (si * kr - sr * ki)
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
    const q = 0.25 * (betaR * betaR + betaI * betaI)
    const den = 1 / (1 + q)
    const a = 1 - q
    const nur = (a * ur - betaR * vi - betaI * vr) * den
    const nui = (a * ui + betaR * vr - betaI * vi) * den
    const nvr = (a * vr - betaR * ui + betaI * ur) * den
    const nvi = (a * vi + betaR * ur + betaI * ui) * den
    uRe[i] = nur
    uIm[i] = nui
    vRe[i] = nvr
    vIm[i] = nvi
    if (ho) continue
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const br = bRe[i], bi = bIm[i]
    const sbr = br + hh * d0Re[o + t]
    const sbi = bi + hh * d0Im[o + t]
    bRe[i] = Er * sbr - Ei * sbi + hh * d1r
    bIm[i] = Er * sbi + Ei * sbr + hh * d1i
  }
}

/**
 * With Kerr: the general kernel's kerrExchange for one channel (kerr-phase.ts; equations at the top of
 * general-kernel.ts), with β = c·w·B, B its light's view of Σ b̄_m p_m; then (SVEA) the corrector of its b.
 */
function kerrExchangeBlock(m: Model, s: FieldState, i0: number, k: number, n: number, weight: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const o = k * BLOCK
  const pr = m.phaseRe!, pim = m.phaseIm!
  const K = m.driveK, hh = 0.5 * m.dtS, Er = m.svea.eRe, Ei = m.svea.eIm
  const kp = m.kappaP
  const ks = m.rates.kappa
  const c = m.exchangePerB * weight
  const { app, aps, asp, ass, dpc, dsc, gp, gs, epc, esc } = kerrPhaseCoefficients(m.kerrHalfPump * weight, m.kerrHalfStokes * weight, kp, ks, c)
  const ho = m.higherOrder !== null
  for (let t = 0; t < n; t++) {
    const i = i0 + t
    const kr = pr[i], ki = pim[i]
    const sr = barSumRe[t], si = barSumIm[t]
    const betaR = c * (sr * kr + si * ki)
    const betaI = c * (si * kr - sr * ki)
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
    const uu = ur * ur + ui * ui
    const vv = vr * vr + vi * vi
    const other = totalPower[t] - (kp * uu + ks * vv)
    const y = yk[o + t]
    const yOther = ySum[t] - y
    const phiP = app * uu + aps * vv + gp * other
    const phiS = asp * uu + ass * vv + gs * other
    const tp0 = 2 * phiP + dpc * y + epc * yOther
    const ts0 = 2 * phiS + dsc * y + esc * yOther
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
    const nur = cr * eur - ci * eui
    const nui = cr * eui + ci * eur
    cr = (1 - qs) * rs
    ci = ts * rs
    const nvr = cr * evr - ci * evi
    const nvi = cr * evi + ci * evr
    uRe[i] = nur
    uIm[i] = nui
    vRe[i] = nvr
    vIm[i] = nvi
    if (ho) continue
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const br = bRe[i], bi = bIm[i]
    const sbr = br + hh * d0Re[o + t]
    const sbi = bi + hh * d0Im[o + t]
    bRe[i] = Er * sbr - Ei * sbi + hh * d1r
    bIm[i] = Er * sbi + Ei * sbr + hh * d1i
  }
}

/** SVEA noise: the corrector's b of channel k's nodes gains the step's kick X, drawn for the predictor. */
function addKickBlock(s: FieldState, i0: number, k: number, n: number, noise: NoiseSd): void {
  const { bRe, bIm } = s
  for (let t = 0; t < n; t++) {
    const d = 4 * (t * noise.nCh + k)
    bRe[i0 + t] += noise.sd * draws[d]
    bIm[i0 + t] += noise.sd * draws[d + 1]
  }
}

/**
 * The higher-order corrector of channel k's nodes, after their exchange: y ← E y + (P₀ − P₁)g₀ + P₁g₁ with g = (0, f)·D,
 * D₀ from the predictor pass, D₁ from the exchanged fields; with noise plus P₀·(0, f)·F, the force drawn for the predictor.
 */
function correctHigherOrderBlock(m: Model, s: FieldState, i0: number, k: number, n: number, noise: NoiseSd | null): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm } = s
  const ho = m.higherOrder!
  const K = m.driveK
  const f = ho.sourceFactor[1]
  const e00r = ho.e00[0], e00i = ho.e00[1], e01r = ho.e01[0], e01i = ho.e01[1]
  const e10r = ho.e10[0], e10i = ho.e10[1], e11r = ho.e11[0], e11i = ho.e11[1]
  const p0br = ho.p0b[0], p0bi = ho.p0b[1], p0wr = ho.p0w[0], p0wi = ho.p0w[1]
  const p1br = ho.p1b[0], p1bi = ho.p1b[1], p1wr = ho.p1w[0], p1wi = ho.p1w[1]
  const qbr = p0br - p1br, qbi = p0bi - p1bi
  const qwr = p0wr - p1wr, qwi = p0wi - p1wi
  const o = k * BLOCK
  for (let t = 0; t < n; t++) {
    const i = i0 + t
    const nur = uRe[i], nui = uIm[i], nvr = vRe[i], nvi = vIm[i]
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const br = bRe[i], bi = bIm[i], wr = wRe[i], wi = wIm[i]
    const g0r = -f * d0Im[o + t], g0i = f * d0Re[o + t]
    const g1r = -f * d1i, g1i = f * d1r
    let nbr = e00r * br - e00i * bi + e01r * wr - e01i * wi + qbr * g0r - qbi * g0i + p1br * g1r - p1bi * g1i
    let nbi = e00r * bi + e00i * br + e01r * wi + e01i * wr + qbr * g0i + qbi * g0r + p1br * g1i + p1bi * g1r
    let nwr = e10r * br - e10i * bi + e11r * wr - e11i * wi + qwr * g0r - qwi * g0i + p1wr * g1r - p1wi * g1i
    let nwi = e10r * bi + e10i * br + e11r * wi + e11i * wr + qwr * g0i + qwi * g0r + p1wr * g1i + p1wi * g1r
    if (noise !== null) {
      const d = 2 * (t * noise.nCh + k)
      const gfr = -f * (noise.sd * draws[d + 1])
      const gfi = f * (noise.sd * draws[d])
      nbr += p0br * gfr - p0bi * gfi
      nbi += p0br * gfi + p0bi * gfr
      nwr += p0wr * gfr - p0wi * gfi
      nwi += p0wr * gfi + p0wi * gfr
    }
    bRe[i] = nbr
    bIm[i] = nbi
    wRe[i] = nwr
    wIm[i] = nwi
  }
}

/** Exchange of one channel's (u, v) with β, in the general kernel's form; returns nothing, writes u, v at i. */
function exchangeAt(s: FieldState, i: number, betaR: number, betaI: number): void {
  const ur = s.uRe[i], ui = s.uIm[i], vr = s.vRe[i], vi = s.vIm[i]
  const q = 0.25 * (betaR * betaR + betaI * betaI)
  const den = 1 / (1 + q)
  const a = 1 - q
  s.uRe[i] = (a * ur - betaR * vi - betaI * vr) * den
  s.uIm[i] = (a * ui + betaR * vr - betaI * vi) * den
  s.vRe[i] = (a * vr - betaR * ui + betaI * ur) * den
  s.vIm[i] = (a * vi + betaR * ur + betaI * ui) * den
}

/**
 * Two channels, the commonest case, node by node with everything in locals (no scratch): the same expressions
 * as the passes above, each sum over the channels starting from 0 as there.
 */
function interactTwoChannels(m: Model, s: FieldState, j0: number, j1: number, weight: number): void {
  const { uRe, uIm, vRe, vIm, bRe, bIm } = s
  const pr = m.phaseRe!, pim = m.phaseIm!
  const nodes = m.nodes
  const K = m.driveK, h = m.dtS, hh = 0.5 * m.dtS, Er = m.svea.eRe, Ei = m.svea.eIm
  const c = m.exchangePerB * weight
  const kc = K * c
  const { m2r, m2i } = sveaStepMean(Er, Ei, h)
  for (let j = j0; j <= j1; j++) {
    const i = j + nodes
    const p0r = pr[j], p0i = pim[j], p1r = pr[i], p1i = pim[i]
    // Predictor, trapezoid mean b̂ and |u|² − |v|² of each channel.
    let ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    const d0r0 = -K * (ui * vr - ur * vi)
    const d0i0 = K * (ur * vr + ui * vi)
    let tr = br + h * d0r0
    let ti = bi + h * d0i0
    const x0 = 0.5 * (br + (Er * tr - Ei * ti))
    const y0 = 0.5 * (bi + (Er * ti + Ei * tr))
    const w0 = ur * ur + ui * ui - vr * vr - vi * vi
    ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
    const d0r1 = -K * (ui * vr - ur * vi)
    const d0i1 = K * (ur * vr + ui * vi)
    tr = br + h * d0r1
    ti = bi + h * d0i1
    const x1 = 0.5 * (br + (Er * tr - Ei * ti))
    const y1 = 0.5 * (bi + (Er * ti + Ei * tr))
    const w1 = ur * ur + ui * ui - vr * vr - vi * vi
    // Σ b̂_m p_m, each channel's view of it, the step-mean b̄ of each, and Σ b̄_m p_m.
    const sr = 0 + (x0 * p0r - y0 * p0i) + (x1 * p1r - y1 * p1i)
    const si = 0 + (x0 * p0i + y0 * p0r) + (x1 * p1i + y1 * p1r)
    let g = kc * w0
    let er = g * (sr * p0r + si * p0i)
    let ei = g * (si * p0r - sr * p0i)
    const bx0 = x0 + (m2r * er - m2i * ei)
    const by0 = y0 + (m2r * ei + m2i * er)
    g = kc * w1
    er = g * (sr * p1r + si * p1i)
    ei = g * (si * p1r - sr * p1i)
    const bx1 = x1 + (m2r * er - m2i * ei)
    const by1 = y1 + (m2r * ei + m2i * er)
    const zr = 0 + (bx0 * p0r - by0 * p0i) + (bx1 * p1r - by1 * p1i)
    const zi = 0 + (bx0 * p0i + by0 * p0r) + (bx1 * p1i + by1 * p1r)
    // Exchange and corrector of each channel.
    exchangeAt(s, j, c * (zr * p0r + zi * p0i), c * (zi * p0r - zr * p0i))
    exchangeAt(s, i, c * (zr * p1r + zi * p1i), c * (zi * p1r - zr * p1i))
    ur = uRe[j], ui = uIm[j], vr = vRe[j], vi = vIm[j], br = bRe[j], bi = bIm[j]
    let d1r = -K * (ui * vr - ur * vi)
    let d1i = K * (ur * vr + ui * vi)
    let sbr = br + hh * d0r0
    let sbi = bi + hh * d0i0
    bRe[j] = Er * sbr - Ei * sbi + hh * d1r
    bIm[j] = Er * sbi + Ei * sbr + hh * d1i
    ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
    d1r = -K * (ui * vr - ur * vi)
    d1i = K * (ur * vr + ui * vi)
    sbr = br + hh * d0r1
    sbi = bi + hh * d0i1
    bRe[i] = Er * sbr - Ei * sbi + hh * d1r
    bIm[i] = Er * sbi + Ei * sbr + hh * d1i
  }
}
