import { z } from 'zod'
import { KernelClass } from './kernel-class'
import { MapReduction, Port } from './simulation-config'
import { RUN_SCHEMES } from './pulse-roles'
import { FigureErrors } from './figure-error'
import { WaveFigures } from './wave-figures'

/**
 * Complex arrays (dtype 'c16') are interleaved: element k is (re, im) = (data[2k], data[2k+1]), in √W for
 * optical envelopes, so |A|² is power in W. This is also numpy's '<c16' byte order.
 */
export const COMPLEX_LAYOUT = 'interleaved re,im float64 pairs (numpy <c16); optical envelopes in √W, |A|² = W'

export const ArrayDtype = z.enum(['c16', 'f8', 'f4'])
export type ArrayDtype = z.infer<typeof ArrayDtype>

/** How one result array is laid out; the CLI writes one NPY file per descriptor. */
export const ArrayDescriptor = z.object({
  name: z.string().min(1),
  dtype: ArrayDtype,
  /** Row-major (C order). Maps are [rows = time, cols = z]. */
  shape: z.array(z.number().int().nonnegative()),
  units: z.string(),
  description: z.string(),
})
export type ArrayDescriptor = z.infer<typeof ArrayDescriptor>

export const RunStatus = z.enum(['finished', 'aborted', 'failed'])
export type RunStatus = z.infer<typeof RunStatus>

export const RunCounters = z.object({
  steps: z.number().int().nonnegative(),
  cellUpdates: z.number().nonnegative().describe('Node-steps: one node advanced by one time step, per channel'),
  wallTimeS: z.number().nonnegative(),
  cellUpdatesPerS: z.number().nonnegative(),
})
export type RunCounters = z.infer<typeof RunCounters>

export const ResultGrid = z.object({
  dtS: z.number().positive(),
  dzM: z.number().positive(),
  nz: z.number().int().positive().describe('Cells along z (nz + 1 nodes)'),
  nt: z.number().int().positive().describe('Time steps (nt + 1 samples)'),
  reasons: z.array(z.string()).describe('Step-size rules that bounded Δt, the binding one first'),
  mapRows: z.number().int().positive(),
  mapCols: z.number().int().positive(),
  /** Time steps merged into one map row, and grid nodes into one map column. */
  mapRowSteps: z.number().int().positive(),
  mapColNodes: z.number().int().positive(),
  /** Steps actually sampled per map row (evenly spaced inside the row block). */
  mapSamplesPerRow: z.number().int().positive(),
  mapReduction: MapReduction,
  acousticMapUnits: z.literal('phonons/m').describe('|b|²/(ħω_s), summed over channels'),
})
export type ResultGrid = z.infer<typeof ResultGrid>

const nullableNumber = z.number().nullable()

/**
 * Why a figure is not given as a number. window-outside-run: the light it measures is expected (partly)
 * outside the simulated time; overlaps-pulse: another pulse's light arrives inside its window;
 * several-pulses: the port carries more than the one pulse the figure describes; other-waves: further waves
 * (shared/physics/wave-set.ts) trade light with the pair, so a figure of the pair alone does not apply.
 */
export const NOT_DETERMINED_CODES = ['window-outside-run', 'overlaps-pulse', 'several-pulses', 'other-waves'] as const
export const NotDetermined = z.object({
  /** The figure's key in ChannelFigures, or "energy" for an energy window. */
  figure: z.string(),
  code: z.enum(NOT_DETERMINED_CODES),
  /** What the user can read and act on. */
  message: z.string(),
})
export type NotDetermined = z.infer<typeof NotDetermined>

/** The window a figure is measured in: expected arrival of the light it refers to and that light's width. */
export const FigureWindow = z.object({
  arrivalNs: z.number(),
  fwhmNs: z.number(),
  startNs: z.number(),
  endNs: z.number(),
})
export type FigureWindow = z.infer<typeof FigureWindow>

export const PortEnergies = z.object({ pumpIn: z.number(), stokesIn: z.number(), pumpOut: z.number(), stokesOut: z.number() })

export const ChannelFigures = z.object({
  channel: z.number().int().nonnegative(),
  /** What the channel does (shared/physics/pulse-roles.ts); decides which figures apply. */
  scheme: z.enum(RUN_SCHEMES).default('other'),
  energyJ: PortEnergies,
  /** 10·log10(max P_s,out / max P_s,in); amplifier runs only. */
  peakStokesGainDb: nullableNumber,
  /** E_s,out/E_p,in as a fraction (for CW, P_s(0)/P_p(0)); amplifier and generator runs only. */
  reflectivity: nullableNumber,
  /** Centroid shift of output vs input power beyond the free transit time (ns). */
  pumpDelayNs: nullableNumber,
  stokesDelayNs: nullableNumber,
  pumpOutFwhmNs: nullableNumber,
  stokesOutFwhmNs: nullableNumber,
  /**
   * |(E_p,in − E_p,out − E_p,left) − r(E_s,out + E_s,left − E_s,in)| / (E_p,in + r E_s,in), light still in the
   * waveguide at the end counted as "left"; null when α > 0 (photons are then lost on purpose).
   */
  manleyRoweResidual: nullableNumber,
  /**
   * Storage runs (pulses labelled data and read): energy of the read-out field in the retrieval window as a
   * fraction of the data energy. The read-out field is the pump output minus that of the same run without
   * the read pulse, so data light that leaked through unstored is not counted.
   */
  retrievalEfficiency: nullableNumber,
  /** Data light reaching the pump output inside the retrieval window without being read out, as a fraction of the data energy (below 1e-9 given as 0). */
  leakThrough: nullableNumber.default(null),
  /** Phase of the retrieved pump-port field relative to the data pulse, in [0, 2π). */
  retrievedPhaseRad: nullableNumber,
  /** The retrieval window [startNs, endNs] (same as retrievalWindow). */
  readWindowNs: z.tuple([z.number(), z.number()]).nullable(),
  retrievalWindow: FigureWindow.nullable().default(null),
  /** Figures left null for a reason the user should see. */
  notDetermined: z.array(NotDetermined).default([]),
})
export type ChannelFigures = z.infer<typeof ChannelFigures>

export const WindowEnergy = z.object({
  label: z.string(),
  port: Port,
  startNs: z.number(),
  endNs: z.number(),
  /** Anchored windows: the pulse followed, its expected arrival at the port and the width used. */
  anchor: z.object({ pulse: z.string(), arrivalNs: z.number(), fwhmNs: z.number() }).nullable().default(null),
  energyJPerChannel: z.array(z.number()),
  /** Null when the window is not determined (see notDetermined). */
  energyJ: z.number().nullable(),
  notDetermined: NotDetermined.nullable().default(null),
})
export type WindowEnergy = z.infer<typeof WindowEnergy>

export const FiguresOfMerit = z.object({
  channels: z.array(ChannelFigures),
  windows: z.array(WindowEnergy),
  wallTimeS: z.number(),
  cellUpdatesPerS: z.number(),
  /** Discretisation error of every figure above, from a companion run on the grid with twice the step (figure-error.ts). */
  errorEstimate: FigureErrors.optional(),
  /** Runs with a co-propagating probe, further or forward resonances or a cascade (shared/physics/wave-set.ts). */
  waves: WaveFigures.optional(),
})
export type FiguresOfMerit = z.infer<typeof FiguresOfMerit>

export const SolverWarning = z.object({ code: z.string(), message: z.string() })
export type SolverWarning = z.infer<typeof SolverWarning>

/** The JSON part of a result: what manifest.json holds and the API stores. Arrays are described, not inlined. */
export const SimulationManifest = z.object({
  solverVersion: z.string(),
  status: RunStatus,
  message: z.string(),
  issues: z.array(z.object({ path: z.string(), message: z.string() })).default([]),
  warnings: z.array(SolverWarning),
  counters: RunCounters,
  grid: ResultGrid.nullable(),
  figures: FiguresOfMerit.nullable(),
  complexLayout: z.literal(COMPLEX_LAYOUT),
  arrays: z.array(ArrayDescriptor),
  /** The engine, thread count and interaction kernel that advanced the run (absent in runs stored before it was recorded). */
  kernel: KernelClass.optional(),
})
export type SimulationManifest = z.infer<typeof SimulationManifest>
