// Options and results of the oscillation analysis (shared/analysis/oscillation/index.ts states the method).
// Times in ns, frequencies in GHz; amplitudes in the trace's own unit, at the start of the analysed window.

/** How the pulse envelope is removed before the ripple is measured. */
export type EnvelopeMode = 'auto' | 'cutoff' | 'none'

export interface OscillationOptions {
  /** Part of the record to analyse (ns); the whole record by default. */
  startNs?: number
  endNs?: number
  /** 'auto' (default): the cut-off follows the widest pulse found; 'cutoff': envelopeCutoffGHz; 'none': only a constant offset. */
  envelope?: EnvelopeMode
  /** With envelope 'cutoff': the fastest change (GHz) the envelope curve may follow over the pulse. */
  envelopeCutoffGHz?: number
  /** Ignore spectral peaks below this (GHz); default 1.5 cycles per record. */
  minFrequencyGHz?: number
}

/** What was taken out as envelope, in words and numbers a user can check. */
export interface EnvelopeRemoval {
  mode: EnvelopeMode
  /** The pulse the envelope curve follows closely; null when none stands out of the ripple. */
  pulse: { centreNs: number; fwhmNs: number; fromNs: number; toNs: number } | null
  /** Over the pulse the curve follows changes up to this frequency (knot spacing 1/(2·cut-off)). */
  cutoffGHz: number | null
  /** Away from the pulse only a straight baseline is removed: changes slower than ≈ 1/(2T). */
  baselineCutoffGHz: number
  /** Number of free coefficients of the envelope curve. */
  coefficients: number
}

/** Frequency, decay time and amplitude with 1σ uncertainties; null where not determined (notes say why). */
export interface RippleEstimate {
  frequencyGHz: number
  frequencyUncertaintyGHz: number | null
  decayNs: number | null
  decayUncertaintyNs: number | null
  amplitude: number
  amplitudeUncertainty: number | null
}

export interface SpectralEstimate extends RippleEstimate {
  /** Resampled traces behind the uncertainties. */
  bootstrapReplicates: number
}

export interface DampedSineEstimate extends RippleEstimate {
  phaseRad: number
  rmsResidual: number
  /** Noise power near the ripple frequency over the average noise power (1 for white noise); scales the covariance. */
  noiseColourFactor: number
  iterations: number
  /** Fitted ripple (envelope removed) on the analysed samples, for drawing. */
  curve: { timeNs: number[]; value: number[] }
}

export interface OscillationResult {
  samples: number
  stepNs: number
  startNs: number
  endNs: number
  envelope: EnvelopeRemoval | null
  /** The trace minus the envelope, for drawing. */
  ripple: { timeNs: number[]; value: number[] }
  /** One-sided magnitude spectrum |X|/N of the ripple, for drawing (peak-preserving decimation); empty if none. */
  spectrum: { frequencyGHz: number[]; magnitude: number[] }
  spectral: SpectralEstimate | null
  fit: DampedSineEstimate | null
  /** |spectrum − fit| ≤ 2·√(σ_s² + σ_f²) per quantity; null when either side has no uncertainty. */
  agreement: { frequency: boolean | null; decay: boolean | null } | null
  /** Why an estimate is missing or doubtful, in words. */
  notes: string[]
}
