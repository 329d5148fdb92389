// ECharts options and caption for one port's power spectrum (shared/analysis/power-spectrum.ts). Pure, so the
// shaping can be tested without a browser.
import { HANN_ENBW_BINS, spectrumEndsNote, SPECTRUM_OVERLAP, type PortSpectrum } from '@shared/analysis/power-spectrum'
import type { AxisUnit } from '@/components/charts/map-axes'

/** Levels shown below the peak; the spectrum itself reaches further (to its stated floor). */
export const SHOWN_RANGE_DB = 100
/** The first view spans the bins within this much of the peak, widened by a margin; zoom out for the rest. */
const OCCUPIED_DB = 60

export function frequencyUnit(maxAbsHz: number): AxisUnit {
  if (maxAbsHz >= 2e9) return { unit: 'GHz', factor: 1e-9 }
  if (maxAbsHz >= 2e6) return { unit: 'MHz', factor: 1e-6 }
  return { unit: 'kHz', factor: 1e-3 }
}

export function formatHz(hz: number): string {
  const u = hz >= 1e9 ? { unit: 'GHz', factor: 1e-9 } : hz >= 1e6 ? { unit: 'MHz', factor: 1e-6 } : hz >= 1e3 ? { unit: 'kHz', factor: 1e-3 } : { unit: 'Hz', factor: 1 }
  return `${Number((hz * u.factor).toPrecision(3))} ${u.unit}`
}

/** What a reader needs to read the plot: window, averaging, resolution bandwidth and units. */
export function spectrumCaption(s: PortSpectrum): string {
  return (
    `Hann window, ${s.segmentSamples}-sample segments overlapping ${SPECTRUM_OVERLAP * 100} % (${s.segments} averaged); ` +
    `resolution bandwidth ${formatHz(s.rbwHz)} (${HANN_ENBW_BINS} × 1/segment duration), drawn every ${formatHz(s.binHz)}. ` +
    `Power spectral density in dBm/GHz: a line narrower than the resolution bandwidth reads its power divided by it. ` +
    `${capitalise(spectrumEndsNote(s))}.`
  )
}

const capitalise = (t: string) => t.charAt(0).toUpperCase() + t.slice(1)

/** Index range of the bins within OCCUPIED_DB of the peak, widened by 25 % of its width on each side (at least 8 bins). */
export function occupiedRange(s: PortSpectrum): [number, number] {
  const v = s.psdDbmPerGHz
  let lo = v.length - 1
  let hi = 0
  for (let j = 0; j < v.length; j++) {
    if (v[j] >= s.peakDbmPerGHz - OCCUPIED_DB) {
      lo = Math.min(lo, j)
      hi = Math.max(hi, j)
    }
  }
  const margin = Math.max(8, Math.round(0.25 * (hi - lo)))
  return [Math.max(0, lo - margin), Math.min(v.length - 1, hi + margin)]
}

export function buildSpectrumOptions(s: PortSpectrum, colour?: string) {
  const n = s.offsetHz.length
  const fu = frequencyUnit(Math.max(Math.abs(s.offsetHz[0]), Math.abs(s.offsetHz[n - 1])))
  const data = Array.from(s.offsetHz, (f, j) => [f * fu.factor, s.psdDbmPerGHz[j]])
  const yMax = Math.ceil(s.peakDbmPerGHz / 10) * 10
  const yMin = Math.max(Math.floor(s.floorDbmPerGHz), Math.floor((s.peakDbmPerGHz - SHOWN_RANGE_DB) / 10) * 10)
  const [lo, hi] = occupiedRange(s)
  const axisName = `Offset from the carrier (${fu.unit})`
  const zoom = { filterMode: 'none', startValue: s.offsetHz[lo] * fu.factor, endValue: s.offsetHz[hi] * fu.factor }
  return {
    animation: false,
    tooltip: {
      trigger: 'axis',
      valueFormatter: (v: unknown) => (typeof v === 'number' ? `${v.toFixed(1)} dBm/GHz` : '—'),
      axisPointer: { label: { formatter: (p: { value: number }) => `${Number(p.value.toPrecision(4))} ${fu.unit}` } },
    },
    grid: { left: 64, right: 20, top: 16, bottom: 64 },
    // The zoomed ends fall anywhere: no labels there (they crowd the round ticks on a phone), the rest rounded.
    xAxis: {
      type: 'value',
      name: axisName,
      nameLocation: 'middle',
      nameGap: 26,
      min: data[0][0],
      max: data[n - 1][0],
      axisLabel: { showMinLabel: false, showMaxLabel: false, hideOverlap: true, formatter: (v: number) => `${Number(v.toPrecision(3))}` },
    },
    yAxis: { type: 'value', name: 'PSD (dBm/GHz)', nameLocation: 'middle', nameGap: 44, min: yMin, max: yMax },
    dataZoom: [
      { type: 'inside', xAxisIndex: 0, ...zoom },
      {
        type: 'slider',
        xAxisIndex: 0,
        height: 16,
        bottom: 8,
        ...zoom,
        borderColor: 'rgba(128,128,128,0.35)',
        fillerColor: 'rgba(128,128,128,0.18)',
        backgroundColor: 'transparent',
        dataBackground: { lineStyle: { color: 'rgba(128,128,128,0.6)' }, areaStyle: { color: 'rgba(128,128,128,0.15)' } },
        selectedDataBackground: { lineStyle: { color: 'rgba(128,128,128,0.8)' }, areaStyle: { color: 'rgba(128,128,128,0.25)' } },
        handleStyle: { color: 'rgba(128,128,128,0.9)', borderColor: 'rgba(128,128,128,0.9)' },
        moveHandleStyle: { color: 'rgba(128,128,128,0.5)' },
        textStyle: { color: 'rgba(128,128,128,1)' },
        labelFormatter: (v: number) => `${Number(v.toPrecision(3))}`,
      },
    ],
    series: [{ type: 'line', name: 'Power spectral density', showSymbol: false, animation: false, color: colour, lineStyle: { width: 1.5 }, data }],
  }
}
