// What a run will cost before it starts: cells, steps, cell-updates, memory and expected time, and the
// refusal of runs over the limits with the knob to turn. Cost model: docs/numerics.md (N_ch·N_z·N_t·N_real),
// plus the error estimate's companion run on the grid with twice the step (about a quarter of the run).
import { storageForkStep, storageReferenceStartNs } from './pulse-roles'
import type { SimulationConfig } from './simulation-config'
import { planCoarseRun } from './error-estimate-plan'
import { MIN_TIME_STEP_PS } from './grid-limits'
import { usesWaveNetwork, waveSet } from './wave-set'
import { profileIsActive } from './longitudinal-profile'
import { describeKernel, type KernelClass } from './kernel-class'
import { speedOf, type SpeedCalibration, type TimeBasis } from './speed-calibration'

/** Grid counts as chosen by shared/physics/grid-step.ts. */
export interface GridCounts {
  dtS: number
  nz: number
  nt: number
  /** From chooseGrid: the step the binding rule asked for and the field it depends on (for the step floor). */
  binding?: { targetDtS: number; field: string; rule: string }
}

/**
 * Throughput of the SVEA scheme's TypeScript path on one idle core of the reference machine (cell-updates per
 * second): benchmarks/estimate-check.ts 2026-12-04 02:00 UTC, load average 0.55–0.99, measured 68.6 M/s (61–83
 * in earlier idle runs, benchmarks/README.md); a little under, so expected times err long. These benchmark
 * figures stand for an idle machine: they are what a server with no history of its own is told. A loaded
 * server's own measured speeds replace them (speed-calibration.ts). Slower options are factors of it.
 */
export const CELL_UPDATES_PER_S_SVEA = 60e6
/**
 * Relative speed of the WebAssembly step engine (solver/engine/) against the TypeScript fast path, for the
 * runs it covers (`wasmEngineCovers`); benchmark 2026-12-03, interleaved side by side (benchmarks/README.md):
 * 1.93–2.06×, and 1.82–2.02× on an idle machine. The factor stands for the engine the solver chooses by default; with SOLVER_ENGINE=ts the estimate
 * errs short by that much.
 */
export const SPEED_FACTOR_WASM_ENGINE = 2
/**
 * Relative speed of the profile kernel (per-node constants, solver/steppers/profile-kernel.ts) against the
 * TypeScript fast path; benchmark 2026-12-03, interleaved on one 1 km grid, machine loaded: 0.80. Profile runs
 * never use the WebAssembly engine.
 */
// estimate-check.ts 2026-12-04 02:00 UTC, idle, the 1 km sensing point with its maps and figures: 0.49.
export const SPEED_FACTOR_PROFILE = 0.55
/**
 * Relative speed with the second-order acoustic equation (2×2 propagator per cell), one channel, on its flat
 * kernel (solver/steppers/higher-order-kernel.ts) against the plain TypeScript path: benchmark 2026-12-03,
 * interleaved side by side (benchmarks/README.md, "Options on the fast path"), 0.61–0.69 at load average 2.5–4.9
 * (0.48–1.15 heavily loaded); a little under, so estimates err long. With Kerr (the same kernel) the product with
 * SPEED_FACTOR_KERR, 0.42, against 0.34–0.37 measured (benchmarks/option-pairs.ts, estimate-check.ts 2026-12-04 10:15
 * UTC, load 1.0: the estimate 0.88 of the measured time); several channels with the term (several-channel kernel):
 * 0.42 against 0.35–0.39.
 */
// estimate-check.ts 2026-12-04 02:00 UTC, idle: 0.69.
export const SPEED_FACTOR_HIGHER_ORDER = 0.65
/**
 * Relative speed with thermal noise (four normal deviates per cell and step by the ziggurat), one channel, on
 * its flat kernel (solver/steppers/svea-noise-kernel.ts) against the plain TypeScript path: benchmark
 * 2026-12-03, side by side, 0.37–0.44 at load average 2.5–4.9 (0.22–0.34 heavily loaded, before the last change of the
 * generator's fill). Several channels with noise run on the several-channel kernel: the product with
 * SPEED_FACTOR_SEVERAL_CHANNELS, 0.29, against 0.30–0.32 measured (and with Kerr, 0.19 against 0.23–0.24:
 * benchmarks/option-pairs.ts and estimate-check.ts 2026-12-04, the estimate 1.36 of the measured time there).
 */
// kerr-noise-kernels.ts 2026-12-04: 0.42–0.46; estimate-check.ts 02:00 UTC, idle: 0.48.
export const SPEED_FACTOR_NOISE = 0.45
/**
 * Relative speed with Kerr phases (one exchange in the first half step's frame and one rotation by the whole step's
 * phase, one division per cell: solver/steppers/kerr-phase.ts), on the WebAssembly engine's Kerr path against its
 * plain one: benchmarks/kerr-noise-kernels.ts 2026-12-04 04:30 UTC (benchmarks/README.md), 0.67–0.71 at load
 * average 0.7–0.9 (TypeScript kernels 0.62–0.70); estimate-check.ts 04:35 UTC, load 1.1: 0.65 (85.1 M/s against the
 * engine's 2 × 65.4). Before, with two half steps: 0.55–0.59. Every combination with Kerr has a flat kernel; Kerr
 * with noise on one channel, 0.35–0.40 of the plain TypeScript path (general kernel 0.12–0.14), where the product of
 * this factor and the noise factor, 0.29, errs long by 1.2–1.4×.
 */
export const SPEED_FACTOR_KERR = 0.65
/**
 * Two threads on one run (solver/engine/threaded-engine.ts): the engine's plain path with z in chunks shared by
 * the run's thread and one helper, taken automatically from THREAD_MIN_CELLS cells and THREAD_MIN_NODE_STEPS
 * node-steps when a core is idle. Relative speed against one thread of the same engine, `npm run bench --
 * --threads` 2026-12-03 at load average 2.5–3.5 (a core only partly free; benchmarks/README.md): 1.46–1.55 at
 * N_z = 8000–16000 through the driver (0.86–1.27 in a run while the other core was busier), 1.56–1.73 for the
 * engine alone. With one barrier per step and the maps sampled in the phase, 2026-12-04 with both cores free:
 * 1.71–1.78 at N_z = 4000 and 1.57–1.89 at 8000 through the driver; the low end of those. The estimate assumes a
 * free core; on a busy machine the run keeps one thread and the benchmark-figure estimate errs short by this
 * factor (the calibrated estimate, speed-calibration.ts, learns the server's own figure).
 */
export const SPEED_FACTOR_TWO_THREADS = 1.6
/**
 * Shortest grid (cells) at which two threads are taken: below it the per-step barrier costs more than it saves.
 * With one barrier per step and the maps sampled in the phase, measured 2026-12-04 with both cores free
 * (benchmarks/README.md): 1.71–1.72× at N_z = 4000 through the driver, 1.06–1.46× at 1000–2000.
 */
export const THREAD_MIN_CELLS = 4000
/** Node-steps below which a helper thread's start (tens of milliseconds) is not paid back. */
export const THREAD_MIN_NODE_STEPS = 2e7

/** Runs the automatic choice gives two threads when a core is idle (the rule of solver/engine/thread-choice.ts). */
export function twoThreadsApply(config: SimulationConfig, grid: GridCounts): boolean {
  const o = config.options
  return wasmEngineCovers(config) && !o.kerr && !o.acousticAdvection && grid.nz >= THREAD_MIN_CELLS && (grid.nz + 1) * (grid.nt + 1) >= THREAD_MIN_NODE_STEPS
}

/** Optical waves and acoustic fields of the plain pump–Stokes scheme: pump, Stokes and one acoustic field. */
export const PLAIN_WAVES = 2
export const PLAIN_FIELDS = 1
/**
 * Relative speed of the multi-wave solver (solver/network/) per cell-update at the plain scheme's three
 * envelopes; its throughput then falls as 3/(waves + fields), each envelope adding one propagation and its
 * couplings. Measured (benchmarks/README.md, "Multi-wave solver", machine loaded): 0.25–0.99 of the plain
 * TypeScript path per envelope, lowest with several processes per field; the low end, so estimates err long.
 * benchmarks/estimate-check.ts 2026-12-04 (one forward resonance, side by side with the plain path): 0.27 and 0.31.
 * The step-mean with the sources' change (steppers/step-mean.ts) costs the multi-wave kernel three more passes
 * over its arrays: the same forward-resonance run took 4.9 s of CPU against 3.0 s before it (1.63×, two runs
 * each, 2026-12-04), so 0.25/1.63.
 */
// estimate-check.ts 2026-12-04 02:00 UTC, idle, one forward resonance (6 envelopes): 1e8 cell-updates in 15.4 s, 6.5 M/s,
// 0.22 of the base rate after the 3/6 scaling above; 0.18 keeps the estimate long by about 1.2 there.
export const SPEED_FACTOR_WAVE_NETWORK = 0.18
/**
 * Relative speed of several channels and no option against the TypeScript plain path, per cell-update (one
 * node of one channel in one step). They run on the flat several-channel kernel (solver/steppers/
 * svea-channels-kernel.ts): benchmarks/option-kernels.ts 2026-12-04 (benchmarks/README.md), 0.76–0.80 with two
 * channels and 0.61 with four at load average 1.6–2.2; the four-channel figure, so estimates err long with two.
 * Through the general kernel, before that kernel: 0.20–0.31 (benchmarks/estimate-check.ts, load average 4–5).
 * The same kernel runs several channels with Kerr, noise or the higher-order term; the estimate multiplies their factors.
 */
// estimate-check.ts 2026-12-04 02:00 UTC, idle, two channels: 0.74.
export const SPEED_FACTOR_SEVERAL_CHANNELS = 0.65

/**
 * Runs the WebAssembly engine computes: one channel of the plain pump–Stokes pair, SVEA, no noise, Kerr on or
 * off, a uniform waveguide (a longitudinal profile has its own kernel) (solver/engine/wasm-engine.ts).
 */
export function wasmEngineCovers(config: SimulationConfig): boolean {
  const o = config.options
  return config.channels.length === 1 && !profileIsActive(config.waveguide.profile) && !usesWaveNetwork(config) && !o.higherOrderAcoustic && !o.noise.enabled
}

/** Optical waves and acoustic fields a run integrates per cell (shared/physics/wave-set.ts). */
export function envelopeCounts(config: SimulationConfig): { waves: number; fields: number } {
  if (!usesWaveNetwork(config)) return { waves: PLAIN_WAVES, fields: PLAIN_FIELDS }
  const set = waveSet(config)
  return { waves: set.waves.length, fields: set.fields.length }
}

/**
 * The kernel class the solver will choose for this run (solver/driver.ts; threads as engine/thread-choice.ts
 * chooses them with a core free): the class whose measured speed the estimate uses.
 */
export function predictKernel(config: SimulationConfig, grid: GridCounts, engine: 'auto' | 'ts' = 'auto'): KernelClass {
  const o = config.options
  // Kerr switched on with n₂ = 0 computes nothing: the solver takes the kernels without it.
  const kerr = o.kerr && config.waveguide.kerrN2M2PerW > 0
  if (usesWaveNetwork(config)) return { engine: 'ts', threads: 1, path: 'network' }
  if (profileIsActive(config.waveguide.profile)) return { engine: 'ts', threads: 1, path: 'profile' }
  if (wasmEngineCovers(config)) {
    // The same runs on the TypeScript engine take its flat plain or Kerr kernel, on one thread.
    if (engine === 'ts') return { engine: 'ts', threads: 1, path: kerr ? 'kerr' : 'plain' }
    return { engine: 'wasm', threads: twoThreadsApply(config, grid) ? 2 : 1, path: kerr ? 'kerr' : 'plain' }
  }
  // One flat kernel per option, one for Kerr with thermal noise, one for the higher-order term with Kerr and noise
  // each on or off, one for several channels with every option on or off (classed by its options).
  const noise = o.noise.enabled
  if (config.channels.length > 1) {
    if (o.higherOrderAcoustic) return { engine: 'ts', threads: 1, path: 'channels-higher-order' }
    return { engine: 'ts', threads: 1, path: kerr ? (noise ? 'channels-kerr-noise' : 'channels-kerr') : noise ? 'channels-noise' : 'channels' }
  }
  if (o.higherOrderAcoustic) return { engine: 'ts', threads: 1, path: kerr ? 'higher-order-kerr' : 'higher-order' }
  // One channel the engine does not cover, without the higher-order term: thermal noise is on.
  return { engine: 'ts', threads: 1, path: kerr ? 'kerr-noise' : 'noise' }
}

/**
 * Spread of the benchmark-based time: on an idle core the plain path ran at 68–83 M/s, about twice
 * CELL_UPDATES_PER_S_SVEA, and with the machine loaded down to 12 M/s, about a third of it (benchmarks/README.md).
 */
export const BENCHMARK_FAST_FACTOR = 0.5
export const BENCHMARK_SLOW_FACTOR = 3
/**
 * Least spread of a time from measured speeds: on this shared machine the estimate from three earlier runs of
 * the same kind was 0.71–1.59 of the measured time (benchmarks/estimate-check.ts, load average 2.5–5, benchmarks/README.md),
 * as the load changed between the runs and the one estimated.
 */
export const RECENT_RUNS_MARGIN = 1.6

/** The basis in a sentence for the user; `seconds` formats a duration. */
export function timeBasisSentence(b: TimeBasis, seconds: (s: number) => string): string {
  const range = `between ${seconds(b.fastSeconds)} and ${seconds(b.slowSeconds)}`
  const kind = describeKernel(b.kernel)
  if (b.source === 'recent-runs') return `Measured on this server: the speed of its last ${b.runs} runs of the same kind (${kind}); ${range}.`
  return `From the benchmark figures, since this server has not finished enough runs of this kind (${kind}) yet: ${range}, depending on how busy the server is.`
}

/**
 * Cell-updates per second for this run and where the figure comes from: the server's measured speed of the
 * predicted class (or of one thread when it has no history with two, since a busy server gives a run one
 * thread), else the benchmark figures.
 */
function speedFor(config: SimulationConfig, grid: GridCounts, calibration: SpeedCalibration | null | undefined) {
  const engine = calibration?.engine ?? 'auto'
  const kernel = predictKernel(config, grid, engine)
  const { waves, fields } = envelopeCounts(config)
  const candidates = kernel.threads > 1 ? [kernel, { ...kernel, threads: 1 }] : [kernel]
  const measured = candidates.map((k) => speedOf(calibration, k)).filter((k) => k !== null)
  // Measured speeds count plain-scheme cell-updates (speed-calibration.ts): scaled to this run's envelopes.
  const perCell = (PLAIN_WAVES + PLAIN_FIELDS) / (waves + fields)
  if (measured.length > 0) {
    const m = measured.reduce((a, b) => (b.newestAt > a.newestAt ? b : a))
    const rate = m.cellUpdatesPerS * perCell
    // The runs' own spread, but never narrower than the load's swing between runs.
    const fast = Math.max(m.fastPerS * perCell, rate * RECENT_RUNS_MARGIN)
    const slow = Math.min(m.slowPerS * perCell, rate / RECENT_RUNS_MARGIN)
    return { rate, fast, slow, source: 'recent-runs' as const, runs: m.runs, kernel: m.kernel }
  }
  const rate = benchmarkSpeed(config, grid, engine)
  return { rate, fast: rate / BENCHMARK_FAST_FACTOR, slow: rate / BENCHMARK_SLOW_FACTOR, source: 'benchmark' as const, runs: 0, kernel }
}

/** The benchmark figures: the plain path's speed times the factor of every option, engine and thread count above. */
export function benchmarkSpeed(config: SimulationConfig, grid: GridCounts, engine: 'auto' | 'ts' = 'auto'): number {
  const wasm = engine !== 'ts' && wasmEngineCovers(config)
  const o = config.options
  const { waves, fields } = envelopeCounts(config)
  const network = waves !== PLAIN_WAVES || fields !== PLAIN_FIELDS
  return (
    CELL_UPDATES_PER_S_SVEA *
    (network ? (SPEED_FACTOR_WAVE_NETWORK * (PLAIN_WAVES + PLAIN_FIELDS)) / (waves + fields) : 1) *
    (o.higherOrderAcoustic ? SPEED_FACTOR_HIGHER_ORDER : 1) *
    (o.noise.enabled ? SPEED_FACTOR_NOISE : 1) *
    (o.kerr && config.waveguide.kerrN2M2PerW > 0 ? SPEED_FACTOR_KERR : 1) *
    (config.channels.length > 1 && !network ? SPEED_FACTOR_SEVERAL_CHANNELS : 1) *
    (profileIsActive(config.waveguide.profile) ? SPEED_FACTOR_PROFILE : wasm ? SPEED_FACTOR_WASM_ENGINE : 1) *
    (wasm && twoThreadsApply(config, grid) ? SPEED_FACTOR_TWO_THREADS : 1)
  )
}

/**
 * Bytes of solver state per cell and channel: pump, Stokes and acoustic envelopes plus their predictor copies,
 * complex float64 (6 × 16 B), and ∂b/∂t with its copy when the higher-order term is on (2 × 16 B).
 */
export const STATE_BYTES_PER_CELL = 96
export const STATE_BYTES_PER_CELL_HIGHER_ORDER = 32
/** Full-resolution complex traces per channel: pump and Stokes in and out (4 × complex float64 per step). */
export const TRACE_BYTES_PER_STEP = 4 * 16
/** Pump power, Stokes power and acoustic energy maps, float32. */
export const MAPS_PER_CHANNEL = 3
export const MAP_BYTES_PER_PIXEL = 4

export interface ResourceLimits {
  maxCellUpdates: number
  maxMemoryBytes: number
}

export const DEFAULT_RESOURCE_LIMITS: ResourceLimits = { maxCellUpdates: 2e10, maxMemoryBytes: 2 * 1024 ** 3 }

/** Memory counts the run's own arrays, not the runtime (Node itself takes ~100 MiB RSS, benchmarks/README.md). */
export interface ResourceEstimate {
  channels: number
  /** Optical waves and acoustic fields per cell (2 and 1 for the plain pump–Stokes pair). */
  waves: number
  acousticFields: number
  realisations: number
  cells: number
  steps: number
  timeStepPs: number
  /** Node-steps of the run and of its error-estimate companion together (the companion's share below). */
  cellUpdates: number
  /** The companion run on the grid with twice the step (shared/physics/error-estimate-plan.ts), or null with the reason. */
  errorEstimate: { cells: number; steps: number; timeStepPs: number; cellUpdates: number } | null
  errorEstimateSkipped: string | null
  /** errorEstimate: the companion's own arrays, allocated while the run's are still held. */
  memoryBytes: { state: number; maps: number; traces: number; errorEstimate: number; total: number }
  /** Throughput assumed for this option set (cell-updates per second). */
  cellUpdatesPerS: number
  expectedSeconds: number
  /** Where cellUpdatesPerS comes from, and the range of the expected time. */
  timeBasis: TimeBasis
  /** Inputs the refusal message needs to propose new values. */
  windowNs: number
  lengthM: number
  maxTimeStepPs?: number
  /** The step the binding rule asked for (ps) and the config field it depends on. */
  stepBinding?: { targetPs: number; field: string; rule: string }
}

/** calibration: this server's measured speeds (speed-calibration.ts); without it, the benchmark figures. */
export function estimateResources(config: SimulationConfig, grid: GridCounts, realisations = 1, calibration?: SpeedCalibration | null): ResourceEstimate {
  const channels = config.channels.length
  const o = config.options
  const main = runCost(config, grid, realisations)
  const plan = planCoarseRun(config, grid)
  const companion = plan.ok ? runCost(plan.config, plan.grid, realisations) : null
  const cellUpdates = main.cellUpdates + (companion?.cellUpdates ?? 0)
  const { state, maps, traces } = main
  const errorEstimateBytes = companion ? companion.state + companion.maps + companion.traces : 0
  const { waves, fields } = envelopeCounts(config)
  const speed = speedFor(config, grid, calibration)
  const cellUpdatesPerS = speed.rate
  return {
    channels,
    waves,
    acousticFields: fields,
    realisations,
    cells: grid.nz,
    steps: grid.nt,
    timeStepPs: grid.dtS * 1e12,
    cellUpdates,
    errorEstimate: plan.ok ? { cells: plan.grid.nz, steps: plan.grid.nt, timeStepPs: plan.grid.dtS * 1e12, cellUpdates: companion!.cellUpdates } : null,
    errorEstimateSkipped: plan.ok ? null : plan.reason,
    memoryBytes: { state, maps, traces, errorEstimate: errorEstimateBytes, total: state + maps + traces + errorEstimateBytes },
    cellUpdatesPerS,
    expectedSeconds: cellUpdates / cellUpdatesPerS,
    timeBasis: { source: speed.source, runs: speed.runs, kernel: speed.kernel, fastSeconds: cellUpdates / speed.fast, slowSeconds: cellUpdates / speed.slow },
    windowNs: config.windowNs,
    lengthM: config.waveguide.lengthM,
    // The second-order acoustic equation needs Δt ≤ 1/(20 ν_B) (docs/model.md, options).
    maxTimeStepPs: o.higherOrderAcoustic ? 1000 / (20 * config.waveguide.brillouinShiftGHz) : undefined,
    stepBinding: grid.binding ? { targetPs: grid.binding.targetDtS * 1e12, field: grid.binding.field, rule: grid.binding.rule } : undefined,
  }
}

/** Node-steps and arrays of one run on one grid. */
function runCost(config: SimulationConfig, grid: GridCounts, realisations: number) {
  const channels = config.channels.length
  // Counted like the solver's own counter: every node (nz + 1) at every time sample (nt + 1).
  const nodes = grid.nz + 1
  const samples = grid.nt + 1
  // State, traces and maps scale with the envelopes per cell: 2 waves and 1 field in the plain scheme.
  const { waves, fields } = envelopeCounts(config)
  const envelopeRatio = (waves + fields) / (PLAIN_WAVES + PLAIN_FIELDS)
  const stateBytesPerCell =
    STATE_BYTES_PER_CELL * envelopeRatio + (config.options.higherOrderAcoustic ? STATE_BYTES_PER_CELL_HIGHER_ORDER : 0)
  // A storage run also integrates its reference without the read pulse from the read pulse's arrival on,
  // with traces of its own (solver/storage-reference.ts).
  const startNs = storageReferenceStartNs(config)
  const referenceSamples = startNs === null ? 0 : Math.max(0, samples - storageForkStep(startNs, grid.dtS))
  const referenceTraces = startNs === null ? 0 : channels * samples * TRACE_BYTES_PER_STEP
  return {
    cellUpdates: channels * realisations * nodes * (samples + referenceSamples),
    state: channels * nodes * stateBytesPerCell * (startNs === null ? 1 : 2),
    maps: channels * MAPS_PER_CHANNEL * envelopeRatio * Math.min(samples, config.grid.mapRows) * Math.min(nodes, config.grid.mapCols) * MAP_BYTES_PER_PIXEL,
    // Axes (t and z, float64) count with the traces.
    traces: channels * samples * TRACE_BYTES_PER_STEP * (waves / PLAIN_WAVES) + referenceTraces + 8 * (samples + nodes),
  }
}

/** fields: the config fields to change, when one can be named. */
export type LimitCheck = { ok: true } | { ok: false; message: string; reasons: string[]; fields?: Array<{ path: string; message: string }> }

const sig = (x: number) => x.toPrecision(3)
const gib = (bytes: number) => `${sig(bytes / 1024 ** 3)} GiB`

/**
 * A grid the solver cannot take: a step below MIN_TIME_STEP_PS, or counts that overflowed (an extreme input
 * makes a rule ask for Δt → 0, and N_z, N_t → ∞). Refused on the field the binding rule depends on.
 */
function checkStepFloor(e: ResourceEstimate): LimitCheck | null {
  const targetPs = e.stepBinding?.targetPs ?? e.timeStepPs
  // A relative margin: a window at its minimum asks for exactly the floor, give or take rounding.
  const belowFloor = !(targetPs >= MIN_TIME_STEP_PS * (1 - 1e-9))
  const counts = [e.cells, e.steps, e.timeStepPs, e.cellUpdates, e.expectedSeconds, e.memoryBytes.total]
  if (!belowFloor && counts.every(Number.isFinite)) return null
  const rule = e.stepBinding ? ` (${e.stepBinding.rule})` : ''
  const message = `The step rules ask for a time step of ${sig(targetPs)} ps${rule}, below the smallest step the solver takes, ${MIN_TIME_STEP_PS} ps; change this value`
  return { ok: false, message, reasons: [message], fields: [{ path: e.stepBinding?.field ?? 'grid.timeStepPs', message }] }
}

/** Refuses an estimate over the limits; the message says which knob to turn and by how much. */
export function checkLimits(e: ResourceEstimate, limits: ResourceLimits = DEFAULT_RESOURCE_LIMITS): LimitCheck {
  const floor = checkStepFloor(e)
  if (floor) return floor
  const reasons: string[] = []
  if (e.cellUpdates > limits.maxCellUpdates) {
    const f = e.cellUpdates / limits.maxCellUpdates
    // Cost ∝ N_ch · L · T_window / Δt² (N_z ∝ L/Δt, N_t ∝ T/Δt).
    const knobs = [`shorten the window from ${sig(e.windowNs)} ns to ≤ ${sig(e.windowNs / f)} ns`]
    const coarserPs = e.timeStepPs * Math.sqrt(f)
    if (e.maxTimeStepPs === undefined || coarserPs <= e.maxTimeStepPs) {
      knobs.push(`use a coarser time step, ≥ ${sig(coarserPs)} ps instead of ${sig(e.timeStepPs)} ps`)
    }
    knobs.push(`use a shorter waveguide, ≤ ${sig(e.lengthM / f)} m instead of ${sig(e.lengthM)} m`)
    const fewer = Math.floor(e.channels / f)
    if (fewer >= 1 && fewer < e.channels) knobs.push(`use ${fewer} channel${fewer > 1 ? 's' : ''} instead of ${e.channels}`)
    const companion = e.errorEstimate?.cellUpdates ?? 0
    if (companion > 0 && e.cellUpdates - companion <= limits.maxCellUpdates) knobs.push('switch off the error estimate in the run settings')
    reasons.push(
      `The run needs ${sig(e.cellUpdates)} cell-updates (${e.channels} channel(s) × ${e.cells} cells × ${e.steps} steps` +
        `${e.realisations > 1 ? ` × ${e.realisations} realisations` : ''}${companion > 0 ? `, plus ${sig(companion)} for the error estimate on the grid with twice the step` : ''}), ` +
        `over the limit of ${sig(limits.maxCellUpdates)}: ${knobs.join('; or ')}.`,
    )
  }
  const m = e.memoryBytes
  if (m.total > limits.maxMemoryBytes) {
    const largest = m.traces >= m.state && m.traces >= m.maps ? 'traces' : m.state >= m.maps ? 'state' : 'maps'
    const knob = {
      traces: 'the full-resolution traces dominate: shorten the window or use a coarser time step',
      state: 'the grid state dominates: use a shorter waveguide or a coarser time step',
      maps: 'the space–time maps dominate: keep fewer map rows and columns',
    }[largest]
    reasons.push(`The run needs about ${gib(m.total)} of memory, over the limit of ${gib(limits.maxMemoryBytes)}; ${knob}.`)
  }
  return reasons.length === 0 ? { ok: true } : { ok: false, message: reasons.join(' '), reasons }
}
