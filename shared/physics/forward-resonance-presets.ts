// Typical forward (co-propagating) acoustic resonances a user may add to a waveguide with one click. None is
// part of a waveguide preset by default: forward gain depends strongly on the guide's cross-section and its
// coating or suspension, so each is offered with its source and stated as typical, to be checked against the
// user's own measurement. The gain is given as the gain parameter G_F = η_pol g_F/A_eff, which is what the
// papers report; the form turns it into g_F with the waveguide's own A_eff and η_pol.
import type { ForwardResonance } from './resonances'
import type { Waveguide } from './waveguide'

export interface ForwardResonancePreset {
  id: string
  /** What the user picks from. */
  title: string
  /** Published source, shown as the hint; "typical values; check against the paper" where they were recalled rather than read. */
  source: string
  frequencyMHz: number
  linewidthMHz: number
  /** G_F = η_pol g_F/A_eff (1/(W m)). */
  gainParameterPerWM: number
}

export const FORWARD_RESONANCE_PRESETS: readonly ForwardResonancePreset[] = [
  {
    id: 'smf-radial',
    title: 'Standard single-mode fibre: radial acoustic mode near 320 MHz',
    // Frequencies and linewidths: the radial modes of the 125 µm cladding, a few hundred MHz apart by tens of
    // MHz, with linewidths of a few MHz set by the coating (from memory). The gain parameter is an order of
    // magnitude only (from memory): forward gain in standard fibre is thousands of times weaker than backward.
    source:
      'Shelby, Levenson & Bayer 1985, Phys. Rev. B 31, 5244 (radial modes at a few hundred MHz, linewidths of a few MHz; typical values, check against the paper). ' +
      'Gain: order of magnitude only, measure your fibre.',
    frequencyMHz: 320,
    linewidthMHz: 5,
    gainParameterPerWM: 5e-3,
  },
  {
    id: 'silicon-suspended',
    title: 'Suspended silicon waveguide: forward resonance near 4.35 GHz',
    // Kittlaus, Shin & Rakich report forward intra-mode gain of about 1150 1/(W m) at 4.35 GHz with an
    // acoustic quality factor of a few hundred (linewidth ≈ 12 MHz); values from memory.
    source: 'Kittlaus, Shin & Rakich 2016, Nat. Photon. 10, 463 (≈ 4.35 GHz, ≈ 12 MHz, G ≈ 1150 1/(W m); typical values, check against the paper).',
    frequencyMHz: 4350,
    linewidthMHz: 12,
    gainParameterPerWM: 1150,
  },
]

/** The preset as a resonance of this waveguide: g_F = G_F A_eff/η_pol, rounded to 3 digits. */
export function forwardResonanceFor(p: ForwardResonancePreset, w: Pick<Waveguide, 'effectiveAreaUm2' | 'polarisationFactor'>): ForwardResonance {
  const g = (p.gainParameterPerWM * w.effectiveAreaUm2 * 1e-12) / w.polarisationFactor
  return {
    label: p.title.split(':')[0],
    frequencyMHz: p.frequencyMHz,
    linewidthMHz: p.linewidthMHz,
    gainCoefficientMPerW: Number(g.toPrecision(3)),
    antiStokesMismatchPerM: 0,
  }
}
