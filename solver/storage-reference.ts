// The companion run that separates read-out from leak-through in storage runs. It is the same run
// without the read pulses, forked from the main run just before the first of them starts to enter:
// up to that step both runs are identical, so only the rest is integrated twice. The read pulse is the
// only difference, and (the data being weak) everything the data pulse causes is linear in its field, so
//     retrieved field  = A_p,out(with read) − A_p,out(without read)
//     leak-through     = A_p,out(without read)   (data light that reaches the output unstored)
// inside the read-out window.
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { storageForkStep, storageReferenceStartNs, storageRoles } from '@shared/physics/pulse-roles'

export interface ReferencePlan {
  /** The configuration without the read pulses that define each channel's retrieval. */
  config: SimulationConfig
  /** Time index at which the reference is forked from the main run. */
  forkN: number
}

export function planStorageReference(config: SimulationConfig, dtS: number): ReferencePlan | null {
  const startNs = storageReferenceStartNs(config)
  if (startNs === null) return null
  const channels = config.channels.map((ch) => {
    const roles = storageRoles(ch)
    return roles ? { ...ch, stokes: { ...ch.stokes, pulses: ch.stokes.pulses.filter((_, i) => i !== roles.readIndex) } } : ch
  })
  return { config: { ...config, channels }, forkN: storageForkStep(startNs, dtS) }
}
