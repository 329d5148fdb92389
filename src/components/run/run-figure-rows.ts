// The rows of the run page's figures table: what each figure means, its unit, how it is written, and the
// schemes it applies to (shared/physics/pulse-roles.ts). Energy ratios are fractions, as in the sweep table, the
// CSV and the manifest.
import type { RunScheme } from '@shared/physics/pulse-roles'
import type { ChannelFigures } from '@shared/physics/simulation-result'
import { FRACTION_UNIT } from '@shared/analysis/sweep-metrics'
import { formatNumber, formatQuantity } from '@/components/charts/format-value'

export interface FigureRow {
  /** Key in ChannelFigures (also the key of its not-determined reason and, via path, of its error estimate). */
  key: string
  label: string
  unit: string
  meaning: string
  schemes: readonly RunScheme[]
  value: (c: ChannelFigures) => number | null
  text: (v: number) => string
  /** Where the figure sits in a channel's figures, for its error estimate; none for settings. */
  path?: string
}

const ALL: readonly RunScheme[] = ['storage', 'amplifier', 'generator', 'other']
const joule = (v: number) => formatQuantity(v, 'J')
const plain = (v: number) => formatNumber(v, 3)

export const FIGURE_ROWS: readonly FigureRow[] = [
  { key: 'retrievalEfficiency', label: 'Retrieval efficiency η', unit: FRACTION_UNIT, schemes: ['storage'], value: (c) => c.retrievalEfficiency, text: plain, path: 'retrievalEfficiency',
    meaning: 'Energy of the read-out pulse over the data energy. The read-out is the pump output with the read pulse minus that without it, inside the retrieval window.' },
  { key: 'leakThrough', label: 'Leak-through', unit: FRACTION_UNIT, schemes: ['storage'], value: (c) => c.leakThrough ?? null, text: plain, path: 'leakThrough',
    meaning: 'Data light that reaches the pump output inside the retrieval window without having been stored and read out, over the data energy.' },
  { key: 'retrievedPhaseRad', label: 'Retrieved phase', unit: 'rad', schemes: ['storage'], value: (c) => c.retrievedPhaseRad, text: plain, path: 'retrievedPhaseRad',
    meaning: 'Phase of the read-out field relative to the data pulse, in [0, 2π); π for real write and read pulses.' },
  { key: 'peakStokesGainDb', label: 'Peak Stokes gain', unit: 'dB', schemes: ['amplifier'], value: (c) => c.peakStokesGainDb, text: plain, path: 'peakStokesGainDb',
    meaning: '10·log10 of the peak Stokes output power over the peak Stokes input power.' },
  { key: 'reflectivity', label: 'Reflectivity E_s,out / E_p,in', unit: FRACTION_UNIT, schemes: ['amplifier', 'generator'], value: (c) => c.reflectivity, text: plain, path: 'reflectivity',
    meaning: 'Stokes energy leaving at z = 0 over the pump energy launched there (for CW, P_s(0)/P_p(0)).' },
  { key: 'pumpDelayNs', label: 'Pump delay beyond transit', unit: 'ns', schemes: ['amplifier', 'generator'], value: (c) => c.pumpDelayNs, text: plain, path: 'pumpDelayNs',
    meaning: 'Centroid of the pump output minus that of the input, minus the transit time L·n_g/c.' },
  { key: 'stokesDelayNs', label: 'Stokes delay beyond transit', unit: 'ns', schemes: ['amplifier'], value: (c) => c.stokesDelayNs, text: plain, path: 'stokesDelayNs',
    meaning: 'Centroid of the Stokes output minus that of the input, minus the transit time (slow light).' },
  { key: 'pumpOutFwhmNs', label: 'Pump output FWHM', unit: 'ns', schemes: ['amplifier', 'generator'], value: (c) => c.pumpOutFwhmNs, text: plain, path: 'pumpOutFwhmNs',
    meaning: 'Full width at half maximum of the pump output power.' },
  { key: 'stokesOutFwhmNs', label: 'Stokes output FWHM', unit: 'ns', schemes: ['amplifier'], value: (c) => c.stokesOutFwhmNs, text: plain, path: 'stokesOutFwhmNs',
    meaning: 'Full width at half maximum of the Stokes output power.' },
  { key: 'pumpInJ', label: 'Pump energy in', unit: 'J', schemes: ALL, value: (c) => c.energyJ.pumpIn, text: joule, path: 'energyJ.pumpIn', meaning: 'Energy launched at z = 0 (data and refresh pulses in storage runs).' },
  { key: 'pumpOutJ', label: 'Pump energy out', unit: 'J', schemes: ALL, value: (c) => c.energyJ.pumpOut, text: joule, path: 'energyJ.pumpOut', meaning: 'Energy leaving at z = L during the run.' },
  { key: 'stokesInJ', label: 'Stokes energy in', unit: 'J', schemes: ALL, value: (c) => c.energyJ.stokesIn, text: joule, path: 'energyJ.stokesIn', meaning: 'Energy launched at z = L (write and read pulses in storage runs).' },
  { key: 'stokesOutJ', label: 'Stokes energy out', unit: 'J', schemes: ALL, value: (c) => c.energyJ.stokesOut, text: joule, path: 'energyJ.stokesOut', meaning: 'Energy leaving at z = 0 during the run.' },
  { key: 'manleyRoweResidual', label: 'Photon-balance residual', unit: FRACTION_UNIT, schemes: ALL, value: (c) => c.manleyRoweResidual, text: plain,
    meaning: 'Photons lost by the pump minus photons gained by the Stokes, light still inside counted, over the photons launched; only without loss.' },
]

export const SCHEME_CAPTION: Record<RunScheme, string> = {
  storage: 'Light storage: figures of the data read-out.',
  amplifier: 'Brillouin amplifier: gain, reflectivity and pulse figures.',
  generator: 'Pump only (Stokes grown from noise): reflectivity and pump figures.',
  other: 'Port energies and photon balance.',
}

/** A row is shown when it applies to at least one channel's scheme. */
export const rowsFor = (channels: ChannelFigures[]) => FIGURE_ROWS.filter((r) => channels.some((c) => r.schemes.includes(c.scheme ?? 'other')))
