// The one number the runs list shows per run, as text; the choice of figure is the API's (shared/api/runs.ts).
import type { KeyFigure } from '@shared/api/runs'
import { formatNumber } from '@/components/charts/format-value'

export function keyFigureText(f: KeyFigure | null | undefined): { label: string; text: string } | null {
  return f ? { label: f.label, text: `${formatNumber(f.value, 3)} ${f.unit}` } : null
}
