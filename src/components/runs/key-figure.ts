// The one number the runs list shows per run: what the run was most likely about.
import type { FiguresOfMerit } from '@shared/simulation-result'
import { formatNumber } from '@/components/charts/format-value'

export function keyFigure(f: FiguresOfMerit | null | undefined): { label: string; text: string } | null {
  const c = f?.channels[0]
  if (!c) return null
  if (c.retrievalEfficiency !== null) return { label: 'retrieval', text: `${formatNumber(100 * c.retrievalEfficiency, 3)} %` }
  if (c.peakStokesGainDb !== null) return { label: 'Stokes gain', text: `${formatNumber(c.peakStokesGainDb, 3)} dB` }
  if (c.reflectivity !== null) return { label: 'reflectivity', text: `${formatNumber(100 * c.reflectivity, 3)} %` }
  return null
}
