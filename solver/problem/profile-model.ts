/*
 * Per-node constants of a waveguide with a longitudinal profile (docs/model.md, longitudinal profiles).
 * Locally the equations are those of coupled-modes.ts with Ω_B(z), Γ_B(z), G_B(z), α(z):
 *
 *   Δ_j = (ω_p − ω_s) − Ω_B(z_j) = Δ − 2π δν_j
 *   E_j = exp(−(Γ_j/2 − iΔ_j)Δt)                      acoustic integrating factor at node j
 *   κ_j = ½√(G_j Γ_j),  f_j = κ_j/κ                    local coupling relative to the waveguide's own
 *
 * The scaled fields keep the waveguide's own κ (u = A_p/√κ_p, v = A_s/√κ), so the ports read out exactly as
 * without a profile; a local κ_j enters as f_j on both the exchange (β_j = f_j·β) and the drive (K_j = f_j·K).
 * Loss acts per cell, e^{−α_c Δz/2} with α_c the loss over the cell (mean of its factors where an edge cuts it). Every per-node value equals the
 * uniform one bit for bit where the profile changes nothing, so a uniform profile reproduces the plain run.
 */
import type { GridChoice } from '@shared/physics/grid-step'
import { segmentAt, segmentShiftMHz } from '@shared/physics/longitudinal-profile'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { dbPerMToPerM, mhzToHz, um2ToM2 } from '@shared/physics/units'
import { sveaPropagator } from '../steppers/acoustic-propagator'
import type { Model } from './coupled-modes'

export interface ProfileArrays {
  /** Exchange constant per node with its trapezoid weight: β_j = cHalf[j]·(b + b̃). */
  cHalf: Float64Array
  /** Drive constant per node: D = i·K[j]·u·v*. */
  K: Float64Array
  /** Acoustic factor E_j per node. */
  eRe: Float64Array
  eIm: Float64Array
  /** Amplitude loss over the cell between nodes j−1 and j, at index j (index 0 unused). */
  lossCell: Float64Array
  /** Local shift change δν_j per node (MHz), for read-outs. */
  shiftMHz: Float64Array
}

/** The per-node arrays, or null when the waveguide carries no profile (the uniform kernels then run). */
export function buildProfileModel(config: SimulationConfig, grid: GridChoice, m: Model): ProfileArrays | null {
  const wg = config.waveguide
  const profile = wg.profile
  if (!profile || profile.segments.length === 0) return null
  const nodes = m.nodes
  const nz = m.nz
  const r = m.rates
  const c = m.exchangePerB
  const out: ProfileArrays = {
    cHalf: new Float64Array(nodes),
    K: new Float64Array(nodes),
    eRe: new Float64Array(nodes),
    eIm: new Float64Array(nodes),
    lossCell: new Float64Array(nodes),
    shiftMHz: new Float64Array(nodes),
  }
  const local = (zM: number): Local => {
    const seg = segmentAt(profile, zM)
    if (!seg) return { fSq: 1, gammaB: r.gammaBPerS, detuning: r.detuningRadPerS, shiftMHz: 0, lossPerCell: m.lossPerCell }
    // Same expressions as brillouinRates and buildModel, so unchanged values come out identical.
    const gammaB = seg.linewidthMHz === undefined ? r.gammaBPerS : 2 * Math.PI * mhzToHz(seg.linewidthMHz)
    const gain = seg.gainCoefficientMPerW === undefined ? r.gainPerWM : (wg.polarisationFactor * seg.gainCoefficientMPerW) / um2ToM2(wg.effectiveAreaUm2)
    const f = seg.linewidthMHz === undefined && seg.gainCoefficientMPerW === undefined ? 1 : (0.5 * Math.sqrt(gain * gammaB)) / r.kappa
    const shiftMHz = segmentShiftMHz(seg)
    const lossPerCell = seg.lossDbPerM === undefined ? m.lossPerCell : Math.exp(-0.5 * dbPerMToPerM(seg.lossDbPerM) * grid.dzM)
    return { fSq: f * f, gammaB, detuning: r.detuningRadPerS - 2 * Math.PI * mhzToHz(shiftMHz), shiftMHz, lossPerCell }
  }
  for (let j = 0; j < nodes; j++) {
    // A node stands for its control volume (half a cell inside the guide at a facet); where a segment edge
    // cuts it, the node takes the volume's mean (the gain G_B ∝ f² integrates exactly).
    const v = volumeMean(local, Math.max(0, (j - 0.5) * grid.dzM), Math.min(wg.lengthM, (j + 0.5) * grid.dzM))
    const weight = j === 0 || j === nz ? 0.25 : 0.5
    const f = v.fSq === 1 ? 1 : Math.sqrt(v.fSq)
    out.cHalf[j] = weight * c * f
    out.K[j] = m.driveK * f
    const e = sveaPropagator(v.gammaB, v.detuning, m.dtS)
    out.eRe[j] = e.eRe
    out.eIm[j] = e.eIm
    out.shiftMHz[j] = v.shiftMHz
    if (j > 0) out.lossCell[j] = volumeMean(local, (j - 1) * grid.dzM, j * grid.dzM).lossPerCell
  }
  return out
}

interface Local {
  fSq: number
  gammaB: number
  detuning: number
  shiftMHz: number
  lossPerCell: number
}

const SUBSAMPLES = 8

/** Mean of the local values over [a, b] from SUBSAMPLES midpoints; the value itself where they all agree (no rounding). */
function volumeMean(local: (zM: number) => Local, a: number, b: number): Local {
  const samples = Array.from({ length: SUBSAMPLES }, (_, k) => local(a + ((k + 0.5) * (b - a)) / SUBSAMPLES))
  const keys = ['fSq', 'gammaB', 'detuning', 'shiftMHz', 'lossPerCell'] as const
  const out = { ...samples[0] }
  for (const key of keys) {
    if (samples.every((x) => x[key] === samples[0][key])) continue
    out[key] = samples.reduce((acc, x) => acc + x[key], 0) / SUBSAMPLES
  }
  return out
}
