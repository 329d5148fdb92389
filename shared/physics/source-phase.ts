/*
 * Phase a source adds to the sampled envelope of a port (docs/model.md, modulated and broadband sources):
 *
 *   A(t) = A₀(t) · exp[i β sin(2π f_m (t − t_d))] · exp[i φ(t)],   β = Δf/f_m,
 *
 * the first factor a sinusoidal frequency modulation (its spectrum is the Jacobi–Anger series
 * Σ J_n(β) e^{i n 2π f_m t}, Abramowitz & Stegun 9.1.41), the second the phase of a source of Lorentzian
 * linewidth Δν: a random walk φ_{k+1} = φ_k + √(2πΔν·h)·N(0,1), so ⟨[φ(t+τ) − φ(t)]²⟩ = 2πΔν|τ| and the
 * field's power spectrum is a Lorentzian of FWHM Δν (common practice: the Wiener phase-noise model of a laser),
 * read with the source's delay, φ(t) = W(t − t_d) (phase-walk.ts).
 *
 * The walk runs on its own step h = WALK_PHASE_VARIANCE/(2πΔν), fixed by the linewidth alone, and is read at
 * the sample times by linear interpolation: every grid (the solver's, its error-estimate companion at 2Δt, the
 * form's preview) sees the same realisation of the seed, bit for bit.
 */
import { PhaseWalk } from './phase-walk'
import type { BroadbandSource, FrequencyModulation } from './source-modulation'

/**
 * Phase variance per walk step (rad²). Linear interpolation between walk nodes loses the Brownian-bridge
 * variance, on average h/3 of diffusion time per phase difference; at 1e-3 rad² per walk step that is 0.7 % of
 * the diffusion over the automatic grid's step (0.05 rad², source-grid-rules.ts) and less over longer lags.
 */
export const WALK_PHASE_VARIANCE = 1e-3

/** Phase of the frequency modulation at time tNs at the input facet (rad). */
export function modulationPhase(m: FrequencyModulation, tNs: number): number {
  const wm = 2 * Math.PI * m.rateMHz * 1e-3 // rad/ns
  return (m.excursionMHz / m.rateMHz) * Math.sin(wm * (tNs - m.delayNs))
}

/** Walk step h (ns) for a linewidth. */
export function walkStepNs(b: BroadbandSource): number {
  return WALK_PHASE_VARIANCE / (2 * Math.PI * b.linewidthMHz * 1e-3)
}

/** The walk W of a broadband source, started where its port first reads it: φ(t) = W(t − t_d) from t = 0 on. */
export function sourcePhaseWalk(b: BroadbandSource): PhaseWalk {
  return new PhaseWalk(b.seed, walkStepNs(b), WALK_PHASE_VARIANCE, -b.delayNs)
}

/** Multiply an interleaved complex trace sampled at t_n = n·Δt by the source's phase factor, in place. */
export function applySourcePhase(trace: Float64Array, dtNs: number, modulation?: FrequencyModulation, broadband?: BroadbandSource): void {
  if (!modulation && !broadband) return
  const walk = broadband ? sourcePhaseWalk(broadband) : null
  const n = trace.length / 2
  for (let i = 0; i < n; i++) {
    const tNs = i * dtNs
    // The walk advances even where the field is zero, so a sample's phase does not depend on the pulses.
    const ph = (modulation ? modulationPhase(modulation, tNs) : 0) + (walk && broadband ? walk.at(tNs - broadband.delayNs) : 0)
    const re = trace[2 * i]
    const im = trace[2 * i + 1]
    if (re === 0 && im === 0) continue
    const c = Math.cos(ph)
    const s = Math.sin(ph)
    trace[2 * i] = re * c - im * s
    trace[2 * i + 1] = re * s + im * c
  }
}
