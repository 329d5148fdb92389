// Run warnings of the physics brief §5. Cautions only: the run still goes ahead. The pre-run list is the
// one the form shows (shared/derived-quantities.ts), computed on the solver's own grid, so the page and
// the manifest never disagree.
import { deriveQuantities } from '@shared/derived-quantities'
import type { SimulationConfig } from '@shared/simulation-config'
import type { FiguresOfMerit, SolverWarning } from '@shared/simulation-result'
import { BACK_REFLECTION_FRACTION, SAFETY_DEFERRAL } from '@shared/laser-safety'
import type { Model } from '../problem/coupled-modes'

const ESTIMATED_BACK_REFLECTION = 'back-reflection'

export function preRunWarnings(config: SimulationConfig, m: Model, nz: number, nt: number): SolverWarning[] {
  const derived = deriveQuantities({ waveguide: config.waveguide, config, grid: { dtS: m.dtS, dzM: m.dzM, nz, nt } })
  // The form can only estimate the returned Stokes light; after the run postRunWarnings measures it.
  return derived.warnings.filter((w) => w.code !== ESTIMATED_BACK_REFLECTION).map(({ code, message }) => ({ code, message }))
}

/** Checks that need the outputs: the Stokes light actually returned towards the pump source. */
export function postRunWarnings(f: FiguresOfMerit): SolverWarning[] {
  const out: SolverWarning[] = []
  for (const c of f.channels)
    if (c.energyJ.pumpIn > 0 && c.energyJ.stokesOut > BACK_REFLECTION_FRACTION * c.energyJ.pumpIn)
      out.push({
        code: 'strong-reflection',
        message: `Channel ${c.channel + 1}: the Stokes output exceeds ${BACK_REFLECTION_FRACTION * 100} % of the pump; back-reflected light can damage sources (use isolators). ${SAFETY_DEFERRAL}`,
      })
  return out
}
