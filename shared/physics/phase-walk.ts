/*
 * The random phase W(s) of a broadband source of Lorentzian linewidth Δν: a Wiener process with
 * ⟨[W(s + τ) − W(s)]²⟩ = 2πΔν|τ| and W(0) = 0, on nodes s_k = k·h (docs/model.md, modulated and broadband
 * sources), read between nodes by linear interpolation.
 *
 * Nodes k ≥ 0 are a forward walk W_{k+1} = W_k + σ·N(0,1), σ² = 2πΔν·h, from the seed's first stream. A port
 * whose phase is delayed by t_d reads W(t − t_d) from s = −t_d on, so nodes k < 0 may be needed: they come from
 * a second stream, exactly as a walk seen backward from W_0 = 0, drawn in increasing k without storing them:
 * the farthest node W_K (K < 0) is N(0, σ²|K|), and each next one follows the Brownian bridge to W_0 = 0,
 * W_{k+1} = W_k·(m − 1)/m + σ√((m − 1)/m)·N(0,1) with m = −k the steps left (a standard bridge construction,
 * e.g. Glasserman, Monte Carlo Methods in Financial Engineering, §3.1). Nodes depend only on the seed, h and
 * the first node read, so every grid reading the same source from t = 0 sees the same realisation.
 */
import { SeededNormal } from './seeded-normal'

/** Mixed into the seed for the stream of the nodes before s = 0 (any fixed odd constant). */
const BACKWARD_STREAM = 0x5bd1e995

export class PhaseWalk {
  private readonly forward: SeededNormal
  private readonly backward: SeededNormal
  private readonly sigma: number
  /** Left node of the interval last read, its value and the right node's value. */
  private k: number
  private wK: number
  private wNext: number

  /** hNs: node spacing; variancePerStep: σ² (rad²); firstNs: the first (smallest) s that will be read. */
  constructor(seed: number, private readonly hNs: number, variancePerStep: number, firstNs: number) {
    this.forward = new SeededNormal(seed)
    this.backward = new SeededNormal(seed ^ BACKWARD_STREAM)
    this.sigma = Math.sqrt(variancePerStep)
    this.k = Math.min(0, Math.floor(firstNs / hNs))
    this.wK = this.k < 0 ? this.sigma * Math.sqrt(-this.k) * this.backward.normal() : 0
    this.wNext = this.after(this.k, this.wK)
  }

  /** W at node k + 1 given W at node k. */
  private after(k: number, wk: number): number {
    if (k >= 0) return wk + this.sigma * this.forward.normal()
    const m = -k
    if (m === 1) return 0
    const f = (m - 1) / m
    return wk * f + this.sigma * Math.sqrt(f) * this.backward.normal()
  }

  /** W at sNs, not below the previous call's s (rad). */
  at(sNs: number): number {
    const pos = sNs / this.hNs
    while (pos >= this.k + 1) {
      this.wK = this.wNext
      this.wNext = this.after(this.k + 1, this.wK)
      this.k++
    }
    return this.wK + (pos - this.k) * (this.wNext - this.wK)
  }
}
