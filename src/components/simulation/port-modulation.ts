// Editing helpers for a port's source: which kind of modulation it has, switching kinds, and the derived figures
// the form shows beside the fields.
import { modulationIndex } from '@shared/physics/source-modulation'
import { broadbandCorrelationLengthM, broadbandPeak, correlationFigures } from '@shared/physics/correlation-figures'
import { formatLengthM, formatNumber } from './format'
import type { PortDraft } from './pulse-drafts'

export type ModulationKind = 'none' | 'fm' | 'broadband'

export const MODULATION_KINDS: { value: ModulationKind; title: string }[] = [
  { value: 'none', title: 'None' },
  { value: 'fm', title: 'Sinusoidal FM' },
  { value: 'broadband', title: 'Broadband' },
]

/** Starting values: a 10 MHz tone swinging ±1 GHz, and a 100 MHz broadband source (common practice for fibre sensing). */
const FM_START = { rateMHz: 10, excursionMHz: 1000, delayNs: 0 }
const BROADBAND_START = { linewidthMHz: 100, seed: 1 }

export function modulationKind(port: PortDraft): ModulationKind {
  if (port.modulation) return 'fm'
  if (port.broadband) return 'broadband'
  return 'none'
}

/** The port with the chosen kind only; the other kind's settings are dropped. */
export function withModulationKind(port: PortDraft, kind: ModulationKind): PortDraft {
  const next = { ...port }
  delete next.modulation
  delete next.broadband
  if (kind === 'fm') next.modulation = port.modulation ?? { ...FM_START }
  if (kind === 'broadband') next.broadband = port.broadband ?? { ...BROADBAND_START }
  return next
}

const usable = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0

/**
 * Sentences of derived figures for the port's source; a figure that cannot be given says why. Without a
 * waveguide (an input with no counter-propagating partner) only the modulation index.
 */
export function modulationFigures(port: PortDraft, waveguide?: { groupIndex?: number; linewidthMHz?: number }): string[] {
  const haveGuide = usable(waveguide?.groupIndex) && usable(waveguide?.linewidthMHz)
  if (port.modulation) {
    const { rateMHz, excursionMHz } = port.modulation
    if (!usable(rateMHz) || typeof excursionMHz !== 'number' || !(excursionMHz >= 0)) return ['Enter a rate above 0 and an excursion of at least 0 to see the derived figures.']
    const out = [`Modulation index β = Δf/f_m = ${formatNumber(modulationIndex({ rateMHz, excursionMHz }), 3)} rad.`]
    if (!waveguide) return out
    if (!haveGuide) return [...out, 'Complete the waveguide (group index, linewidth) to see the correlation peaks.']
    const f = correlationFigures(waveguide.groupIndex!, waveguide.linewidthMHz!, rateMHz, excursionMHz)
    const width =
      f.peakWidthM === null
        ? 'with no excursion nothing localises the interaction'
        : `each about ${formatLengthM(f.peakWidthM)} wide (Δz = v_g Δν_B/(2π f_m Δf))` +
          (f.widthIsLowerBound ? ', but with f_m above half the Brillouin linewidth the peaks are wider than this' : '')
    out.push(`With the same modulation on the other input: correlation peaks every ${formatLengthM(f.peakSpacingM)} (d_m = v_g/(2 f_m)), ${width}.`)
    return out
  }
  if (port.broadband) {
    const { linewidthMHz } = port.broadband
    if (!usable(linewidthMHz)) return ['Enter a linewidth above 0 to see the derived figures.']
    if (!waveguide) return []
    if (!haveGuide) return ['Complete the waveguide (group index, linewidth) to see the correlation length.']
    const peak = broadbandPeak(waveguide.groupIndex!, waveguide.linewidthMHz!, linewidthMHz)
    return [
      `Correlation length v_g/(πΔν) = ${formatLengthM(broadbandCorrelationLengthM(waveguide.groupIndex!, linewidthMHz))}.`,
      `With the same source (seed and linewidth) on the other input: one correlation peak about ${formatLengthM(peak.widthM)} wide (v_g ln 2/(π(Δν_B + 2Δν))), over a gain floor of ${formatNumber(peak.floor * 100, 2)} % of the peak.`,
    ]
  }
  return []
}
