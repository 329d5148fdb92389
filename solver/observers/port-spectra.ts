// The optical power spectrum of every port trace of a finished run, as result arrays: one shared frequency
// axis and one PSD array per trace with light (shared/analysis/power-spectrum.ts states the estimator).
// Every trace of a run has the same length and Δt; all take the segment length of a trace lit at its ends
// (half the record at most), so one axis serves them all.
import { MAX_SEGMENT, powerSpectrum, segmentLength, spectrumEndsNote, SPECTRUM_OVERLAP, SPECTRUM_WINDOW, type SpectrumResult } from '@shared/analysis/power-spectrum'
import type { ArrayDescriptor } from '@shared/physics/simulation-result'

export interface PortTrace {
  /** Array name of the trace, e.g. ch1_pump_out. */
  name: string
  /** What a user reads, e.g. "Channel 1 pump envelope leaving at z = L". */
  label: string
  /** Interleaved complex envelope in √W. */
  data: Float64Array
}

export interface SpectrumArray {
  name: string
  data: Float64Array
  descriptor: Omit<ArrayDescriptor, 'name'>
}

export const SPECTRUM_AXIS_ARRAY = 'spectrum_offset_ghz'
export const psdArrayName = (traceName: string) => `${traceName}_psd_dbm_per_ghz`

/** Optical port traces among a result's arrays: complex envelopes in √W sampled on the time axis. */
export function portTracesOf(descriptors: ArrayDescriptor[], arrays: Record<string, Float64Array | Float32Array>, samples: number): PortTrace[] {
  return descriptors
    .filter((d) => d.dtype === 'c16' && d.units === '√W' && d.shape.length === 1 && d.shape[0] === samples && arrays[d.name] instanceof Float64Array)
    .map((d) => ({ name: d.name, label: d.description, data: arrays[d.name] as Float64Array }))
}

/** Spectrum arrays for the given traces: the axis first, then one PSD per trace with light; none without light anywhere. */
export function portSpectra(traces: PortTrace[], dtS: number): SpectrumArray[] {
  const samples = traces.length > 0 ? traces[0].data.length / 2 : 0
  const opts = { maxSegment: segmentLength(samples / 2, MAX_SEGMENT) }
  const results = traces.map((t) => ({ trace: t, s: powerSpectrum(t.data, dtS, opts) }))
  const lit = results.filter((r): r is { trace: PortTrace; s: Extract<SpectrumResult, { kind: 'spectrum' }> } => r.s.kind === 'spectrum')
  if (lit.length === 0) return []
  const first = lit[0].s
  const method = `${SPECTRUM_WINDOW} window, ${first.segmentSamples}-sample segments overlapping ${SPECTRUM_OVERLAP * 100} %, resolution bandwidth ${formatHz(first.rbwHz)}, sampled every ${formatHz(first.binHz)}`
  const dark = results.filter((r) => r.s.kind === 'dark').map((r) => r.trace.name)
  const axis: SpectrumArray = {
    name: SPECTRUM_AXIS_ARRAY,
    data: first.offsetHz.map((f) => f / 1e9),
    descriptor: {
      dtype: 'f8',
      shape: [first.offsetHz.length],
      units: 'GHz',
      description:
        `Frequency offset from each port's carrier of the *_psd_dbm_per_ghz spectra (${method})` +
        (dark.length > 0 ? `; no light, so no spectrum, at ${dark.join(', ')}` : ''),
    },
  }
  return [
    axis,
    ...lit.map(({ trace, s }) => ({
      name: psdArrayName(trace.name),
      data: s.psdDbmPerGHz,
      descriptor: {
        dtype: 'f8' as const,
        shape: [s.psdDbmPerGHz.length],
        units: 'dBm/GHz',
        description: `Power spectral density of ${trace.name} (${trace.label}); ${method}; ${spectrumEndsNote(s)}; values below ${s.floorDbmPerGHz.toFixed(1)} dBm/GHz are set to it`,
      },
    })),
  ]
}

function formatHz(hz: number): string {
  const [f, unit] = hz >= 1e9 ? [1e9, 'GHz'] : hz >= 1e6 ? [1e6, 'MHz'] : hz >= 1e3 ? [1e3, 'kHz'] : [1, 'Hz']
  return `${Number((hz / f).toPrecision(4))} ${unit}`
}
