/*
 * An independent reference for the time-of-flight step response: the small-signal, undepleted-pump limit of the
 * coupled-mode equations (docs/model.md), integrated directly instead of stepped. A phonon at z is driven by the
 * pump passing it and decays at the amplitude rate Γ_A = πΔν_B, detuned by δ(z) = ν − ν_B(z):
 *
 *   R_δ(u) = ∫₀^∞ e^{−(Γ_A + 2πiδ)x} A(u − x) dx            (A = √(P/P_peak), u the pump's own time)
 *
 * and a probe slice that met pump time u at z' = z − v_g(u − t₀)/2 gains ∝ A(u)·Re R_{δ(z')}(u), so the log gain
 * read at position z is g(z, ν) ∝ ∫ A(u)·Re R_{ν − ν_B(z'(u))}(u) du (Agrawal, Nonlinear Fiber Optics, ch. 9, for
 * the equations; the undepleted small-signal limit is common practice). A shift step of s at z = 0 gives two
 * local detunings, so R is computed once for each by the recursion R(u + du) = R(u)·e^{−(Γ_A + 2πiδ)du} + A(u)du.
 * Each position's spectrum is then fitted like the map's (lorentzian-fit.ts) and the 10–90 % width taken.
 */
import { fitLorentzian } from '@shared/analysis/lorentzian-fit'
import { pulseAmplitude } from '@shared/physics/pulse-envelope'
import type { Pulse } from '@shared/physics/pulse'

export interface StepReferenceSetup {
  pulse: Pulse
  groupIndex: number
  linewidthMHz: number
  stepMHz: number
  detuningsMHz: number[]
}

/** 10–90 % width (m) of the fitted shift across a shift step, in the undepleted small-signal limit. */
export function referenceStepWidthM(s: StepReferenceSetup): number {
  if (s.pulse.shape === 'sampled') throw new Error('The reference takes pulses of stated width')
  const vg = 0.299792458 / s.groupIndex
  const p = { ...s.pulse, centreNs: 0 }
  const reach = 4 * (p.shape === 'rectangular' ? p.fwhmNs / 2 + 4 * p.riseNs : p.fwhmNs)
  const gammaA = Math.PI * s.linewidthMHz * 1e-3
  // Steps fine against the pulse's shortest feature and against the phonon lifetime 1/Γ_A.
  const du = Math.min(Math.min(p.fwhmNs, p.shape === 'rectangular' ? p.riseNs : Infinity) / 40, 0.05 / gammaA)
  const u: number[] = []
  for (let t = -reach; t <= reach; t += du) u.push(t)
  const a = u.map((t) => pulseAmplitude(p, t))
  /** Re R_δ(u) on the u grid (δ in MHz). */
  const phonon = (detuningMHz: number): Float64Array => {
    const w = 2 * Math.PI * detuningMHz * 1e-3
    const decay = Math.exp(-gammaA * du)
    const c = decay * Math.cos(w * du)
    const sn = -decay * Math.sin(w * du)
    let re = 0
    let im = 0
    const out = new Float64Array(u.length)
    for (let i = 0; i < u.length; i++) {
      ;[re, im] = [re * c - im * sn + a[i] * du, re * sn + im * c]
      out[i] = re
    }
    return out
  }
  const halfSpanM = (vg * reach) / 2
  const zs: number[] = []
  for (let z = -halfSpanM; z <= halfSpanM; z += halfSpanM / 200) zs.push(z)
  const before = s.detuningsMHz.map((d) => phonon(d))
  const after = s.detuningsMHz.map((d) => phonon(d - s.stepMHz))
  const ratio = zs.map((z) => {
    const row = s.detuningsMHz.map((_, k) => {
      let g = 0
      for (let i = 0; i < u.length; i++) g += a[i] * (z - (vg * u[i]) / 2 >= 0 ? after[k][i] : before[k][i])
      return g * du
    })
    const f = fitLorentzian(s.detuningsMHz, row, s.linewidthMHz / 2)
    return f ? f.centre / s.stepMHz : NaN
  })
  const crossing = (level: number): number => {
    for (let i = 1; i < ratio.length; i++) if (ratio[i - 1] < level && ratio[i] >= level) return zs[i - 1] + ((level - ratio[i - 1]) / (ratio[i] - ratio[i - 1])) * (zs[i] - zs[i - 1])
    return NaN
  }
  return crossing(0.9) - crossing(0.1)
}
