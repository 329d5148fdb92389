// The figures of merit a sweep plots and exports per point, read from each run's stored figures
// (shared/physics/simulation-result.ts) plus the energy windows the configuration defines.
import type { ChannelFigures, FiguresOfMerit } from '../physics/simulation-result'
import { errorShaped } from '../physics/figure-error'
import type { Port, SimulationConfig } from '../physics/simulation-config'
import { channelScheme, type RunScheme } from '../physics/pulse-roles'
import type { MetricColumn } from '../api/sweeps'
import { SETTLED_STOKES_IN, SETTLED_STOKES_OUT } from '../physics/gain-scan'

interface ChannelMetric {
  key: string
  label: string
  unit: string
  pick: (c: ChannelFigures) => number | null
  /** The schemes the figure means something in (shared/physics/pulse-roles.ts). */
  schemes: readonly RunScheme[]
}

/** Ratios of energies are fractions everywhere (run page, sweep page, CSV, manifest): 0.094, not 9.4 %. */
export const FRACTION_UNIT = 'fraction'

const ALL: readonly RunScheme[] = ['storage', 'amplifier', 'generator', 'other']
const STORAGE: readonly RunScheme[] = ['storage']
const AMPLIFIER: readonly RunScheme[] = ['amplifier']
const PUMPED: readonly RunScheme[] = ['amplifier', 'generator']

/** Per channel; the energy balance is the Manley–Rowe residual plus the output energies it is made of. */
export const CHANNEL_METRICS: readonly ChannelMetric[] = [
  { key: 'retrievalEfficiency', label: 'Retrieval efficiency', unit: FRACTION_UNIT, schemes: STORAGE, pick: (c) => c.retrievalEfficiency },
  { key: 'leakThrough', label: 'Leak-through', unit: FRACTION_UNIT, schemes: STORAGE, pick: (c) => c.leakThrough ?? null },
  { key: 'pumpDelayNs', label: 'Pump delay', unit: 'ns', schemes: PUMPED, pick: (c) => c.pumpDelayNs },
  { key: 'stokesDelayNs', label: 'Stokes delay', unit: 'ns', schemes: AMPLIFIER, pick: (c) => c.stokesDelayNs },
  { key: 'pumpOutFwhmNs', label: 'Pump output width', unit: 'ns', schemes: PUMPED, pick: (c) => c.pumpOutFwhmNs },
  { key: 'stokesOutFwhmNs', label: 'Stokes output width', unit: 'ns', schemes: AMPLIFIER, pick: (c) => c.stokesOutFwhmNs },
  { key: 'peakStokesGainDb', label: 'Peak Stokes gain', unit: 'dB', schemes: AMPLIFIER, pick: (c) => c.peakStokesGainDb },
  { key: 'reflectivity', label: 'Reflectivity', unit: FRACTION_UNIT, schemes: PUMPED, pick: (c) => c.reflectivity },
  { key: 'manleyRoweResidual', label: 'Energy balance residual', unit: FRACTION_UNIT, schemes: ALL, pick: (c) => c.manleyRoweResidual },
  { key: 'pumpOutEnergyJ', label: 'Pump output energy', unit: 'J', schemes: ALL, pick: (c) => c.energyJ.pumpOut },
  { key: 'stokesOutEnergyJ', label: 'Stokes output energy', unit: 'J', schemes: ALL, pick: (c) => c.energyJ.stokesOut },
]

const WINDOW_PREFIX = 'window:'

/** A gain scan's CW Stokes gain: 10·log10(E_out/E_in) of channel 1 over the two settled-tail windows (gain-scan.ts). */
export const SETTLED_GAIN_COLUMN: MetricColumn = { key: 'settledStokesGainDb', label: 'Stokes gain, settled', unit: 'dB' }

function settledGainDb(figures: FiguresOfMerit): number | null {
  const energy = (label: string) => figures.windows.find((w) => w.label === label)?.energyJPerChannel[0]
  const out = energy(SETTLED_STOKES_OUT)
  const inJ = energy(SETTLED_STOKES_IN)
  return out !== undefined && inJ !== undefined && out > 0 && inJ > 0 ? 10 * Math.log10(out / inJ) : null
}
const PORT_WORDS: Record<Port, string> = { pumpIn: 'pump in', pumpOut: 'pump out', stokesIn: 'Stokes in', stokesOut: 'Stokes out' }

/**
 * Columns for a sweep of this base configuration: the channel metrics that apply to each channel's scheme
 * (prefixed chN. with several channels), then windows.
 */
export function metricColumns(config: Pick<SimulationConfig, 'channels' | 'energyWindows'>): MetricColumn[] {
  const many = config.channels.length > 1
  const cols: MetricColumn[] = []
  config.channels.forEach((ch, ci) => {
    const scheme = channelScheme(ch)
    for (const m of CHANNEL_METRICS) {
      if (!m.schemes.includes(scheme)) continue
      cols.push({ key: many ? `ch${ci + 1}.${m.key}` : m.key, label: many ? `${m.label} (channel ${ci + 1})` : m.label, unit: m.unit })
    }
  })
  const labels = config.energyWindows.map((w) => w.label)
  if (labels.includes(SETTLED_STOKES_IN) && labels.includes(SETTLED_STOKES_OUT)) cols.push(SETTLED_GAIN_COLUMN)
  for (const w of config.energyWindows) cols.push({ key: `${WINDOW_PREFIX}${w.label}`, label: `Energy in “${w.label}” (${PORT_WORDS[w.port]})`, unit: 'J' })
  return cols
}

const finiteOrNull = (x: number | null | undefined) => (typeof x === 'number' && Number.isFinite(x) ? x : null)

/** Key of a column's estimated absolute error (same unit) among a point's values. */
export const errorKey = (key: string) => `${key}:error`

/**
 * One point's values by column key; every column present, null where the run gives nothing. Each column also
 * gets its estimated discretisation error under errorKey(key), null where the run has no estimate for it.
 */
export function reduceFigures(figures: FiguresOfMerit | null, columns: MetricColumn[]): Record<string, number | null> {
  const out = pickColumns(figures, columns)
  const e = figures?.errorEstimate
  const errors = e?.status === 'estimated' ? pickColumns(errorShaped(figures!, e.figures), columns) : {}
  for (const col of columns) out[errorKey(col.key)] = errors[col.key] ?? null
  // A ratio of two window energies has no error figure of its own (the errors map holds energy errors).
  if (columns.some((c) => c.key === SETTLED_GAIN_COLUMN.key)) out[errorKey(SETTLED_GAIN_COLUMN.key)] = null
  return out
}

function pickColumns(figures: FiguresOfMerit | null, columns: MetricColumn[]): Record<string, number | null> {
  const out: Record<string, number | null> = {}
  for (const col of columns) {
    if (!figures) {
      out[col.key] = null
      continue
    }
    if (col.key === SETTLED_GAIN_COLUMN.key) {
      out[col.key] = finiteOrNull(settledGainDb(figures))
      continue
    }
    if (col.key.startsWith(WINDOW_PREFIX)) {
      const label = col.key.slice(WINDOW_PREFIX.length)
      out[col.key] = finiteOrNull(figures.windows.find((w) => w.label === label)?.energyJ)
      continue
    }
    const m = /^ch(\d+)\.(.+)$/.exec(col.key)
    const ci = m ? Number(m[1]) - 1 : 0
    const metric = CHANNEL_METRICS.find((x) => x.key === (m ? m[2] : col.key))
    const ch = figures.channels.find((c) => c.channel === ci) ?? figures.channels[ci]
    out[col.key] = metric && ch ? finiteOrNull(metric.pick(ch)) : null
  }
  return out
}
