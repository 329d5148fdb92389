// How the run page writes the per-wave figures of runs with more than the pump–Stokes pair
// (shared/physics/wave-figures.ts): direction in words, carrier offset from the pump, energies, gain.
import type { NonReciprocity, WaveFigure, WaveFigures } from '@shared/physics/wave-figures'
import { formatNumber, formatQuantity } from '@/components/charts/format-value'

export interface WaveRow {
  key: string
  label: string
  direction: string
  /** Where the wave is launched and where it leaves. */
  facets: string
  offset: string
  energyIn: string
  energyOut: string
  transmission: string
  gainDb: string
}

/** Typographic minus for negative numbers in text. */
const signed = (v: number, text: string) => (v > 0 ? `+${text}` : text.replace(/^-/, '−'))

export function offsetText(offsetGHz: number): string {
  if (offsetGHz === 0) return '0'
  // MHz below 1 GHz (forward resonances sit at a few hundred MHz in fibre).
  return Math.abs(offsetGHz) < 1 ? signed(offsetGHz, `${formatNumber(offsetGHz * 1000, 4)} MHz`) : signed(offsetGHz, `${formatNumber(offsetGHz, 5)} GHz`)
}

export function waveRow(w: WaveFigure): WaveRow {
  const forward = w.direction === 1
  const launched = w.energyInJ > 0
  return {
    key: w.key,
    label: w.label,
    direction: forward ? '→ +z' : '← −z',
    facets: forward ? 'with the pump: in at z = 0, out at z = L' : 'against the pump: in at z = L, out at z = 0',
    offset: offsetText(w.offsetGHz),
    energyIn: launched ? formatQuantity(w.energyInJ, 'J') : 'none launched',
    energyOut: formatQuantity(w.energyOutJ, 'J'),
    transmission: w.transmission === null ? '—' : formatNumber(w.transmission, 4),
    gainDb: w.gainDb === null ? '—' : signed(w.gainDb, formatNumber(w.gainDb, 4)),
  }
}

export function photonBalanceText(f: WaveFigures): string {
  return f.photonBalanceResidual === null ? 'n/a (with loss photons are lost on purpose)' : formatNumber(f.photonBalanceResidual, 3)
}

export interface IsolationText {
  isolation: string
  counter: string
  co: string
}

export function isolationText(n: NonReciprocity): IsolationText {
  return {
    isolation: `${signed(n.isolationDb, formatNumber(n.isolationDb, 4))} dB`,
    counter: formatNumber(n.counterTransmission, 4),
    co: formatNumber(n.coTransmission, 4),
  }
}
