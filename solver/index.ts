/*
 * Public door of the solver: simulate(config, options) → SimulationResult.
 *
 * Complex arrays are interleaved Float64Array (re, im) pairs: element k is (a[2k], a[2k+1]), optical
 * envelopes in √W so |A|² is power in W (COMPLEX_LAYOUT in shared/physics/simulation-result.ts). Time samples are
 * t_n = n·Δt, n = 0..nt; z nodes are z_j = j·Δz, j = 0..nz. Maps are row-major [time rows][z cols].
 */
import { SimulationConfig } from '@shared/physics/simulation-config'
import { COMPLEX_LAYOUT, type ArrayDescriptor, type ChannelFigures, type FiguresOfMerit, type ResultGrid, type RunStatus, type SimulationManifest, type SolverWarning } from '@shared/physics/simulation-result'
import { SOLVER_LIMITS, SimulationRun, planGrid } from './driver'
import { usesWaveNetwork } from '@shared/physics/wave-set'
import type { KernelClass } from '@shared/physics/kernel-class'
import { NetworkRun } from './network/network-run'
import { planCompanion } from './error-estimate-run'
import type { ChannelTraces } from './observers/figures-of-merit'
import { postRunWarnings } from './observers/warnings'
import { portSpectra, portTracesOf } from './observers/port-spectra'
import { ENGINE_CHOICES, EngineUnavailableError, type EngineChoice } from './engine/wasm-engine'
import { ThreadCountError, type ThreadChoice } from './engine/thread-choice'
import { CoreLease } from './engine/core-lease'

export const SOLVER_VERSION = '0.1.0'
export { SOLVER_LIMITS, SimulationRun, ENGINE_CHOICES, CoreLease, type EngineChoice }
export type { ChannelTraces, ChannelFigures, FiguresOfMerit, SimulationManifest, SolverWarning }
// What the server needs to store a run and write its files (the server reaches the solver only here).
export { arrayFileName, buildRunManifest, npyDescrOf, MANIFEST_FILE, type RunManifest, type RunTimings, type StoredArray } from './io/manifest'
export { npyHeader, type NpyDescr } from './io/npy'

/** A new block of map rows, handed out as soon as it is computed (rows are time, cols are z). */
export interface MapFrame {
  rowStart: number
  rowCount: number
  cols: number
  /** Row-major blocks of rowCount × cols. acousticPhononsPerM is |b|²/(ħω_s), summed over channels. */
  maps: { pumpPowerW: Float32Array; stokesPowerW: Float32Array; acousticPhononsPerM: Float32Array }
}

export interface SimulateOptions {
  /** Fraction done in [0, 1]; called at least every 1 % of the run. */
  onProgress?: (fraction: number) => void
  onFrame?: (frame: MapFrame) => void
  /** Stops the run within ~100 ms (simulate yields to the event loop every yieldEveryMs). */
  signal?: AbortSignal
  /** Polled between chunks; for worker threads watching a SharedArrayBuffer flag. */
  shouldAbort?: () => boolean
  /** Time between yields to the event loop in simulate() (ms). Default 25. */
  yieldEveryMs?: number
  /** Testing aid: use the general kernel even where the single-channel fast path applies. */
  forceGeneralKernel?: boolean
  /** 'auto' (default): the WebAssembly engine where it covers the options, else TypeScript; 'ts' or 'wasm' to force one. */
  engine?: EngineChoice
  /** 'auto' (default): two threads on a large plain run when the machine has a second core; 1 or 2 to force (engine/thread-choice.ts). */
  threads?: ThreadChoice
  /** The server's count of computing threads per core (engine/core-lease.ts): a helper is taken only from a free core. */
  coreLease?: CoreLease
}

export interface SimulationResult {
  status: RunStatus
  message: string
  manifest: SimulationManifest
  /** Every array of manifest.arrays, by name. */
  arrays: Record<string, Float64Array | Float32Array>
  /** The same buffers, typed: per-channel port traces (interleaved complex, √W). */
  channels: ChannelTraces[]
  timeNs: Float64Array
  zM: Float64Array
  maps: { pumpPowerW: Float32Array; stokesPowerW: Float32Array; acousticPhononsPerM: Float32Array; timeNs: Float64Array; zM: Float64Array } | null
  /** b(z) at the end per channel, interleaved complex in √(J/m). */
  finalAcoustic: Float64Array[]
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now())
const yieldToLoop = () => new Promise<void>((resolve) => (typeof setImmediate === 'function' ? setImmediate(resolve) : setTimeout(resolve, 0)))

/** Target wall time of one chunk of steps between abort checks (ms). */
const CHUNK_MS = 5

/** The plain pump–Stokes run, or the multi-wave run when the configuration has further waves or fields. */
type Run = SimulationRun | NetworkRun

interface Prepared {
  run: Run | null
  failure: SimulationResult | null
}

function prepare(input: unknown, opts: SimulateOptions): Prepared {
  const parsed = SimulationConfig.safeParse(input)
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
    return { run: null, failure: failed('The configuration is invalid: ' + issues.map((i) => `${i.path}: ${i.message}`).join('; '), issues) }
  }
  const config = parsed.data
  const grid = planGrid(config)
  const nodes = grid.nz + 1
  const nCh = config.channels.length
  const problems: { path: string; message: string }[] = []
  if (nodes * nCh > SOLVER_LIMITS.maxNodes) problems.push({ path: 'grid.timeStepPs', message: `${nodes * nCh} grid nodes exceed ${SOLVER_LIMITS.maxNodes}; use a larger time step or a shorter waveguide` })
  if (64 * (grid.nt + 1) * nCh > SOLVER_LIMITS.maxTraceBytes) problems.push({ path: 'windowNs', message: `${grid.nt + 1} time samples are too many to keep at full resolution; shorten the window or use a larger time step` })
  if (nodes * nCh * (grid.nt + 1) > SOLVER_LIMITS.maxCellUpdates) problems.push({ path: 'windowNs', message: 'The run is too large; shorten the window or use a larger time step' })
  if (![grid.dtS, grid.dzM].every(Number.isFinite) || grid.dtS <= 0) problems.push({ path: 'grid', message: 'No valid grid could be chosen for this configuration' })
  if (problems.length > 0) return { run: null, failure: failed('The run exceeds the solver limits', problems) }
  try {
    if (usesWaveNetwork(config)) {
      if (typeof opts.threads === 'number' && opts.threads > 1) throw new ThreadCountError('Two threads compute the plain pump–Stokes pair only; co-propagating probes, further or forward resonances and cascades run on one thread')
      if (opts.engine === 'wasm') throw new EngineUnavailableError('The WebAssembly engine computes the plain pump–Stokes pair only; co-propagating probes, further or forward resonances and cascades run in TypeScript')
      return { run: new NetworkRun(config, grid), failure: null }
    }
    return { run: new SimulationRun(config, grid, { forceGeneralKernel: opts.forceGeneralKernel ?? false, engine: opts.engine, threads: opts.threads, coreLease: opts.coreLease }), failure: null }
  } catch (err) {
    if (err instanceof ThreadCountError) return { run: null, failure: failed(err.message, [{ path: 'threads', message: 'choose one thread or the automatic choice for this configuration' }]) }
    if (err instanceof EngineUnavailableError) return { run: null, failure: failed(err.message, [{ path: 'engine', message: 'choose the TypeScript engine (ts) or the automatic choice (auto) for this configuration' }]) }
    throw err
  }
}

function failed(message: string, issues: { path: string; message: string }[] = []): SimulationResult {
  const manifest: SimulationManifest = {
    solverVersion: SOLVER_VERSION,
    status: 'failed',
    message,
    issues,
    warnings: [],
    counters: { steps: 0, cellUpdates: 0, wallTimeS: 0, cellUpdatesPerS: 0 },
    grid: null,
    figures: null,
    complexLayout: COMPLEX_LAYOUT,
    arrays: [],
  }
  return { status: 'failed', message, manifest, arrays: {}, channels: [], timeNs: new Float64Array(0), zM: new Float64Array(0), maps: null, finalAcoustic: [] }
}

/** Drives a prepared run; `pause` is awaited between chunks (a no-op in the synchronous form). */
class Loop {
  private lastProgress = -1
  private framedRows = 0
  private readonly chunkLimit: number
  private chunk: number
  readonly t0 = now()

  constructor(
    readonly run: Run,
    readonly opts: SimulateOptions,
  ) {
    const total = run.model.nt + 1
    this.chunkLimit = Math.max(1, Math.floor(total / 100))
    this.chunk = Math.max(1, Math.min(this.chunkLimit, Math.floor(2e4 / (run.model.nodes * run.model.nCh))))
  }

  aborted(): boolean {
    return (this.opts.signal?.aborted ?? false) || (this.opts.shouldAbort?.() ?? false)
  }

  /** One chunk; returns a failure message or null. */
  chunkStep(): string | null {
    const from = this.run.n
    const t = now()
    this.run.advance(this.chunk)
    const dt = now() - t
    // Aim each chunk at CHUNK_MS, never more than 1 % of the run (progress granularity).
    const perStep = dt / Math.max(1, this.run.n - from)
    if (perStep > 0) this.chunk = Math.max(1, Math.min(this.chunkLimit, Math.floor(CHUNK_MS / perStep)))
    if (!this.run.isFinite(from)) return 'The integration produced non-finite values (overflow); check powers and the time step'
    // Every chunk is ≤ 1 % of the run, so reporting each one meets the 1 % promise; callers throttle.
    const fraction = this.run.n / (this.run.model.nt + 1)
    if (fraction > this.lastProgress) {
      this.lastProgress = fraction
      this.opts.onProgress?.(fraction)
    }
    return null
  }

  emitFrame(): void {
    const maps = this.run.maps
    const rows = maps.rowsDone - this.framedRows
    if (rows <= 0 || !this.opts.onFrame) return
    const cols = maps.layout.cols
    const a = this.framedRows * cols
    const b = maps.rowsDone * cols
    this.opts.onFrame({
      rowStart: this.framedRows,
      rowCount: rows,
      cols,
      maps: { pumpPowerW: maps.pumpPowerW.slice(a, b), stokesPowerW: maps.stokesPowerW.slice(a, b), acousticPhononsPerM: maps.acousticPhononsPerM.slice(a, b) },
    })
    this.framedRows = maps.rowsDone
  }

  finish(status: RunStatus, message: string): SimulationResult {
    // A stopped or failed run ends its helper threads here (a finished one has already).
    if (this.run instanceof SimulationRun) this.run.close()
    this.emitFrame()
    return assemble(this.run, status, message, (now() - this.t0) / 1000)
  }
}

/**
 * Runs the whole simulation, yielding to the event loop every `yieldEveryMs` so `signal` can stop it; then,
 * unless switched off, the companion run on the grid with twice the step for the error estimate.
 */
export async function simulate(config: SimulationConfig, opts: SimulateOptions = {}): Promise<SimulationResult> {
  const plan = planCompanion(config, opts)
  const fine = await simulateOne(config, plan.fineOpts)
  const companion = plan.companionFor(fine)
  return withPortSpectra(plan.finish(fine, companion ? await simulateOne(companion.config, companion.opts) : null))
}

async function simulateOne(config: SimulationConfig, opts: SimulateOptions): Promise<SimulationResult> {
  const { run, failure } = prepare(config, opts)
  if (!run) return failure!
  const loop = new Loop(run, opts)
  const yieldMs = opts.yieldEveryMs ?? 25
  let lastYield = now()
  while (!run.done) {
    if (loop.aborted()) return loop.finish('aborted', `Stopped at t = ${(run.n * run.model.dtS * 1e9).toFixed(3)} ns`)
    const err = loop.chunkStep()
    if (err) return loop.finish('failed', err)
    if (now() - lastYield >= yieldMs) {
      loop.emitFrame()
      await yieldToLoop()
      lastYield = now()
    }
  }
  return loop.finish('finished', 'Finished')
}

/** The same run (and companion) without yielding: for worker threads, which poll `shouldAbort` instead. */
export function simulateSync(config: SimulationConfig, opts: SimulateOptions = {}): SimulationResult {
  const plan = planCompanion(config, opts)
  const fine = simulateSyncOne(config, plan.fineOpts)
  const companion = plan.companionFor(fine)
  return withPortSpectra(plan.finish(fine, companion ? simulateSyncOne(companion.config, companion.opts) : null))
}

function simulateSyncOne(config: SimulationConfig, opts: SimulateOptions): SimulationResult {
  const { run, failure } = prepare(config, opts)
  if (!run) return failure!
  const loop = new Loop(run, opts)
  let lastFrame = now()
  while (!run.done) {
    if (loop.aborted()) return loop.finish('aborted', `Stopped at t = ${(run.n * run.model.dtS * 1e9).toFixed(3)} ns`)
    const err = loop.chunkStep()
    if (err) return loop.finish('failed', err)
    if (now() - lastFrame >= (opts.yieldEveryMs ?? 25)) {
      loop.emitFrame()
      lastFrame = now()
    }
  }
  return loop.finish('finished', 'Finished')
}

/** A finished run with the power spectrum of every optical port trace among its arrays (observers/port-spectra.ts). */
function withPortSpectra(r: SimulationResult): SimulationResult {
  if (r.status !== 'finished' || !r.manifest.grid) return r
  const spectra = portSpectra(portTracesOf(r.manifest.arrays, r.arrays, r.timeNs.length), r.manifest.grid.dtS)
  if (spectra.length === 0) return r
  const arrays = { ...r.arrays, ...Object.fromEntries(spectra.map((s) => [s.name, s.data])) }
  return { ...r, arrays, manifest: { ...r.manifest, arrays: [...r.manifest.arrays, ...spectra.map((s) => ({ name: s.name, ...s.descriptor }))] } }
}

function assemble(run: Run, status: RunStatus, message: string, wallTimeS: number): SimulationResult {
  const m = run.model
  const L = run.maps.layout
  const cellUpdates = run.cellUpdates
  const figures = status === 'finished' ? run.figures(wallTimeS) : null
  const warnings = [...run.warnings, ...(figures ? postRunWarnings(figures) : [])]
  const { timeNs, zM } = run
  const mapTimeNs = new Float64Array(L.rows)
  for (let r = 0; r < L.rows; r++) mapTimeNs[r] = Math.min(m.nt, (r + 0.5) * L.rowSteps - 0.5) * m.dtS * 1e9
  const mapZM = new Float64Array(L.cols)
  for (let c = 0; c < L.cols; c++) mapZM[c] = Math.min(m.nz, (c + 0.5) * L.colNodes - 0.5) * m.dzM
  const finalAcoustic = run.config.channels.map((_, k) => {
    const a = new Float64Array(2 * m.nodes)
    for (let j = 0; j < m.nodes; j++) (a[2 * j] = run.state.bRe[k * m.nodes + j]), (a[2 * j + 1] = run.state.bIm[k * m.nodes + j])
    return a
  })
  const arrays: Record<string, Float64Array | Float32Array> = {}
  const descriptors: ArrayDescriptor[] = []
  const add = (name: string, data: Float64Array | Float32Array, d: Omit<ArrayDescriptor, 'name'>) => {
    arrays[name] = data
    descriptors.push({ name, ...d })
  }
  const nT = m.nt + 1
  add('time_ns', timeNs, { dtype: 'f8', shape: [nT], units: 'ns', description: 'Time samples t_n = n·Δt of every trace' })
  add('z_m', zM, { dtype: 'f8', shape: [m.nodes], units: 'm', description: 'Grid nodes z_j = j·Δz' })
  run.traces.forEach((t, k) => {
    const ch = `ch${k + 1}`
    add(`${ch}_pump_in`, t.pumpIn, { dtype: 'c16', shape: [nT], units: '√W', description: `Channel ${k + 1} pump envelope launched at z = 0` })
    add(`${ch}_stokes_in`, t.stokesIn, { dtype: 'c16', shape: [nT], units: '√W', description: `Channel ${k + 1} Stokes envelope launched at z = L` })
    add(`${ch}_pump_out`, t.pumpOut, { dtype: 'c16', shape: [nT], units: '√W', description: `Channel ${k + 1} pump envelope leaving at z = L` })
    add(`${ch}_stokes_out`, t.stokesOut, { dtype: 'c16', shape: [nT], units: '√W', description: `Channel ${k + 1} Stokes envelope leaving at z = 0` })
    add(`${ch}_acoustic_final`, finalAcoustic[k], { dtype: 'c16', shape: [m.nodes], units: '√(J/m)', description: `Channel ${k + 1} acoustic envelope b(z) at the end of the run` })
  })
  if (run instanceof NetworkRun) for (const x of run.extraArrays()) add(x.name, x.data, x.descriptor)
  const red = run.config.grid.mapReduction
  const mapNote = `block ${red} over ${L.rowSteps} steps (${L.samplesPerRow} sampled) × ${L.colNodes} nodes, summed over channels`
  add('map_time_ns', mapTimeNs, { dtype: 'f8', shape: [L.rows], units: 'ns', description: 'Centre time of each map row' })
  add('map_z_m', mapZM, { dtype: 'f8', shape: [L.cols], units: 'm', description: 'Centre position of each map column' })
  add('map_pump_power_w', run.maps.pumpPowerW, { dtype: 'f4', shape: [L.rows, L.cols], units: 'W', description: `Pump power, ${mapNote}` })
  add('map_stokes_power_w', run.maps.stokesPowerW, { dtype: 'f4', shape: [L.rows, L.cols], units: 'W', description: `Stokes power, ${mapNote}` })
  add('map_acoustic_phonons_per_m', run.maps.acousticPhononsPerM, { dtype: 'f4', shape: [L.rows, L.cols], units: 'phonons/m', description: run instanceof NetworkRun ? `Phonon density Σ_fields |b|²/(ħω), every acoustic field together, ${mapNote}` : `Phonon density |b|²/(ħω_s), ${mapNote}` })

  const grid: ResultGrid = {
    dtS: m.dtS,
    dzM: m.dzM,
    nz: m.nz,
    nt: m.nt,
    reasons: run.grid.reasons,
    mapRows: L.rows,
    mapCols: L.cols,
    mapRowSteps: L.rowSteps,
    mapColNodes: L.colNodes,
    mapSamplesPerRow: L.samplesPerRow,
    mapReduction: red,
    acousticMapUnits: 'phonons/m',
  }
  const counters = { steps: Math.max(0, run.n - 1), cellUpdates, wallTimeS, cellUpdatesPerS: wallTimeS > 0 ? cellUpdates / wallTimeS : 0 }
  const kernel: KernelClass = run instanceof NetworkRun ? { engine: 'ts', threads: 1, path: 'network' } : { engine: run.engine, threads: run.threads, path: run.kernelPath }
  const manifest: SimulationManifest = { solverVersion: SOLVER_VERSION, status, message, issues: [], warnings, counters, grid, figures, complexLayout: COMPLEX_LAYOUT, arrays: descriptors, kernel }
  return {
    status,
    message,
    manifest,
    arrays,
    channels: run.traces,
    timeNs,
    zM,
    maps: { pumpPowerW: run.maps.pumpPowerW, stokesPowerW: run.maps.stokesPowerW, acousticPhononsPerM: run.maps.acousticPhononsPerM, timeNs: mapTimeNs, zM: mapZM },
    finalAcoustic,
  }
}
