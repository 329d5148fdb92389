// Input power traces for the preview chart, sampled the way the solver launches them: the background adds
// coherently with phase 0 and each pulse carries e^{i(φ − 2πδ(t − t₀))} (see the solver's input sampler).
import { Pulse } from '@shared/pulse'
import { pulseAmplitude } from '@shared/pulse-envelope'
import type { PortDraft } from './pulse-drafts'

/** Enough points to show a 200 ps pulse in a 10 ns window; the preview is a sketch, not the solver grid. */
export const PREVIEW_SAMPLES = 1200

/** [t (ns), P (W)] pairs of one port over [0, windowNs]; pulses that do not parse yet are left out. */
export function samplePortPower(port: PortDraft, windowNs: number, samples = PREVIEW_SAMPLES): [number, number][] {
  const pulses = (port.pulses ?? []).map((p) => Pulse.safeParse(p)).flatMap((r) => (r.success ? [r.data] : []))
  const bg = Math.sqrt(Math.max(0, Number(port.backgroundPowerW ?? 0)) || 0)
  const out: [number, number][] = []
  for (let n = 0; n <= samples; n++) {
    const t = (n / samples) * windowNs
    let re = bg
    let im = 0
    for (const p of pulses) {
      const a = Math.sqrt(p.peakPowerW) * pulseAmplitude(p, t)
      if (a === 0) continue
      const ph = p.phaseRad - 2 * Math.PI * p.frequencyOffsetMHz * 1e-3 * (t - p.centreNs)
      re += a * Math.cos(ph)
      im += a * Math.sin(ph)
    }
    out.push([t, re * re + im * im])
  }
  return out
}
