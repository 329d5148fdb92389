// Measures of one port trace (interleaved complex, √W), sample n at t_n = n·Δt: energy Σ|A(t_n)|²·Δt (the
// sum the photon bookkeeping is exact in), power centroid, power FWHM and peak. The energy inside a window
// [t_a, t_b] that cuts through light integrates the power's linear interpolant instead (trapezoid rule, with
// the partial cells at both ends), whose error is O(Δt²); counting the end samples in full would be O(Δt).

export const power = (a: Float64Array, n: number) => a[2 * n] * a[2 * n] + a[2 * n + 1] * a[2 * n + 1]

export function energyJ(a: Float64Array, dtS: number, n0 = 0, n1 = a.length / 2 - 1): number {
  let e = 0
  for (let n = Math.max(0, n0); n <= Math.min(a.length / 2 - 1, n1); n++) e += power(a, n)
  return e * dtS
}

/** ∫ P dt over [startS, endS] ∩ [0, t_{N−1}] with P linearly interpolated between samples (trapezoid rule). */
export function windowEnergyJ(a: Float64Array, dtS: number, startS: number, endS: number): number {
  const N = a.length / 2
  const t0 = Math.max(0, startS), t1 = Math.min((N - 1) * dtS, endS)
  if (!(t1 > t0) || N < 2) return 0
  const at = (t: number) => {
    const x = t / dtS
    const n = Math.min(N - 2, Math.max(0, Math.floor(x)))
    const f = x - n
    return (1 - f) * power(a, n) + f * power(a, n + 1)
  }
  const n0 = Math.ceil(t0 / dtS - 1e-9), n1 = Math.floor(t1 / dtS + 1e-9)
  if (n0 > n1) return ((t1 - t0) * (at(t0) + at(t1))) / 2
  let e = 0
  for (let n = n0; n < n1; n++) e += ((power(a, n) + power(a, n + 1)) / 2) * dtS
  e += (Math.max(0, n0 * dtS - t0) * (at(t0) + power(a, n0))) / 2
  e += (Math.max(0, t1 - n1 * dtS) * (power(a, n1) + at(t1))) / 2
  return e
}

/** Energy of the difference field a − b over [n0, n1]. */
export function differenceEnergyJ(a: Float64Array, b: Float64Array, dtS: number, n0: number, n1: number): number {
  let e = 0
  for (let n = Math.max(0, n0); n <= Math.min(a.length / 2 - 1, n1); n++) {
    const re = a[2 * n] - b[2 * n], im = a[2 * n + 1] - b[2 * n + 1]
    e += re * re + im * im
  }
  return e * dtS
}

export function centroidS(a: Float64Array, dtS: number): number | null {
  let w = 0, s = 0
  for (let n = 0; n < a.length / 2; n++) {
    const p = power(a, n)
    w += p
    s += p * n
  }
  return w > 0 ? (s / w) * dtS : null
}

/** Power FWHM around the global maximum, linearly interpolated; null if the pulse is cut by the window. */
export function fwhmS(a: Float64Array, dtS: number): number | null {
  const N = a.length / 2
  let iMax = 0, pMax = 0
  for (let n = 0; n < N; n++) if (power(a, n) > pMax) (pMax = power(a, n)), (iMax = n)
  if (pMax <= 0) return null
  const half = pMax / 2
  let l = iMax
  while (l > 0 && power(a, l) > half) l--
  let r = iMax
  while (r < N - 1 && power(a, r) > half) r++
  if (power(a, l) > half || power(a, r) > half) return null
  const tl = l + (half - power(a, l)) / (power(a, l + 1) - power(a, l))
  const tr = r - (half - power(a, r)) / (power(a, r - 1) - power(a, r))
  return (tr - tl) * dtS
}

export function maxPower(a: Float64Array): number {
  let m = 0
  for (let n = 0; n < a.length / 2; n++) m = Math.max(m, power(a, n))
  return m
}

/** Sample indices [n0, n1] covering [startNs, endNs]. */
export const windowIndices = (startNs: number, endNs: number, dtS: number): [number, number] => [
  Math.ceil((startNs * 1e-9) / dtS - 1e-9),
  Math.floor((endNs * 1e-9) / dtS + 1e-9),
]

/** Cut-off rule: an output pulse is cut by the run's end when, there, P_end/P_peak or E_beyond/E exceeds this. */
export const CUT_PULSE_RATIO = 1e-3
/** The window suggested for a cut pulse leaves P_end/P_peak and E_beyond/E a decade under the rule. */
const SUGGEST_RATIO = 1e-4

/**
 * How much of a pulse lies beyond the end of the trace. The tail is extrapolated as the exponential through the
 * last ~1 ns, P(t) = P_end·e^{−λ(t−t_end)} (a pulse broadened by the Brillouin response decays as e^{−Γ_B t};
 * a Gaussian falls faster, so this overestimates, on the safe side): E_beyond = P_end/λ. The end that brings
 * both ratios to SUGGEST_RATIO is t_end + ln(P_end/(ratio·min(P_peak, λE)))/λ. A tail that is not falling
 * (λ ≤ 0) gets the end that mirrors the rising edge about the peak.
 */
export function tailBeyondEnd(a: Float64Array, dtS: number): { powerRatio: number; energyRatio: number; neededEndS: number } {
  const N = a.length / 2
  const endS = (N - 1) * dtS
  const peak = maxPower(a), E = energyJ(a, dtS), pEnd = power(a, N - 1)
  if (!(peak > 0) || N < 3) return { powerRatio: 0, energyRatio: 0, neededEndS: endS }
  const m = Math.min(N - 2, Math.max(1, Math.round(1e-9 / dtS)))
  const pBack = power(a, N - 1 - m)
  const lambdaPerS = pEnd > 0 && pBack > 0 ? Math.log(pBack / pEnd) / (m * dtS) : pEnd > 0 ? 0 : Infinity
  const powerRatio = pEnd / peak
  if (!(lambdaPerS > 0)) {
    let iPeak = 0
    while (power(a, iPeak) < peak) iPeak++
    let iRise = 0
    while (power(a, iRise) < SUGGEST_RATIO * peak) iRise++
    return { powerRatio, energyRatio: Infinity, neededEndS: Math.max(2 * iPeak - iRise, 1.5 * (N - 1)) * dtS }
  }
  const energyRatio = pEnd / lambdaPerS / E
  const extraS = Math.log(pEnd / (SUGGEST_RATIO * Math.min(peak, lambdaPerS * E))) / lambdaPerS
  return { powerRatio, energyRatio, neededEndS: endS + Math.max(0, extraS) }
}
