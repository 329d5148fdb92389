// Run warnings (shared/physics/derived-warnings.ts; docs/model.md, "Not modelled"). Cautions only: the run still goes ahead. The pre-run list is the
// one the form shows (shared/physics/derived-quantities.ts), computed on the solver's own grid, so the page and
// the manifest never disagree.
import { deriveQuantities } from '@shared/physics/derived-quantities'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { FiguresOfMerit, SolverWarning } from '@shared/physics/simulation-result'
import { BACK_REFLECTION_FRACTION, SAFETY_DEFERRAL, describeRatio } from '@shared/physics/laser-safety'
import type { Model } from '../problem/coupled-modes'

const ESTIMATED_BACK_REFLECTION = 'back-reflection'

export function preRunWarnings(config: SimulationConfig, m: Model, nz: number, nt: number): SolverWarning[] {
  const derived = deriveQuantities({ waveguide: config.waveguide, config, grid: { dtS: m.dtS, dzM: m.dzM, nz, nt } })
  // The form can only estimate the returned Stokes light; after the run postRunWarnings measures it.
  return derived.warnings.filter((w) => w.code !== ESTIMATED_BACK_REFLECTION).map(({ code, message }) => ({ code, message }))
}

const PREFIXES: Array<[number, string]> = [[1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f']]
/** Energy with an SI prefix chosen after rounding to 3 digits ("7.95 nJ"). */
function joules(e: number): string {
  const a = Math.abs(Number(e.toPrecision(3)))
  const [f, p] = PREFIXES.find(([f]) => a >= f) ?? PREFIXES[PREFIXES.length - 1]
  return `${Number((e / f).toPrecision(3))} ${p}J`
}

/** Checks that need the outputs: the Stokes light actually returned towards the pump source. */
export function postRunWarnings(f: FiguresOfMerit): SolverWarning[] {
  const out: SolverWarning[] = []
  for (const c of f.channels)
    if (c.energyJ.pumpIn > 0 && c.energyJ.stokesOut > BACK_REFLECTION_FRACTION * c.energyJ.pumpIn)
      out.push({
        code: 'strong-reflection',
        message:
          `Channel ${c.channel + 1}: the Stokes light leaving towards the pump source (${joules(c.energyJ.stokesOut)}) is ${describeRatio(c.energyJ.stokesOut / c.energyJ.pumpIn)} ` +
          `the pump energy launched (${joules(c.energyJ.pumpIn)})${c.scheme === 'storage' ? ', mostly write and read pulses passing through' : ''}; ` +
          `above ${BACK_REFLECTION_FRACTION * 100} % back-reflected light can damage sources (use isolators). ${SAFETY_DEFERRAL}`,
      })
  return out
}
