// The companion run that separates read-out from leak-through in storage runs. It is the same run
// without the read pulses, forked from the main run just before the first of them starts to enter:
// up to that step both runs are identical, so only the rest is integrated twice. The read pulse is the
// only difference, and (the data being weak) everything the data pulse causes is linear in its field, so
//     retrieved field  = A_p,out(with read) − A_p,out(without read)
//     leak-through     = A_p,out(without read)   (data light that reaches the output unstored)
// inside the read-out window.
import type { SimulationConfig } from '@shared/simulation-config'
import { pulseFwhmNs, storageRoles } from '@shared/pulse-roles'

/** A read pulse starts to matter this many FWHM before its centre (Gaussian power there: 2^−36). */
const READ_LEAD_FWHM = 3

export interface ReferencePlan {
  /** The configuration without the read pulses that define each channel's retrieval. */
  config: SimulationConfig
  /** Time index at which the reference is forked from the main run. */
  forkN: number
}

export function planStorageReference(config: SimulationConfig, dtS: number): ReferencePlan | null {
  let startNs = Infinity
  const channels = config.channels.map((ch) => {
    const roles = storageRoles(ch)
    if (!roles) return ch
    const r = roles.read
    const lead = r.shape === 'sampled' ? ((r.powerShape.length - 1) * r.sampleIntervalNs) / 2 : READ_LEAD_FWHM * pulseFwhmNs(r)
    startNs = Math.min(startNs, r.centreNs - lead)
    return { ...ch, stokes: { ...ch.stokes, pulses: ch.stokes.pulses.filter((_, i) => i !== roles.readIndex) } }
  })
  if (!Number.isFinite(startNs)) return null
  return { config: { ...config, channels }, forkN: Math.max(0, Math.floor((startNs * 1e-9) / dtS)) }
}
