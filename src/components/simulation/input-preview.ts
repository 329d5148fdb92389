// Input power traces for the preview chart, from the same sampler the solver launches its inputs with.
import { Pulse } from '@shared/physics/pulse'
import { sampleInput } from '@shared/physics/pulse-envelope'
import { BroadbandSource, FrequencyModulation } from '@shared/physics/source-modulation'
import { walkStepNs } from '@shared/physics/source-phase'
import type { PortDraft } from './pulse-drafts'

/** Enough points to show a 200 ps pulse in a 10 ns window; the preview is a sketch, not the solver grid. */
export const PREVIEW_SAMPLES = 1200

/**
 * Beyond this many steps of a broadband source's phase walk the preview leaves the random phase out: it draws
 * power, which a phase factor does not change, and must not stall the form.
 */
const MAX_PREVIEW_WALK_STEPS = 2_000_000

/** [t (ns), P (W)] pairs of one port over [0, windowNs]; pulses that do not parse yet are left out. */
export function samplePortPower(port: PortDraft, windowNs: number, samples = PREVIEW_SAMPLES): [number, number][] {
  const pulses = (port.pulses ?? []).map((p) => Pulse.safeParse(p)).flatMap((r) => (r.success ? [r.data] : []))
  const backgroundPowerW = Math.max(0, Number(port.backgroundPowerW ?? 0)) || 0
  const dtNs = windowNs / samples
  const modulation = FrequencyModulation.safeParse(port.modulation)
  const broadband = BroadbandSource.safeParse(port.broadband)
  const walkFits = broadband.success && (windowNs + Math.abs(broadband.data.delayNs)) / walkStepNs(broadband.data) <= MAX_PREVIEW_WALK_STEPS
  const trace = sampleInput(
    { pulses, backgroundPowerW, modulation: modulation.success ? modulation.data : undefined, broadband: walkFits ? broadband.data : undefined },
    samples,
    dtNs * 1e-9,
  )
  const out: [number, number][] = []
  for (let n = 0; n <= samples; n++) out.push([n * dtNs, trace[2 * n] ** 2 + trace[2 * n + 1] ** 2])
  return out
}
