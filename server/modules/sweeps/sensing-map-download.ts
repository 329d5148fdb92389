// The sensing map as a file: a CSV table per position (fitted and true shift, 1σ, residual, peak gain, then the
// log gain at every detuning; units in the header) or the gain map as NPY (float64, [position][detuning]).
import type { Response } from 'express'
import type { SensingMapResponse } from '@shared/api/sensing-map'
import { npyHeader } from '../../../solver/index'

const cell = (v: number | null) => (v === null ? '' : String(v))

export function sensingMapCsv(m: SensingMapResponse): string {
  const head = ['position_m', 'true_shift_change_mhz', 'fitted_shift_change_mhz', 'sigma_mhz', 'residual_mhz', 'peak_gain_ln', 'usable', 'outside_scan', ...m.detuningsMHz.map((d) => `gain_ln_at_${d}_mhz`)]
  const lines = m.positionsM.map((z, i) => {
    const fit = m.fittedShiftMHz[i]
    const residual = fit === null ? null : fit - m.trueShiftMHz[i]
    return [z, m.trueShiftMHz[i], cell(fit), cell(m.sigmaMHz[i]), cell(residual), cell(m.peakGainLn[i]), m.usable[i] ? 1 : 0, m.outsideScan?.[i] ? 1 : 0, ...m.gainLn[i]].join(',')
  })
  const readOut = m.readOut === 'correlation' ? `correlation read-out, peak spacing ${m.peakSpacingM} m, range from ${m.rangeStartM} m` : 'time-of-flight read-out'
  const note = `# sensing map, ${readOut}; shifts are changes from nu_B = ${m.brillouinShiftGHz} GHz; resolution ${m.resolutionM} m (nominal ${m.nominalResolutionM} m, measured ${m.measuredResolutionM ?? 'n/a'} m); range ${m.rangeM} m; gain_ln = ln(P_probe/P_probe without pump)`
  return [note, head.join(','), ...lines].join('\n') + '\n'
}

export function sendSensingMap(res: Response, m: SensingMapResponse, format: 'json' | 'csv' | 'npy', id: string): void {
  res.set('Cache-Control', 'no-store')
  if (format === 'json') return void res.json(m)
  if (format === 'csv') {
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="sensing-map-${id}.csv"` })
    return void res.send(sensingMapCsv(m))
  }
  const shape = [m.positionsM.length, m.detuningsMHz.length]
  const data = new Float64Array(shape[0] * shape[1])
  m.gainLn.forEach((row, i) => data.set(row, i * shape[1]))
  res.set({ 'Content-Type': 'application/octet-stream', 'X-Units': encodeURIComponent('ln(P/P0) at [position m][detuning MHz]'), 'Content-Disposition': `attachment; filename="sensing-gain-${id}.npy"` })
  res.send(Buffer.concat([Buffer.from(npyHeader('<f8', shape)), Buffer.from(data.buffer)]))
}
