/*
 * The general interaction kernel: any number of channels, optional higher-order acoustics, Kerr and thermal
 * noise. It implements steps 1–5 of the contract at the top of interaction-kernel.ts (equations there), one
 * named function per step; interactSvea is the same arithmetic written flat for the plain one-channel case, and
 * interactSveaKerr, interactSveaNoise, interactSveaKerrNoise and interactHigherOrder for one channel with Kerr, with
 * thermal noise, with both and with the higher-order term (Kerr and noise on or off), interactSveaChannels for several
 * channels with any options (svea-kerr-kernel.ts, svea-noise-kernel.ts, svea-kerr-noise-kernel.ts,
 * higher-order-kernel.ts, svea-channels-kernel.ts): a change of rounding order or of the order of draws here must be
 * made there too (tests/solver/flat-kernels.test.ts). The solver runs this kernel only when told to, as their reference.
 * Kerr step (kerrExchange below; coefficients and midpoint powers in kerr-phase.ts), with q = (·)²/4, a = (1 − q_e)(1 + q_r):
 *   r = 1/(((1 + q_e)(1 + q_r))((1 + q_p)(1 + q_s))),  β' = β·((1 − q_r) + iΔφ),  Δφ = φ_s − φ_p  (first half step's phases),
 *   (u, v) ← (((1 − q_p) + iθ_p)(1 + q_s)·(a·u + iβ'·v), ((1 − q_s) + iθ_s)(1 + q_p)·(a·v + iβ'*·u))·r,
 * i.e. the first Kerr half step moved through the exchange (which turns β by the pair's phase difference), then
 * both half steps' rotations as one, θ the whole step's phase at the midpoint powers: one division per node.
 */
import type { Model } from '../problem/coupled-modes'
import type { NormalSource } from './seeded-random'
import type { FieldState } from './interaction-kernel'
import { kerrPhaseCoefficients, TWELFTH } from './kerr-phase'
import { sveaStepMean } from './step-mean'

/*
 * General path, as the named steps of the contract above, over a block of up to SCRATCH_NODES nodes at a time
 * (each node's step involves only that node, so running every step over the block before the next step gives
 * the same numbers as running the node through all steps; one call per step and block keeps the per-node cost
 * of the calls away). Scratch per node and channel (SCRATCH_PER_CHANNEL numbers at
 * o = SCRATCH_PER_CHANNEL·(k·SCRATCH_NODES + node in block)): [o, o+1] b̃, then b̂, then b̄, [o+2, o+3] D₀, [o+4, o+5] B
 * seen by this channel's optics (from b̂, then from b̄), [o+6, o+7] the step's noise draw, [o+8, o+9] the extra draw that restores
 * the variance of b̄ (SVEA noise), [o+10] with Kerr, y of the exchange's first-order power change (kerr-phase.ts). The noise step draws node by node and channel by channel, the order of the
 * one-function kernel before the split, and every sum keeps its rounding: the results are the same bit for
 * bit (tests/solver/kernel-bits.test.ts).
 */

/** Numbers of scratch per node and channel (layout above). */
export const SCRATCH_PER_CHANNEL = 11
/** Nodes per block: enough to spread the calls, small enough for the scratch to stay in the L1 cache. */
export const SCRATCH_NODES = 32

/**
 * General path: any number of channels, optional higher-order acoustics, Kerr and thermal noise, at nodes
 * j0..j1 of trapezoid weight `weight`, in node order.
 */
export function interactGeneral(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource | null): void {
  const kerr = m.kerrHalfPump !== 0 || m.kerrHalfStokes !== 0
  for (let a = j0; a <= j1; a += SCRATCH_NODES) {
    const b = Math.min(j1, a + SCRATCH_NODES - 1)
    predictAcoustic(m, s, a, b)
    if (rng !== null) drawThermalNoise(m, s, a, b, weight, rng)
    averageAcoustic(m, s, a, b, rng !== null && m.higherOrder === null)
    fieldSeenByOptics(m, s, a, b)
    stepMean(m, s, a, b, weight, kerr)
    fieldSeenByOptics(m, s, a, b)
    if (kerr) kerrExchange(m, s, a, b, weight)
    else exchangeOptics(m, s, a, b, weight)
    if (m.higherOrder === null) correctSvea(m, s, a, b, rng !== null)
    else correctHigherOrder(m, s, a, b, rng !== null)
  }
}

/** Step 2, predictor: D₀ = iκAₚAₛ* from the entry fields, and the noise-free b̃ (SVEA or ETD). */
function predictAcoustic(m: Model, s: FieldState, j0: number, j1: number): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm, scratch } = s
  const K = m.driveK
  const h = m.dtS
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  const ho = m.higherOrder
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i], br = bRe[i], bi = bIm[i]
    const d0r = -K * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    if (ho === null) {
      const tr = br + h * d0r
      const ti = bi + h * d0i
      scratch[o] = Er * tr - Ei * ti
      scratch[o + 1] = Er * ti + Ei * tr
    } else {
      // g0 = (0, f)·D0 = (−f·D0i, f·D0r), f = −2Ω
      const g0r = -ho.sourceFactor[1] * d0i
      const g0i = ho.sourceFactor[1] * d0r
      const wr = wRe[i], wi = wIm[i]
      scratch[o] = ho.e00[0] * br - ho.e00[1] * bi + ho.e01[0] * wr - ho.e01[1] * wi + ho.p0b[0] * g0r - ho.p0b[1] * g0i
      scratch[o + 1] = ho.e00[0] * bi + ho.e00[1] * br + ho.e01[0] * wi + ho.e01[1] * wr + ho.p0b[0] * g0i + ho.p0b[1] * g0r
    }
    scratch[o + 2] = d0r
    scratch[o + 3] = d0i
  }
}

/**
 * Step 5, noise draw: the step's random kick, drawn before the corrector and added to b̃ too, so b̄ carries the
 * noise of the whole step (docs/numerics.md, "Thermal noise"); adding it only after the corrector would scale
 * the noise that the light sees by (1 + E)/2, a first-order error in the spontaneous Stokes power.
 */
function drawThermalNoise(m: Model, s: FieldState, j0: number, j1: number, weight: number, rng: NormalSource): void {
  const nCh = m.nCh
  const scratch = s.scratch
  const ho = m.higherOrder
  const sd = (ho === null ? m.noiseKickRms : m.noiseForceRms) * Math.SQRT1_2 * noiseWeight(weight)
  const sdMean = m.noiseMeanRms * Math.SQRT1_2 * noiseWeight(weight)
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    const xr = sd * rng.normal(), xi = sd * rng.normal()
    scratch[o + 6] = xr
    scratch[o + 7] = xi
    if (ho === null) {
      scratch[o] += xr
      scratch[o + 1] += xi
      // The trapezoid mean (b + b̃)/2 of the noisy path has the right low-frequency spectrum but a variance
      // short by V(1 − Re E)/2 (its high-frequency part, ≈ Γ_B Δt/4): an independent white draw of that
      // variance restores ⟨|b̄|²⟩ = V without touching the spectrum near the gain line.
      scratch[o + 8] = sdMean * rng.normal()
      scratch[o + 9] = sdMean * rng.normal()
    } else {
      // Langevin force held constant over the step: g = (0, f)·F enters like the light's source.
      const f = ho.sourceFactor[1]
      const gr = -f * xi, gi = f * xr
      scratch[o] += ho.p0b[0] * gr - ho.p0b[1] * gi
      scratch[o + 1] += ho.p0b[0] * gi + ho.p0b[1] * gr
    }
  }
}

/** b̂ = (b + b̃)/2, the trapezoid mean (stepMean's estimate of D₁ − D₀ uses it), plus the mean's own draw with SVEA noise. */
function averageAcoustic(m: Model, s: FieldState, j0: number, j1: number, meanDraw: boolean): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { bRe, bIm, scratch } = s
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    scratch[o] = 0.5 * (bRe[i] + scratch[o])
    scratch[o + 1] = 0.5 * (bIm[i] + scratch[o + 1])
    if (meanDraw) {
      scratch[o] += scratch[o + 8]
      scratch[o + 1] += scratch[o + 9]
    }
  }
}

/**
 * Step 2, the step-mean b̄ the light sees (contract, step 2; steppers/step-mean.ts): b̂ plus the source's change over
 * the step, Δt·φ₃·(D₁ − D₀) (SVEA; higher order the (b, ∂t b) entry of Δt·φ₃(AΔt) on (0, f)·(D₁ − D₀)), with
 * D₁ − D₀ = K·c·B̂·(|u|² − |v|²) from the trapezoid field B̂ this channel's optics see; b̂ carries the noise.
 */
function stepMean(m: Model, s: FieldState, j0: number, j1: number, weight: number, kerr: boolean): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, scratch } = s
  const c = m.exchangePerB * weight
  const kc = m.driveK * c
  const ho = m.higherOrder
  const { m2r, m2i } = sveaStepMean(m.svea.eRe, m.svea.eIm, m.dtS)
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
    const g = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
    const er = g * scratch[o + 4]
    const ei = g * scratch[o + 5]
    // With Kerr: y = Re(B̂)·Im(uv*) − Im(B̂)·Re(uv*), the exchange's first-order power change over 2c (kerr-phase.ts).
    if (kerr) scratch[o + 10] = scratch[o + 4] * (ui * vr - ur * vi) - scratch[o + 5] * (ur * vr + ui * vi)
    if (ho === null) {
      scratch[o] = scratch[o] + (m2r * er - m2i * ei)
      scratch[o + 1] = scratch[o + 1] + (m2r * ei + m2i * er)
    } else {
      const f = ho.sourceFactor[1]
      const ger = -f * ei, gei = f * er
      const [q1r, q1i] = ho.meanG1
      scratch[o] = scratch[o] + (q1r * ger - q1i * gei)
      scratch[o + 1] = scratch[o + 1] + (q1r * gei + q1i * ger)
    }
  }
}

/** B_k = e^{−i q_k z} Σ_m b̄_m e^{i q_m z}: every channel's grating as channel k's optics see it (b̄ itself for one). */
function fieldSeenByOptics(m: Model, s: FieldState, j0: number, j1: number): void {
  const scratch = s.scratch
  const nCh = m.nCh
  const nodes = m.nodes
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    let Br = scratch[o], Bi = scratch[o + 1]
    if (nCh > 1) {
      const pr = m.phaseRe!, pim = m.phaseIm!
      let sr = 0, si = 0
      for (let mm = 0; mm < nCh; mm++) {
        const om = SCRATCH_PER_CHANNEL * (mm * SCRATCH_NODES + j - j0)
        const x = scratch[om], y = scratch[om + 1]
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
}

/** Step 3, optical exchange with B frozen: the Cayley (unitary) rotation of (u, v), β = exchangePerB·weight·B. */
function exchangeOptics(m: Model, s: FieldState, j0: number, j1: number, weight: number): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, scratch } = s
  const c = m.exchangePerB * weight
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
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
}

/** Step 4, SVEA corrector: b ← e^{−λΔt}(b + Δt/2·D₀) + Δt/2·D₁, plus the exact Ornstein–Uhlenbeck kick drawn for the predictor. */
function correctSvea(m: Model, s: FieldState, j0: number, j1: number, noise: boolean): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, bRe, bIm, scratch } = s
  const K = m.driveK
  const hh = 0.5 * m.dtS
  const Er = m.svea.eRe
  const Ei = m.svea.eIm
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    const nur = uRe[i], nui = uIm[i], nvr = vRe[i], nvi = vIm[i]
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const d0r = scratch[o + 2], d0i = scratch[o + 3]
    const br = bRe[i], bi = bIm[i]
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    let nbr = Er * sr - Ei * si + hh * d1r
    let nbi = Er * si + Ei * sr + hh * d1i
    if (noise) {
      nbr += scratch[o + 6]
      nbi += scratch[o + 7]
    }
    bRe[i] = nbr
    bIm[i] = nbi
  }
}

/**
 * Step 4, higher-order corrector: the ETD step of (b, ∂t b) with the source interpolated linearly over the
 * step, y₁ = E y₀ + (P₀ − P₁) g₀ + P₁ g₁, plus the Langevin force drawn for the predictor, held over the step.
 */
function correctHigherOrder(m: Model, s: FieldState, j0: number, j1: number, noise: boolean): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, bRe, bIm, wRe, wIm, scratch } = s
  const K = m.driveK
  const ho = m.higherOrder!
  const f = ho.sourceFactor[1]
  for (let j = j0; j <= j1; j++) for (let k = 0; k < nCh; k++) {
    const i = k * nodes + j
    const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
    const nur = uRe[i], nui = uIm[i], nvr = vRe[i], nvi = vIm[i]
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const d0r = scratch[o + 2], d0i = scratch[o + 3]
    const br = bRe[i], bi = bIm[i]
    // g = (0, f)·D = (−f·Di, f·Dr)
    let g0r = -f * d0i, g0i = f * d0r
    const g1r = -f * d1i, g1i = f * d1r
    const wr = wRe[i], wi = wIm[i]
    const qbr = ho.p0b[0] - ho.p1b[0], qbi = ho.p0b[1] - ho.p1b[1]
    const qwr = ho.p0w[0] - ho.p1w[0], qwi = ho.p0w[1] - ho.p1w[1]
    let nbr = ho.e00[0] * br - ho.e00[1] * bi + ho.e01[0] * wr - ho.e01[1] * wi + qbr * g0r - qbi * g0i + ho.p1b[0] * g1r - ho.p1b[1] * g1i
    let nbi = ho.e00[0] * bi + ho.e00[1] * br + ho.e01[0] * wi + ho.e01[1] * wr + qbr * g0i + qbi * g0r + ho.p1b[0] * g1i + ho.p1b[1] * g1r
    let nwr = ho.e10[0] * br - ho.e10[1] * bi + ho.e11[0] * wr - ho.e11[1] * wi + qwr * g0r - qwi * g0i + ho.p1w[0] * g1r - ho.p1w[1] * g1i
    let nwi = ho.e10[0] * bi + ho.e10[1] * br + ho.e11[0] * wi + ho.e11[1] * wr + qwr * g0i + qwi * g0r + ho.p1w[0] * g1i + ho.p1w[1] * g1r
    if (noise) {
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

/**
 * Noise amplitude factor of a node of trapezoid weight w: a facet node stands for half a cell, so its
 * acoustic field carries twice the variance per node (ħω_s n_th/(wΔz)), which keeps the noise per unit
 * length right at the facets.
 */
export function noiseWeight(weight: number): number {
  return weight === 1 ? 1 : Math.sqrt(1 / weight)
}

/**
 * Step 3 with Kerr (kerr-phase.ts, docs/numerics.md "Kerr phases"): per channel, the first half step's phases φ
 * from the entry powers and the whole step's θ at the midpoint powers; the exchange in the frame of the first half
 * step (β turned by the Cayley factor of φ_s − φ_p), then both half steps as one Cayley rotation by θ, over one
 * reciprocal r = 1/(((1 + q_e)(1 + q_r))((1 + q_p)(1 + q_s))), q = (·)²/4 (svea-kerr-kernel.ts, the same order).
 */
function kerrExchange(m: Model, s: FieldState, j0: number, j1: number, weight: number): void {
  const nCh = m.nCh
  const nodes = m.nodes
  const { uRe, uIm, vRe, vIm, scratch } = s
  const kp = m.kappaP
  const ks = m.rates.kappa
  const c = m.exchangePerB * weight
  const { app, aps, asp, ass, dpc, dsc, gp, gs, epc, esc } = kerrPhaseCoefficients(m.kerrHalfPump * weight, m.kerrHalfStokes * weight, kp, ks, c)
  for (let j = j0; j <= j1; j++) {
    let total = 0
    let ySum = 0
    for (let k = 0; k < nCh; k++) {
      const i = k * nodes + j
      total += kp * (uRe[i] * uRe[i] + uIm[i] * uIm[i]) + ks * (vRe[i] * vRe[i] + vIm[i] * vIm[i])
      ySum += scratch[SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0) + 10]
    }
    for (let k = 0; k < nCh; k++) {
      const i = k * nodes + j
      const o = SCRATCH_PER_CHANNEL * (k * SCRATCH_NODES + j - j0)
      const ur = uRe[i], ui = uIm[i], vr = vRe[i], vi = vIm[i]
      const uu = ur * ur + ui * ui
      const vv = vr * vr + vi * vi
      const other = total - (kp * uu + ks * vv)
      const y = scratch[o + 10]
      const yOther = ySum - y
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
      const betaR = c * scratch[o + 4], betaI = c * scratch[o + 5]
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
      uRe[i] = cr * eur - ci * eui
      uIm[i] = cr * eui + ci * eur
      cr = (1 - qs) * rs
      ci = ts * rs
      vRe[i] = cr * evr - ci * evi
      vIm[i] = cr * evi + ci * evr
    }
  }
}
