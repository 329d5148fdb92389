// The per-position columns of a sensing map's answer, the same for both read-outs (time of flight and correlation).
import type { SensingMapResponse } from '@shared/api/sensing-map'

interface AssembledMap {
  positionsM: number[]
  detuningsMHz: number[]
  gain: SensingMapResponse['gainLn']
  fits: ReadonlyArray<{ shiftMHz: number | null; sigmaMHz: number | null; peakGain: number | null; usable: boolean; outsideScan?: boolean }>
}

export function sensingMapColumns(map: AssembledMap) {
  return {
    positionsM: map.positionsM,
    detuningsMHz: map.detuningsMHz,
    gainLn: map.gain,
    fittedShiftMHz: map.fits.map((f) => f.shiftMHz),
    sigmaMHz: map.fits.map((f) => f.sigmaMHz),
    peakGainLn: map.fits.map((f) => f.peakGain),
    usable: map.fits.map((f) => f.usable),
    outsideScan: map.fits.map((f) => f.outsideScan === true),
  }
}
