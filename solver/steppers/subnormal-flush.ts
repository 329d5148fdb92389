/*
 * Flush of field amplitudes far below any physical meaning to exactly zero (docs/numerics.md, "Subnormal flush").
 *
 * Why: behind a pulse the acoustic envelope decays freely, b ← E·b with |E| = e^{−Γ_B Δt/2} per step, and optical
 * fields under loss shrink by e^{−αΔz/2} per cell. Left alone they pass 2.2e-308 into the subnormal doubles, where
 * x86 arithmetic is about a hundred times slower, and near the smallest subnormal x·|E| rounds back to x, so they
 * stay there for ever instead of reaching 0. JavaScript and WebAssembly have no flush-to-zero mode: the time
 * loops call flushTiny on their state every `flushInterval` steps, at a step boundary.
 *
 * Threshold T = 1e-150 (in the state's own units; an optical amplitude of 1e-150 √W carries 1e-300 W).
 *
 * The interval rule. Let d = max over the model's per-step amplitude factors f (acoustic |E| of every field and
 * node, the loss per cell, 1 − C of upwind advection) of −ln f: the fastest free decay, in nepers per step. A value
 * |x| ≥ T kept at a flush is, after N more steps of that decay, |x|·e^{−Nd} ≥ T·e^{−Nd}; it stays normal until the
 * next flush if
 *        T·e^{−N d} ≥ x_min = 2.2250738585072014e-308   ⇔   N ≤ H/d,   H = ln(T/x_min) = 362.9 nepers.
 * We take N = ⌊H/(2d)⌋ (a factor 2 of headroom: the value is still above 1e-229 when the next flush sees it),
 * at least 1 and at most MAX_FLUSH_INTERVAL (a model without decay still clears what the sources leave below T).
 * A value below T at a flush becomes 0, and 0 stays 0 under every linear decay, so no state value that decays
 * freely between two flushes reaches the subnormal range.
 */

/** Amplitudes with |x| below this are set to 0. */
export const FLUSH_THRESHOLD = 1e-150
/** The smallest normal double (2⁻¹⁰²²); nonzero magnitudes below it are subnormal. */
export const SMALLEST_NORMAL = 2.2250738585072014e-308
/** ln(T/x_min): the decay, in nepers, that takes the threshold to the subnormal range. */
export const HEADROOM_NEPERS = Math.log(FLUSH_THRESHOLD / SMALLEST_NORMAL)
/** Longest interval between flushes, in steps (one pass over the state per this many steps costs well under 1 %). */
export const MAX_FLUSH_INTERVAL = 256

/** The fastest decay, −ln f in nepers per step, over per-step amplitude factors (factors ≥ 1 or ≤ 0 do not decay freely). */
export function fastestDecayNepers(factors: Iterable<number>): number {
  let d = 0
  for (const f of factors) if (f > 0 && f < 1) d = Math.max(d, -Math.log(f))
  return d
}

/** Steps between flushes for a fastest decay of `decayNepersPerStep`: ⌊H/(2d)⌋, clamped to 1..MAX_FLUSH_INTERVAL. */
export function flushInterval(decayNepersPerStep: number): number {
  if (!(decayNepersPerStep > 0)) return MAX_FLUSH_INTERVAL
  return Math.max(1, Math.min(MAX_FLUSH_INTERVAL, Math.floor(HEADROOM_NEPERS / (2 * decayNepersPerStep))))
}

/** Sets every nonzero |x| < FLUSH_THRESHOLD of the arrays to +0 (zeros are left as they are, sign included). */
export function flushTiny(arrays: readonly Float64Array[]): void {
  const t = FLUSH_THRESHOLD
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const x = a[i]
      if (x < t && x > -t && x !== 0) a[i] = 0
    }
  }
}

/** One value flushed by the same rule (boundary inputs: a sampled pulse's far tail). */
export function flushValue(x: number): number {
  return x < FLUSH_THRESHOLD && x > -FLUSH_THRESHOLD && x !== 0 ? 0 : x
}
