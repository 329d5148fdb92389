/*
 * Grid and consistency rules of a longitudinal profile (longitudinal-profile.ts), used by the automatic grid
 * (grid-step.ts) and by the configuration check (simulation-config.ts).
 *
 * A feature of the profile (a segment, or the gap between two neighbouring segments) must span at least two
 * cells, Δz = v_g Δt ≤ length/2: with fewer, a node may miss the feature or the feature's value stands on a
 * single node, and its position and size are wrong by a whole cell. The automatic grid picks Δt so; a step
 * the user sets that breaks the rule is refused, naming the feature and the step it needs.
 */
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'
import type { ProfileSegment } from './longitudinal-profile'
import type { SimulationConfig } from './simulation-config'
import { usesWaveNetwork } from './wave-set'

export const PROFILE_GRID_RULES = {
  /** Cells a profile feature must span. */
  minCellsPerFeature: 2,
} as const

export interface ProfileFeature {
  lengthM: number
  /** For people: "segment 2 (800–802 m)" or "the gap between segments 2 and 3". */
  name: string
  path: (string | number)[]
}

const metres = (m: number) => `${Number(m.toPrecision(6))} m`

/** Segments and the gaps between neighbours, in the order of the list. */
export function profileFeatures(segments: readonly ProfileSegment[]): ProfileFeature[] {
  const out: ProfileFeature[] = []
  const path = (i: number): (string | number)[] => ['waveguide', 'profile', 'segments', i, 'endM']
  segments.forEach((s, i) => {
    out.push({ lengthM: s.endM - s.startM, name: `segment ${i + 1} (${metres(s.startM)} to ${metres(s.endM)})`, path: path(i) })
    const next = segments[i + 1]
    if (next && next.startM > s.endM) out.push({ lengthM: next.startM - s.endM, name: `the gap between segments ${i + 1} and ${i + 2}`, path: ['waveguide', 'profile', 'segments', i + 1, 'startM'] })
  })
  return out
}

/** Largest step (s) that gives every feature two cells, with the feature that sets it; null without a profile. */
export function profileStepBound(config: SimulationConfig): { dtS: number; feature: ProfileFeature } | null {
  const segments = config.waveguide.profile?.segments ?? []
  const vg = SPEED_OF_LIGHT_M_PER_S / config.waveguide.groupIndex
  let best: { dtS: number; feature: ProfileFeature } | null = null
  for (const f of profileFeatures(segments)) {
    const dtS = f.lengthM / (PROFILE_GRID_RULES.minCellsPerFeature * vg)
    if (!best || dtS < best.dtS) best = { dtS, feature: f }
  }
  return best
}

export interface ProfileIssue {
  path: (string | number)[]
  message: string
}

/** What is wrong with the profile of a configuration (empty when nothing is, or there is no profile). */
export function profileIssues(c: SimulationConfig): ProfileIssue[] {
  const segments = c.waveguide.profile?.segments ?? []
  if (segments.length === 0) return []
  const issues: ProfileIssue[] = []
  const at = (i: number, key: string) => ['waveguide', 'profile', 'segments', i, key]
  segments.forEach((s, i) => {
    if (s.endM > c.waveguide.lengthM) issues.push({ path: at(i, 'endM'), message: `Segment ${i + 1} ends beyond the waveguide (length ${metres(c.waveguide.lengthM)})` })
    const prev = segments[i - 1]
    if (prev && s.startM < prev.endM) issues.push({ path: at(i, 'startM'), message: `Segment ${i + 1} must start at or after the end of segment ${i} (${metres(prev.endM)})` })
  })
  // The profile-aware kernel covers the plain pump–Stokes pair in one channel; say so instead of ignoring the profile.
  const o = c.options
  const unsupported: [boolean, (string | number)[], string][] = [
    [c.channels.length > 1, ['channels'], 'one channel'],
    [usesWaveNetwork(c), ['waveguide', 'profile'], 'the plain pump–Stokes pair (no further waves, resonances or cascade orders)'],
    [o.kerr, ['options', 'kerr'], 'the Kerr effect off'],
    [o.noise.enabled, ['options', 'noise', 'enabled'], 'thermal noise off'],
    [o.higherOrderAcoustic, ['options', 'higherOrderAcoustic'], 'the slowly varying acoustic envelope'],
  ]
  for (const [bad, path, need] of unsupported) if (bad) issues.push({ path, message: `A waveguide with a longitudinal profile needs ${need}` })
  if (c.grid.timeStepPs !== undefined) {
    const vg = SPEED_OF_LIGHT_M_PER_S / c.waveguide.groupIndex
    const dzM = vg * c.grid.timeStepPs * 1e-12
    for (const f of profileFeatures(segments)) {
      if (f.lengthM < PROFILE_GRID_RULES.minCellsPerFeature * dzM) {
        const needPs = (f.lengthM / (PROFILE_GRID_RULES.minCellsPerFeature * vg)) * 1e12
        issues.push({
          path: ['grid', 'timeStepPs'],
          message: `The grid is too coarse for ${f.name}: it spans ${(f.lengthM / dzM).toFixed(1)} cells of ${metres(dzM)}; it needs at least ${PROFILE_GRID_RULES.minCellsPerFeature}, a step ≤ ${needPs.toPrecision(3)} ps`,
        })
        break
      }
    }
  }
  return issues
}
