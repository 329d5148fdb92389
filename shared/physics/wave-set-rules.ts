// Combinations the multi-wave model (shared/physics/wave-set.ts) does not take, refused with the field to change.
import type { SimulationConfig } from './simulation-config'
import { usesWaveNetwork } from './wave-set'

export interface ConfigIssue {
  path: (string | number)[]
  message: string
}

const WHAT = 'A co-propagating probe, further or forward resonances and Stokes cascades'

export function waveSetIssues(c: SimulationConfig): ConfigIssue[] {
  const issues: ConfigIssue[] = []
  const forwardCount = c.waveguide.forwardResonances?.length ?? 0
  c.channels.forEach((ch, ci) => {
    if (ch.forwardInputs.length > forwardCount) {
      issues.push({
        path: ['channels', ci, 'forwardInputs', forwardCount],
        message: `The waveguide has ${forwardCount === 0 ? 'no forward resonance' : `${forwardCount} forward resonance${forwardCount > 1 ? 's' : ''}`}: add one or remove these forward inputs`,
      })
    }
  })
  if (!usesWaveNetwork(c)) return issues
  if (c.channels.length > 1) issues.push({ path: ['channels', 1], message: `${WHAT} work with one channel: remove the other channels or these options` })
  if (c.options.higherOrderAcoustic) issues.push({ path: ['options', 'higherOrderAcoustic'], message: `${WHAT} use the slowly-varying acoustic equation: turn the higher-order acoustic term off` })
  if (c.options.acousticAdvection) issues.push({ path: ['options', 'acousticAdvection'], message: `${WHAT} do not include acoustic advection: turn it off` })
  return issues
}
