/*
 * Step-mean of the acoustic field: the b̄ the light sees over one step (docs/numerics.md, "Error constant of the
 * step"). Over a step, ∂t b = −λb + D(t) with the source D interpolated linearly between D₀ and D₁; the exact
 * mean of its solution is
 *     b̄ = (1/Δt)∫₀^Δt b dt = φ₁(z)·b + Δt·φ₂(z)·D₀ + Δt·φ₃(z)·(D₁ − D₀),  z = −λΔt,
 *     φ₁ = (e^z − 1)/z,  φ₂ = (φ₁ − 1)/z,  φ₃ = (φ₂ − ½)/z   (φ_k(z) = Σ_n zⁿ/(n + k)!, → 1, ½, ⅙ as z → 0).
 * The kernels keep the trapezoid mean's weights, b̂ = (b + b̃)/2 with b̃ = E(b + Δt·D₀), and add the source's change:
 *     b̄ = b̂ + Δt·φ₃(z)·(D₁ − D₀),
 * with D₁ − D₀ from the exchange to first order, (u₁, v₁) = (u + iβv, v + iβ*u) + O(β²), so
 *     D₁ − D₀ = K·β̂·(|u|² − |v|²) + O(Δt²),  β̂ = c·b̂,
 * at one exchange per node and step. (The exact weights φ₁, Δt·φ₂ in place of the trapezoid's cost the CW steady
 * state more and gain little: docs/numerics.md, "Error constant of the step".)
 *
 * This module computes φ₁, Δt·φ₂, Δt·φ₃ from E = e^z and Δt with +, −, ×, ÷ and √ only (each correctly rounded in
 * IEEE 754), so the WebAssembly engine (engine/assembly/svea-step.ts, the same code) gets the same bits:
 *   z = log E: square roots w ← √w until |w − 1| ≤ 0.1 (k of them), then log w = 2·atanh((w − 1)/(w + 1)) by its
 *   series, z = 2^k·log w (principal branch, as the square roots are principal);
 *   φ_k by their Taylor series (20 terms) for |z| < ½, else by the recursion above from E itself.
 */

/** φ₁(z), Δt·φ₂(z), Δt·φ₃(z), each [re, im] as two numbers. */
export interface StepMean {
  m0r: number
  m0i: number
  m1r: number
  m1i: number
  m2r: number
  m2i: number
}

let lastEr = NaN
let lastEi = NaN
let lastH = NaN
let last: StepMean = { m0r: 1, m0i: 0, m1r: 0, m1i: 0, m2r: 0, m2i: 0 }

/** The step-mean coefficients for E = e^z and step h (the last call's answer is kept: kernels ask every step). */
export function sveaStepMean(Er: number, Ei: number, h: number): StepMean {
  if (Er === lastEr && Ei === lastEi && h === lastH) return last
  last = computeStepMean(Er, Ei, h)
  lastEr = Er
  lastEi = Ei
  lastH = h
  return last
}

function computeStepMean(Er: number, Ei: number, h: number): StepMean {
  let wr = Er
  let wi = Ei
  let scale = 1
  for (let k = 0; k < 60 && (wr - 1) * (wr - 1) + wi * wi > 0.01; k++) {
    // Principal square root.
    const r = Math.sqrt(wr * wr + wi * wi)
    if (wr >= 0) {
      const sr = Math.sqrt(0.5 * (r + wr))
      wi = wi / (2 * sr)
      wr = sr
    } else {
      let si = Math.sqrt(0.5 * (r - wr))
      if (wi < 0) si = -si
      wr = wi / (2 * si)
      wi = si
    }
    scale = 2 * scale
  }
  // y = (w − 1)/(w + 1), log w = 2(y + y³/3 + y⁵/5 + …); |y| ≤ 0.053, so 12 terms are exact to round-off.
  const ar = wr - 1
  const br = wr + 1
  const dd = br * br + wi * wi
  const yr = (ar * br + wi * wi) / dd
  const yi = (wi * br - ar * wi) / dd
  const y2r = yr * yr - yi * yi
  const y2i = 2 * yr * yi
  let sr = 1 / 23
  let si = 0
  for (let n = 10; n >= 0; n--) {
    const tr = sr * y2r - si * y2i
    si = sr * y2i + si * y2r
    sr = tr + 1 / (2 * n + 1)
  }
  const lr = sr * yr - si * yi
  const li = sr * yi + si * yr
  const zr = 2 * scale * lr
  const zi = 2 * scale * li
  let p1r: number, p1i: number, p2r: number, p2i: number, p3r: number, p3i: number
  if (zr * zr + zi * zi < 0.25) {
    p1r = p1i = p2r = p2i = p3r = p3i = 0
    let pr = 1
    let pi = 0
    let f1 = 1
    let f2 = 2
    let f3 = 6
    for (let n = 0; n < 20; n++) {
      p1r += pr / f1
      p1i += pi / f1
      p2r += pr / f2
      p2i += pi / f2
      p3r += pr / f3
      p3i += pi / f3
      const t = pr * zr - pi * zi
      pi = pr * zi + pi * zr
      pr = t
      f1 = f1 * (n + 2)
      f2 = f2 * (n + 3)
      f3 = f3 * (n + 4)
    }
  } else {
    const zz = zr * zr + zi * zi
    // x/z = x·z*/|z|²
    const xr1 = Er - 1
    p1r = (xr1 * zr + Ei * zi) / zz
    p1i = (Ei * zr - xr1 * zi) / zz
    const xr2 = p1r - 1
    p2r = (xr2 * zr + p1i * zi) / zz
    p2i = (p1i * zr - xr2 * zi) / zz
    const xr3 = p2r - 0.5
    p3r = (xr3 * zr + p2i * zi) / zz
    p3i = (p2i * zr - xr3 * zi) / zz
  }
  return { m0r: p1r, m0i: p1i, m1r: h * p2r, m1i: h * p2i, m2r: h * p3r, m2i: h * p3i }
}
