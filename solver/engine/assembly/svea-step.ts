/*
 * AssemblyScript source of the WebAssembly step engine (compiled by scripts/build-wasm.mjs; not TypeScript
 * for tsc: the types v128, usize and f64 are AssemblyScript's).
 *
 * The same arithmetic as `interactSvea` in solver/steppers/interaction-kernel.ts, operation for operation,
 * two nodes at a time in f64x2 lanes. With u = A_p, v = A_s, E = e^{−λΔt} = e^z, c = exchange per unit b·weight:
 *   D₀ = iK·u·v*,  t = b + h·D₀,  b̂ = ½(b + E·t)   (the trapezoid mean)
 *   b̄ = b̂ + hφ₃(z)·K·c·b̂·(|u|² − |v|²)   (the step-mean: solver/steppers/step-mean.ts)
 *   β = c·b̄,  q = |β|²/4,  (u, v) ← [[1 − q, iβ], [iβ*, 1 − q]](u, v)/(1 + q)
 *   b ← E·(b + h/2·D₀) + h/2·D₁,  D₁ = iK·u·v* from the exchanged fields.
 * The φ-coefficients come from E and h by `stepMean` below, step-mean.ts's computeStepMean line for line (only
 * +, −, ×, ÷ and √). IEEE 754 add, sub, mul, div and sqrt are correctly rounded in each lane, WebAssembly has no
 * fused multiply-add, and every expression below keeps the reference's evaluation order, so the results are the
 * same bits.
 *
 * Memory: the driver's Float64Arrays are views into this module's imported memory; the arguments are byte
 * addresses. Nothing is allocated here (stub runtime).
 */

// The step-mean's coefficients φ₁, hφ₂, hφ₃ of the last (E, h) asked for (each instance keeps its own).
let lastEr: f64 = NaN
let lastEi: f64 = NaN
let lastH: f64 = NaN
let m0r: f64 = 1.0
let m0i: f64 = 0.0
let m1r: f64 = 0.0
let m1i: f64 = 0.0
let m2r: f64 = 0.0
let m2i: f64 = 0.0

/** solver/steppers/step-mean.ts, computeStepMean, operation for operation. */
function stepMean(Er: f64, Ei: f64, h: f64): void {
  if (Er == lastEr && Ei == lastEi && h == lastH) return
  let wr = Er
  let wi = Ei
  let scale: f64 = 1.0
  for (let k = 0; k < 60 && (wr - 1.0) * (wr - 1.0) + wi * wi > 0.01; k++) {
    const r = Math.sqrt(wr * wr + wi * wi)
    if (wr >= 0.0) {
      const sr = Math.sqrt(0.5 * (r + wr))
      wi = wi / (2.0 * sr)
      wr = sr
    } else {
      let si = Math.sqrt(0.5 * (r - wr))
      if (wi < 0.0) si = -si
      wr = wi / (2.0 * si)
      wi = si
    }
    scale = 2.0 * scale
  }
  const ar = wr - 1.0
  const br = wr + 1.0
  const dd = br * br + wi * wi
  const yr = (ar * br + wi * wi) / dd
  const yi = (wi * br - ar * wi) / dd
  const y2r = yr * yr - yi * yi
  const y2i = 2.0 * yr * yi
  let sr: f64 = 1.0 / 23.0
  let si: f64 = 0.0
  for (let n = 10; n >= 0; n--) {
    const tr = sr * y2r - si * y2i
    si = sr * y2i + si * y2r
    sr = tr + 1.0 / <f64>(2 * n + 1)
  }
  const lr = sr * yr - si * yi
  const li = sr * yi + si * yr
  const zr = 2.0 * scale * lr
  const zi = 2.0 * scale * li
  let p1r: f64 = 0.0, p1i: f64 = 0.0, p2r: f64 = 0.0, p2i: f64 = 0.0, p3r: f64 = 0.0, p3i: f64 = 0.0
  if (zr * zr + zi * zi < 0.25) {
    let pr: f64 = 1.0
    let pi: f64 = 0.0
    let f1: f64 = 1.0
    let f2: f64 = 2.0
    let f3: f64 = 6.0
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
      f1 = f1 * <f64>(n + 2)
      f2 = f2 * <f64>(n + 3)
      f3 = f3 * <f64>(n + 4)
    }
  } else {
    const zz = zr * zr + zi * zi
    const xr1 = Er - 1.0
    p1r = (xr1 * zr + Ei * zi) / zz
    p1i = (Ei * zr - xr1 * zi) / zz
    const xr2 = p1r - 1.0
    p2r = (xr2 * zr + p1i * zi) / zz
    p2i = (p1i * zr - xr2 * zi) / zz
    const xr3 = p2r - 0.5
    p3r = (xr3 * zr + p2i * zi) / zz
    p3i = (p2i * zr - xr3 * zi) / zz
  }
  m0r = p1r
  m0i = p1i
  m1r = h * p2r
  m1i = h * p2i
  m2r = h * p3r
  m2i = h * p3i
  lastEr = Er
  lastEi = Ei
  lastH = h
}

// @ts-ignore: decorator
@inline
function exchange(uRe: usize, uIm: usize, vRe: usize, vIm: usize, bRe: usize, bIm: usize, j0: i32, j1: i32, K: f64, cHalf: f64, Er: f64, Ei: f64, h: f64): void {
  const hh = 0.5 * h
  const hhK = hh * K
  const negK = -K
  const c = 2.0 * cHalf
  const kc = K * c
  stepMean(Er, Ei, h)
  const vC = f64x2.splat(c)
  const vKc = f64x2.splat(kc)
  const vHalf = f64x2.splat(0.5)
  const vM2r = f64x2.splat(m2r)
  const vM2i = f64x2.splat(m2i)
  const vNegK = f64x2.splat(negK)
  const vK = f64x2.splat(K)
  const vH = f64x2.splat(h)
  const vHh = f64x2.splat(hh)
  const vHhK = f64x2.splat(hhK)
  const vEr = f64x2.splat(Er)
  const vEi = f64x2.splat(Ei)
  const vQuarter = f64x2.splat(0.25)
  const vOne = f64x2.splat(1.0)
  let j = j0
  for (; j < j1; j += 2) {
    const o = <usize>j << 3
    const ur = v128.load(uRe + o)
    const ui = v128.load(uIm + o)
    const vr = v128.load(vRe + o)
    const vi = v128.load(vIm + o)
    const br = v128.load(bRe + o)
    const bi = v128.load(bIm + o)
    // D0 = iK·u·v*: d0r = −K·(ui·vr − ur·vi), d0i = K·(ur·vr + ui·vi)
    const d0r = f64x2.mul(vNegK, f64x2.sub(f64x2.mul(ui, vr), f64x2.mul(ur, vi)))
    const d0i = f64x2.mul(vK, f64x2.add(f64x2.mul(ur, vr), f64x2.mul(ui, vi)))
    const tr = f64x2.add(br, f64x2.mul(vH, d0r))
    const ti = f64x2.add(bi, f64x2.mul(vH, d0i))
    // b̂ = ½(b + (Er·tr − Ei·ti), b + (Er·ti + Ei·tr)); e = (K·c·(|u|² − |v|²))·b̂; β = c·(b̂ + m2·e)
    const btr = f64x2.mul(vHalf, f64x2.add(br, f64x2.sub(f64x2.mul(vEr, tr), f64x2.mul(vEi, ti))))
    const bti = f64x2.mul(vHalf, f64x2.add(bi, f64x2.add(f64x2.mul(vEr, ti), f64x2.mul(vEi, tr))))
    const g = f64x2.mul(vKc, f64x2.sub(f64x2.sub(f64x2.add(f64x2.mul(ur, ur), f64x2.mul(ui, ui)), f64x2.mul(vr, vr)), f64x2.mul(vi, vi)))
    const er = f64x2.mul(g, btr)
    const ei = f64x2.mul(g, bti)
    const betaR = f64x2.mul(vC, f64x2.add(btr, f64x2.sub(f64x2.mul(vM2r, er), f64x2.mul(vM2i, ei))))
    const betaI = f64x2.mul(vC, f64x2.add(bti, f64x2.add(f64x2.mul(vM2r, ei), f64x2.mul(vM2i, er))))
    const q = f64x2.mul(vQuarter, f64x2.add(f64x2.mul(betaR, betaR), f64x2.mul(betaI, betaI)))
    const den = f64x2.div(vOne, f64x2.add(vOne, q))
    const a = f64x2.sub(vOne, q)
    const nur = f64x2.mul(f64x2.sub(f64x2.sub(f64x2.mul(a, ur), f64x2.mul(betaR, vi)), f64x2.mul(betaI, vr)), den)
    const nui = f64x2.mul(f64x2.sub(f64x2.add(f64x2.mul(a, ui), f64x2.mul(betaR, vr)), f64x2.mul(betaI, vi)), den)
    const nvr = f64x2.mul(f64x2.add(f64x2.sub(f64x2.mul(a, vr), f64x2.mul(betaR, ui)), f64x2.mul(betaI, ur)), den)
    const nvi = f64x2.mul(f64x2.add(f64x2.add(f64x2.mul(a, vi), f64x2.mul(betaR, ur)), f64x2.mul(betaI, ui)), den)
    v128.store(uRe + o, nur)
    v128.store(uIm + o, nui)
    v128.store(vRe + o, nvr)
    v128.store(vIm + o, nvi)
    // b ← E(b + h/2·D0) + h/2·D1
    const sr = f64x2.add(br, f64x2.mul(vHh, d0r))
    const si = f64x2.add(bi, f64x2.mul(vHh, d0i))
    const d1r = f64x2.sub(f64x2.mul(nui, nvr), f64x2.mul(nur, nvi))
    const d1i = f64x2.add(f64x2.mul(nur, nvr), f64x2.mul(nui, nvi))
    v128.store(bRe + o, f64x2.sub(f64x2.sub(f64x2.mul(vEr, sr), f64x2.mul(vEi, si)), f64x2.mul(vHhK, d1r)))
    v128.store(bIm + o, f64x2.add(f64x2.add(f64x2.mul(vEr, si), f64x2.mul(vEi, sr)), f64x2.mul(vHhK, d1i)))
  }
  // The odd node left over (or a single facet node): the same expressions in scalar form.
  for (; j <= j1; j++) {
    const o = <usize>j << 3
    const ur = load<f64>(uRe + o)
    const ui = load<f64>(uIm + o)
    const vr = load<f64>(vRe + o)
    const vi = load<f64>(vIm + o)
    const br = load<f64>(bRe + o)
    const bi = load<f64>(bIm + o)
    const d0r = negK * (ui * vr - ur * vi)
    const d0i = K * (ur * vr + ui * vi)
    const tr = br + h * d0r
    const ti = bi + h * d0i
    const btr = 0.5 * (br + (Er * tr - Ei * ti))
    const bti = 0.5 * (bi + (Er * ti + Ei * tr))
    const g = kc * (ur * ur + ui * ui - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const betaR = c * (btr + (m2r * er - m2i * ei))
    const betaI = c * (bti + (m2r * ei + m2i * er))
    const q = 0.25 * (betaR * betaR + betaI * betaI)
    const den = 1.0 / (1.0 + q)
    const a = 1.0 - q
    const nur = (a * ur - betaR * vi - betaI * vr) * den
    const nui = (a * ui + betaR * vr - betaI * vi) * den
    const nvr = (a * vr - betaR * ui + betaI * ur) * den
    const nvi = (a * vi + betaR * ur + betaI * ui) * den
    store<f64>(uRe + o, nur)
    store<f64>(uIm + o, nui)
    store<f64>(vRe + o, nvr)
    store<f64>(vIm + o, nvi)
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    store<f64>(bRe + o, Er * sr - Ei * si - hhK * (nui * nvr - nur * nvi))
    store<f64>(bIm + o, Er * si + Ei * sr + hhK * (nur * nvr + nui * nvi))
  }
}

/**
 * One interaction step of a single-channel SVEA grid with nodes 0..nz: the interior with weight 1, then the
 * two facets with weight ½ (the driver's order). c is the model's exchange per unit b.
 */
export function sveaStep(uRe: usize, uIm: usize, vRe: usize, vIm: usize, bRe: usize, bIm: usize, nz: i32, K: f64, c: f64, Er: f64, Ei: f64, h: f64): void {
  exchange(uRe, uIm, vRe, vIm, bRe, bIm, 1, nz - 1, K, 0.5 * c, Er, Ei, h)
  exchange(uRe, uIm, vRe, vIm, bRe, bIm, 0, 0, K, 0.25 * c, Er, Ei, h)
  exchange(uRe, uIm, vRe, vIm, bRe, bIm, nz, nz, K, 0.25 * c, Er, Ei, h)
}

/**
 * Transport along the characteristics (the driver's exact shift): pump one node forward, Stokes one node
 * back, both times the loss per cell when there is loss. memory.copy is an overlapping-safe move.
 */
export function transport(uRe: usize, uIm: usize, vRe: usize, vIm: usize, nz: i32, loss: f64): void {
  const bytes = <usize>nz << 3
  memory.copy(uRe + 8, uRe, bytes)
  memory.copy(uIm + 8, uIm, bytes)
  memory.copy(vRe, vRe + 8, bytes)
  memory.copy(vIm, vIm + 8, bytes)
  if (loss != 1.0) {
    for (let j = 1; j <= nz; j++) {
      const o = <usize>j << 3
      store<f64>(uRe + o, load<f64>(uRe + o) * loss)
      store<f64>(uIm + o, load<f64>(uIm + o) * loss)
    }
    for (let j = 0; j < nz; j++) {
      const o = <usize>j << 3
      store<f64>(vRe + o, load<f64>(vRe + o) * loss)
      store<f64>(vIm + o, load<f64>(vIm + o) * loss)
    }
  }
}

/*
 * The single-channel SVEA step with Kerr phases: `interactSveaKerr` of solver/steppers/svea-kerr-kernel.ts
 * (the general kernel's order, equations there and in solver/steppers/kerr-phase.ts), two nodes at a time:
 *   φ_p = a_pp|u|² + a_ps|v|²,  φ_s = a_sp|u|² + a_ss|v|²  (first half step),  y = Re(b̂)·Im(uv*) − Im(b̂)·Re(uv*),
 *   θ_p = 2φ_p + d_p·y,  θ_s = 2φ_s + d_s·y  (whole step at the midpoint powers),  Δφ = φ_s − φ_p,  q = (·)²/4,
 *   θ ← θ(1 + θ²/12) (the Cayley factor of that turns by θ to O(θ⁵)),
 *   r = 1/(((1 + q_e)(1 + q_r))((1 + q_p)(1 + q_s))),  a = (1 − q_e)(1 + q_r),  β' = β·((1 − q_r) + iΔφ),
 *   u ← ((1 − q_p) + iθ_p)·(1 + q_s)r·(a·u + iβ'·v),  v ← ((1 − q_s) + iθ_s)·(1 + q_p)r·(a·v + iβ'*·u).
 */
/** 1/12, the tangent correction of a Cayley angle (solver/steppers/kerr-phase.ts). */
const TWELFTH: f64 = 1.0 / 12.0

// @ts-ignore: decorator
@inline
function exchangeKerr(uRe: usize, uIm: usize, vRe: usize, vIm: usize, bRe: usize, bIm: usize, j0: i32, j1: i32, weight: f64, K: f64, exchangePerB: f64, Er: f64, Ei: f64, h: f64, kp: f64, ks: f64, kerrHalfPump: f64, kerrHalfStokes: f64): void {
  const hh = 0.5 * h
  const c = exchangePerB * weight
  const fp = kerrHalfPump * weight
  const fs = kerrHalfStokes * weight
  // kerrPhaseCoefficients of solver/steppers/kerr-phase.ts, the same expressions.
  const app = fp * kp
  const aps = 2.0 * fp * ks
  const asp = 2.0 * fs * kp
  const ass = fs * ks
  const dpc = 2.0 * c * (app - aps)
  const dsc = 2.0 * c * (asp - ass)
  const kc = K * c
  stepMean(Er, Ei, h)
  const vKc = f64x2.splat(kc)
  const vM2r = f64x2.splat(m2r)
  const vM2i = f64x2.splat(m2i)
  const vNegK = f64x2.splat(-K)
  const vK = f64x2.splat(K)
  const vH = f64x2.splat(h)
  const vHh = f64x2.splat(hh)
  const vEr = f64x2.splat(Er)
  const vEi = f64x2.splat(Ei)
  const vC = f64x2.splat(c)
  const vApp = f64x2.splat(app)
  const vAps = f64x2.splat(aps)
  const vAsp = f64x2.splat(asp)
  const vAss = f64x2.splat(ass)
  const vDpc = f64x2.splat(dpc)
  const vDsc = f64x2.splat(dsc)
  const vHalf = f64x2.splat(0.5)
  const vTwo = f64x2.splat(2.0)
  const vQuarter = f64x2.splat(0.25)
  const vOne = f64x2.splat(1.0)
  const vTwelfth = f64x2.splat(TWELFTH)
  let j = j0
  for (; j < j1; j += 2) {
    const o = <usize>j << 3
    const ur = v128.load(uRe + o)
    const ui = v128.load(uIm + o)
    const vr = v128.load(vRe + o)
    const vi = v128.load(vIm + o)
    const br = v128.load(bRe + o)
    const bi = v128.load(bIm + o)
    const pr = f64x2.add(f64x2.mul(ur, vr), f64x2.mul(ui, vi))
    const pi = f64x2.sub(f64x2.mul(ui, vr), f64x2.mul(ur, vi))
    const d0r = f64x2.mul(vNegK, pi)
    const d0i = f64x2.mul(vK, pr)
    const tr = f64x2.add(br, f64x2.mul(vH, d0r))
    const ti = f64x2.add(bi, f64x2.mul(vH, d0i))
    const btr = f64x2.mul(vHalf, f64x2.add(br, f64x2.sub(f64x2.mul(vEr, tr), f64x2.mul(vEi, ti))))
    const bti = f64x2.mul(vHalf, f64x2.add(bi, f64x2.add(f64x2.mul(vEr, ti), f64x2.mul(vEi, tr))))
    const uu = f64x2.add(f64x2.mul(ur, ur), f64x2.mul(ui, ui))
    const vv = f64x2.add(f64x2.mul(vr, vr), f64x2.mul(vi, vi))
    const g = f64x2.mul(vKc, f64x2.sub(f64x2.sub(uu, f64x2.mul(vr, vr)), f64x2.mul(vi, vi)))
    const er = f64x2.mul(g, btr)
    const ei = f64x2.mul(g, bti)
    const bbr = f64x2.add(btr, f64x2.sub(f64x2.mul(vM2r, er), f64x2.mul(vM2i, ei)))
    const bbi = f64x2.add(bti, f64x2.add(f64x2.mul(vM2r, ei), f64x2.mul(vM2i, er)))
    // Kerr phases: the first half step's from the entry powers, the whole step's at the midpoint powers.
    const phiP = f64x2.add(f64x2.mul(vApp, uu), f64x2.mul(vAps, vv))
    const phiS = f64x2.add(f64x2.mul(vAsp, uu), f64x2.mul(vAss, vv))
    const y = f64x2.sub(f64x2.mul(btr, pi), f64x2.mul(bti, pr))
    const tp0 = f64x2.add(f64x2.mul(vTwo, phiP), f64x2.mul(vDpc, y))
    const ts0 = f64x2.add(f64x2.mul(vTwo, phiS), f64x2.mul(vDsc, y))
    const tp = f64x2.mul(tp0, f64x2.add(vOne, f64x2.mul(f64x2.mul(vTwelfth, tp0), tp0)))
    const ts = f64x2.mul(ts0, f64x2.add(vOne, f64x2.mul(f64x2.mul(vTwelfth, ts0), ts0)))
    const dphi = f64x2.sub(phiS, phiP)
    const qr = f64x2.mul(f64x2.mul(vQuarter, dphi), dphi)
    const qp = f64x2.mul(f64x2.mul(vQuarter, tp), tp)
    const qs = f64x2.mul(f64x2.mul(vQuarter, ts), ts)
    const dp = f64x2.add(vOne, qp)
    const ds = f64x2.add(vOne, qs)
    const betaR = f64x2.mul(vC, bbr)
    const betaI = f64x2.mul(vC, bbi)
    const qe = f64x2.mul(vQuarter, f64x2.add(f64x2.mul(betaR, betaR), f64x2.mul(betaI, betaI)))
    const dr = f64x2.add(vOne, qr)
    const r = f64x2.div(vOne, f64x2.mul(f64x2.mul(f64x2.add(vOne, qe), dr), f64x2.mul(dp, ds)))
    // The exchange in the first half step's frame (numerators), then the whole step's rotations over r.
    const a = f64x2.mul(f64x2.sub(vOne, qe), dr)
    const cr0 = f64x2.sub(vOne, qr)
    const xr = f64x2.sub(f64x2.mul(betaR, cr0), f64x2.mul(betaI, dphi))
    const xi = f64x2.add(f64x2.mul(betaR, dphi), f64x2.mul(betaI, cr0))
    const eur = f64x2.sub(f64x2.sub(f64x2.mul(a, ur), f64x2.mul(xr, vi)), f64x2.mul(xi, vr))
    const eui = f64x2.sub(f64x2.add(f64x2.mul(a, ui), f64x2.mul(xr, vr)), f64x2.mul(xi, vi))
    const evr = f64x2.add(f64x2.sub(f64x2.mul(a, vr), f64x2.mul(xr, ui)), f64x2.mul(xi, ur))
    const evi = f64x2.add(f64x2.add(f64x2.mul(a, vi), f64x2.mul(xr, ur)), f64x2.mul(xi, ui))
    const rp = f64x2.mul(ds, r)
    const rs = f64x2.mul(dp, r)
    let cr = f64x2.mul(f64x2.sub(vOne, qp), rp)
    let ci = f64x2.mul(tp, rp)
    const nur = f64x2.sub(f64x2.mul(cr, eur), f64x2.mul(ci, eui))
    const nui = f64x2.add(f64x2.mul(cr, eui), f64x2.mul(ci, eur))
    cr = f64x2.mul(f64x2.sub(vOne, qs), rs)
    ci = f64x2.mul(ts, rs)
    const nvr = f64x2.sub(f64x2.mul(cr, evr), f64x2.mul(ci, evi))
    const nvi = f64x2.add(f64x2.mul(cr, evi), f64x2.mul(ci, evr))
    v128.store(uRe + o, nur)
    v128.store(uIm + o, nui)
    v128.store(vRe + o, nvr)
    v128.store(vIm + o, nvi)
    // Corrector: b ← E(b + h/2·D0) + h/2·D1.
    const d1r = f64x2.mul(vNegK, f64x2.sub(f64x2.mul(nui, nvr), f64x2.mul(nur, nvi)))
    const d1i = f64x2.mul(vK, f64x2.add(f64x2.mul(nur, nvr), f64x2.mul(nui, nvi)))
    const sr = f64x2.add(br, f64x2.mul(vHh, d0r))
    const si = f64x2.add(bi, f64x2.mul(vHh, d0i))
    v128.store(bRe + o, f64x2.add(f64x2.sub(f64x2.mul(vEr, sr), f64x2.mul(vEi, si)), f64x2.mul(vHh, d1r)))
    v128.store(bIm + o, f64x2.add(f64x2.add(f64x2.mul(vEr, si), f64x2.mul(vEi, sr)), f64x2.mul(vHh, d1i)))
  }
  for (; j <= j1; j++) {
    const o = <usize>j << 3
    const ur = load<f64>(uRe + o)
    const ui = load<f64>(uIm + o)
    const vr = load<f64>(vRe + o)
    const vi = load<f64>(vIm + o)
    const br = load<f64>(bRe + o)
    const bi = load<f64>(bIm + o)
    const pr = ur * vr + ui * vi
    const pi = ui * vr - ur * vi
    const d0r = -K * pi
    const d0i = K * pr
    const tr = br + h * d0r
    const ti = bi + h * d0i
    const btr = 0.5 * (br + (Er * tr - Ei * ti))
    const bti = 0.5 * (bi + (Er * ti + Ei * tr))
    const uu = ur * ur + ui * ui
    const vv = vr * vr + vi * vi
    const g = kc * (uu - vr * vr - vi * vi)
    const er = g * btr
    const ei = g * bti
    const bbr = btr + (m2r * er - m2i * ei)
    const bbi = bti + (m2r * ei + m2i * er)
    const phiP = app * uu + aps * vv
    const phiS = asp * uu + ass * vv
    const y = btr * pi - bti * pr
    const tp0 = 2.0 * phiP + dpc * y
    const ts0 = 2.0 * phiS + dsc * y
    const tp = tp0 * (1.0 + TWELFTH * tp0 * tp0)
    const ts = ts0 * (1.0 + TWELFTH * ts0 * ts0)
    const dphi = phiS - phiP
    const qr = 0.25 * dphi * dphi
    const qp = 0.25 * tp * tp
    const qs = 0.25 * ts * ts
    const dp = 1.0 + qp
    const ds = 1.0 + qs
    const betaR = c * bbr
    const betaI = c * bbi
    const qe = 0.25 * (betaR * betaR + betaI * betaI)
    const dr = 1.0 + qr
    const r = 1.0 / (((1.0 + qe) * dr) * (dp * ds))
    const a = (1.0 - qe) * dr
    const cr0 = 1.0 - qr
    const xr = betaR * cr0 - betaI * dphi
    const xi = betaR * dphi + betaI * cr0
    const eur = a * ur - xr * vi - xi * vr
    const eui = a * ui + xr * vr - xi * vi
    const evr = a * vr - xr * ui + xi * ur
    const evi = a * vi + xr * ur + xi * ui
    const rp = ds * r
    const rs = dp * r
    let cr = (1.0 - qp) * rp
    let ci = tp * rp
    const nur = cr * eur - ci * eui
    const nui = cr * eui + ci * eur
    cr = (1.0 - qs) * rs
    ci = ts * rs
    const nvr = cr * evr - ci * evi
    const nvi = cr * evi + ci * evr
    store<f64>(uRe + o, nur)
    store<f64>(uIm + o, nui)
    store<f64>(vRe + o, nvr)
    store<f64>(vIm + o, nvi)
    const d1r = -K * (nui * nvr - nur * nvi)
    const d1i = K * (nur * nvr + nui * nvi)
    const sr = br + hh * d0r
    const si = bi + hh * d0i
    store<f64>(bRe + o, Er * sr - Ei * si + hh * d1r)
    store<f64>(bIm + o, Er * si + Ei * sr + hh * d1i)
  }
}

/** One interaction step of a single-channel SVEA grid with Kerr phases, nodes 0..nz (facets weight ½). */
export function sveaKerrStep(uRe: usize, uIm: usize, vRe: usize, vIm: usize, bRe: usize, bIm: usize, nz: i32, K: f64, exchangePerB: f64, Er: f64, Ei: f64, h: f64, kp: f64, ks: f64, kerrHalfPump: f64, kerrHalfStokes: f64): void {
  exchangeKerr(uRe, uIm, vRe, vIm, bRe, bIm, 0, 0, 0.5, K, exchangePerB, Er, Ei, h, kp, ks, kerrHalfPump, kerrHalfStokes)
  exchangeKerr(uRe, uIm, vRe, vIm, bRe, bIm, 1, nz - 1, 1.0, K, exchangePerB, Er, Ei, h, kp, ks, kerrHalfPump, kerrHalfStokes)
  exchangeKerr(uRe, uIm, vRe, vIm, bRe, bIm, nz, nz, 0.5, K, exchangePerB, Er, Ei, h, kp, ks, kerrHalfPump, kerrHalfStokes)
}

/**
 * The plain SVEA step on nodes j0..j1 with one weight (cHalf = c·weight/2): the threaded engine's block of z.
 * Each node's arithmetic depends on that node alone and each lane is correctly rounded, so any split of the
 * nodes into blocks, odd or even, gives the bits of `sveaStep`.
 */
export function sveaBlock(uRe: usize, uIm: usize, vRe: usize, vIm: usize, bRe: usize, bIm: usize, j0: i32, j1: i32, K: f64, cHalf: f64, Er: f64, Ei: f64, h: f64): void {
  exchange(uRe, uIm, vRe, vIm, bRe, bIm, j0, j1, K, cHalf, Er, Ei, h)
}
