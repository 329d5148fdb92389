// Input power traces for the preview chart, from the same sampler the solver launches its inputs with.
import { Pulse } from '@shared/physics/pulse'
import { sampleInput } from '@shared/physics/pulse-envelope'
import type { PortDraft } from './pulse-drafts'

/** Enough points to show a 200 ps pulse in a 10 ns window; the preview is a sketch, not the solver grid. */
export const PREVIEW_SAMPLES = 1200

/** [t (ns), P (W)] pairs of one port over [0, windowNs]; pulses that do not parse yet are left out. */
export function samplePortPower(port: PortDraft, windowNs: number, samples = PREVIEW_SAMPLES): [number, number][] {
  const pulses = (port.pulses ?? []).map((p) => Pulse.safeParse(p)).flatMap((r) => (r.success ? [r.data] : []))
  const backgroundPowerW = Math.max(0, Number(port.backgroundPowerW ?? 0)) || 0
  const dtNs = windowNs / samples
  const trace = sampleInput({ pulses, backgroundPowerW }, samples, dtNs * 1e-9)
  const out: [number, number][] = []
  for (let n = 0; n <= samples; n++) out.push([n * dtNs, trace[2 * n] ** 2 + trace[2 * n + 1] ** 2])
  return out
}
