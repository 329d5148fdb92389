// The time loop: interaction at every node, port recording, maps, then exact transport along the
// characteristics with the new boundary inputs. Status and counters; no I/O, no event loop.
import { chooseGrid, type GridChoice } from '@shared/physics/grid-step'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { SolverWarning } from '@shared/physics/simulation-result'
// The sampler lives in shared/ so the form's preview launches exactly what the solver launches.
import { sampleInput } from '@shared/physics/pulse-envelope'
import { SeededRandom, type NormalSource } from './steppers/seeded-random'
import { computeFigures, type ChannelTraces } from './observers/figures-of-merit'
import { MapRecorder, mapLayout } from './observers/map-recorder'
import { preRunWarnings } from './observers/warnings'
import { buildModel, type Model } from './problem/coupled-modes'
import { advectAcoustic, allocateState, fastPathApplies, interactGeneral, interactSvea, noiseWeight, type FieldState } from './steppers/interaction-kernel'
import { planStorageReference, type ReferencePlan } from './storage-reference'
import { EngineUnavailableError, resolveEngine, WasmSveaEngine, type EngineChoice } from './engine/wasm-engine'
import { interactSveaKerr, kerrFastPathApplies } from './steppers/svea-kerr-kernel'
import { interactSveaNoise, noiseFastPathApplies } from './steppers/svea-noise-kernel'
import { interactSveaKerrNoise, kerrNoiseFastPathApplies } from './steppers/svea-kerr-noise-kernel'
import { higherOrderFastPathApplies, interactHigherOrder } from './steppers/higher-order-kernel'
import { channelsFastPathApplies, interactSveaChannels } from './steppers/svea-channels-kernel'
import { ZigguratNormal } from './steppers/ziggurat-normal'
import { buildProfileModel, type ProfileArrays } from './problem/profile-model'
import { interactProfile, transportProfile } from './steppers/profile-kernel'
import { ThreadedSveaEngine } from './engine/threaded-engine'
import { resolveThreads, type ThreadChoice } from './engine/thread-choice'
import type { CoreLease } from './engine/core-lease'
import type { KernelPath } from '@shared/physics/kernel-class'
import { fastestDecayNepers, flushInterval, flushTiny, flushValue } from './steppers/subnormal-flush'

/** Hard solver-side limits (the resource estimate refuses earlier, with advice). */
export const SOLVER_LIMITS = {
  maxNodes: 20_000_000,
  /** Bytes of full-resolution traces: 4 complex traces per channel. */
  maxTraceBytes: 1.6e9,
  maxCellUpdates: 2e12,
} as const

export class SimulationRun {
  readonly model: Model
  readonly state: FieldState
  readonly traces: ChannelTraces[]
  readonly maps: MapRecorder
  readonly warnings: SolverWarning[]
  /** Axes allocated up front: a large allocation at the end can trigger a full GC and delay an abort. */
  readonly timeNs: Float64Array
  readonly zM: Float64Array
  /** Next time index to integrate (0..nt). */
  n = 0
  private readonly rng: NormalSource | null
  private readonly fast: boolean
  /** One channel, SVEA, Kerr, no noise: the flat Kerr kernel (same bits as the general one). */
  private readonly kerrFast: boolean
  /** One channel, SVEA, Kerr and thermal noise together: their flat kernel (same bits as the general one). */
  private readonly kerrNoiseFast: boolean
  /** One channel, SVEA, thermal noise, no Kerr / one channel, higher-order term, no Kerr: flat kernels (same bits). */
  private readonly noiseFast: boolean
  private readonly higherOrderFast: boolean
  /** Several channels, SVEA, no option but Kerr: the flat several-channel kernel (same bits). */
  private readonly channelsFast: boolean
  /** Per-node constants of a waveguide with a longitudinal profile (its own kernel), else null. */
  readonly profile: ProfileArrays | null
  private readonly forceGeneral: boolean
  /** The engine asked for, and the WebAssembly engine when this run uses it (engine/wasm-engine.ts). */
  private readonly engineChoice: EngineChoice
  private readonly wasm: WasmSveaEngine | ThreadedSveaEngine | null
  /** Threads advancing this run (engine/thread-choice.ts); more than one only on the threaded engine. */
  readonly threads: number
  /** Where this run's helper is counted (server solver threads), until close() gives it back. */
  private lease: CoreLease | null
  /** Storage runs: the same run without the read pulses, forked at plan.forkN (storage-reference.ts). */
  private referencePlan: ReferencePlan | null = null
  private reference: SimulationRun | null = null
  /** A companion keeps no maps: only its port traces are read. */
  private recordMaps = true
  /** Steps between flushes of amplitudes below 1e-150 to zero (steppers/subnormal-flush.ts); 0: never (testing aid). */
  readonly flushEvery: number
  private readonly flushArrays: Float64Array[]

  constructor(
    readonly config: SimulationConfig,
    readonly grid: GridChoice,
    options: { forceGeneralKernel?: boolean; normalSource?: NormalSource; engine?: EngineChoice; threads?: ThreadChoice; coreLease?: CoreLease; subnormalFlush?: boolean } = {},
  ) {
    const m = (this.model = buildModel(config, grid))
    this.forceGeneral = options.forceGeneralKernel ?? false
    this.engineChoice = options.engine ?? 'auto'
    this.profile = buildProfileModel(config, grid, m)
    // A forced engine never falls back silently (engine/wasm-engine.ts).
    if (this.profile && this.engineChoice === 'wasm' && !this.forceGeneral) throw new EngineUnavailableError('The WebAssembly engine computes a uniform waveguide only; sections along the length run in TypeScript')
    const engine = !this.profile && resolveEngine(this.engineChoice, m, this.forceGeneral) === 'wasm' ? 'wasm' : 'ts'
    this.threads = resolveThreads(options.threads ?? 'auto', m, engine, this.profile !== null, undefined, options.coreLease)
    this.lease = this.threads > 1 ? (options.coreLease ?? null) : null
    this.maps = new MapRecorder(mapLayout(m.nt, m.nodes, config.grid.mapRows, config.grid.mapCols), m, config.grid.mapReduction === 'max')
    this.wasm = engine === 'ts' ? null : this.threads > 1 ? this.threadedEngine(m) : new WasmSveaEngine(m)
    this.state = this.wasm?.state ?? allocateState(m)
    this.flushEvery = options.subnormalFlush === false ? 0 : flushInterval(fastestDecayNepers(this.decayFactors()))
    const st = this.state
    this.flushArrays = [st.uRe, st.uIm, st.vRe, st.vIm, st.bRe, st.bIm, st.wRe, st.wIm]
    this.traces = config.channels.map((ch) => ({
      pumpIn: sampleInput(ch.pump, m.nt, m.dtS),
      stokesIn: sampleInput(ch.stokes, m.nt, m.dtS),
      pumpOut: new Float64Array(2 * (m.nt + 1)),
      stokesOut: new Float64Array(2 * (m.nt + 1)),
    }))
    this.warnings = preRunWarnings(config, m, m.nodes - 1, m.nt)
    this.timeNs = new Float64Array(m.nt + 1)
    for (let n = 0; n <= m.nt; n++) this.timeNs[n] = n * m.dtS * 1e9
    this.zM = new Float64Array(m.nodes)
    for (let j = 0; j < m.nodes; j++) this.zM[j] = j * m.dzM
    // A caller-supplied source of normal deviates replaces the seeded one (the exact-covariance tests feed
    // unit draws through it to read off the scheme's noise input map).
    this.rng = config.options.noise.enabled ? (options.normalSource ?? new ZigguratNormal(config.options.noise.seed)) : null
    this.fast = !this.profile && !this.forceGeneral && fastPathApplies(m)
    this.kerrFast = !this.profile && !this.forceGeneral && kerrFastPathApplies(m)
    this.noiseFast = !this.profile && !this.forceGeneral && this.rng !== null && !this.fast && noiseFastPathApplies(m)
    this.kerrNoiseFast = !this.profile && !this.forceGeneral && this.rng !== null && kerrNoiseFastPathApplies(m)
    this.higherOrderFast = !this.profile && !this.forceGeneral && higherOrderFastPathApplies(m)
    this.channelsFast = !this.profile && !this.forceGeneral && channelsFastPathApplies(m)
    if (this.rng) this.thermalStart(this.rng)
    this.inject(0)
    this.referencePlan = planStorageReference(config, m.dtS)
  }

  /** The threaded engine, taking the maps' samples in its phases (the recorder's accumulators shared with it). */
  private threadedEngine(m: Model): ThreadedSveaEngine {
    const acc = this.maps.shareAccumulators().buffer as SharedArrayBuffer
    return new ThreadedSveaEngine(m, this.threads, undefined, false, { ...this.maps.samplerSettings, acc })
  }

  /** Which code advances this run. */
  get engine(): 'ts' | 'wasm' {
    return this.wasm ? 'wasm' : 'ts'
  }

  /** Which interaction kernel advances this run: the cost class the resource estimate calibrates by (shared/physics/kernel-class.ts). */
  get kernelPath(): KernelPath {
    // Kerr switched on with n₂ = 0 leaves nothing to compute: the engine runs its plain path (engine/wasm-engine.ts).
    if (this.wasm) return this.model.kerrHalfPump !== 0 || this.model.kerrHalfStokes !== 0 ? 'kerr' : 'plain'
    if (this.profile) return 'profile'
    if (this.fast) return 'plain'
    if (this.kerrFast) return 'kerr'
    if (this.noiseFast) return 'noise'
    if (this.kerrNoiseFast) return 'kerr-noise'
    if (this.higherOrderFast) return this.model.kerrHalfPump !== 0 || this.model.kerrHalfStokes !== 0 ? 'higher-order-kerr' : 'higher-order'
    if (this.channelsFast) {
      const kerr = this.model.kerrHalfPump !== 0 || this.model.kerrHalfStokes !== 0
      if (this.model.higherOrder !== null) return 'channels-higher-order'
      if (this.rng) return kerr ? 'channels-kerr-noise' : 'channels-noise'
      return kerr ? 'channels-kerr' : 'channels'
    }
    return 'general'
  }

  /** Ends the helper threads of a threaded run (done by itself at the end of the run; call it on abort). */
  close(): void {
    if (this.wasm instanceof ThreadedSveaEngine) this.wasm.close()
    this.lease?.giveHelper()
    this.lease = null
  }

  get done(): boolean {
    return this.n > this.model.nt
  }

  /** Node-steps done, the storage reference's included. */
  get cellUpdates(): number {
    const extra = this.reference ? this.reference.n - (this.referencePlan?.forkN ?? this.reference.n) : 0
    return (this.n + extra) * this.model.nodes * this.model.nCh
  }

  /** Integrate up to `count` time indices (and the storage reference alongside); returns how many were done. */
  advance(count: number): number {
    const start = this.n
    const end = Math.min(this.model.nt + 1, this.n + count)
    const plan = this.referencePlan
    if (plan && !this.reference && end > plan.forkN) {
      this.integrate(plan.forkN)
      this.reference = this.fork(plan.config)
    }
    this.integrate(end)
    this.reference?.integrate(end)
    return end - start
  }

  /** The reference's port traces (storage runs only, once forked). */
  get referenceTraces(): ChannelTraces[] | null {
    return this.reference?.traces ?? null
  }

  /** A companion run with other inputs, continuing from this run's present state. */
  private fork(config: SimulationConfig): SimulationRun {
    // One thread: the run itself already has the helper a run may use.
    const c = new SimulationRun(config, this.grid, { forceGeneralKernel: this.forceGeneral, engine: this.engineChoice, threads: 1, subnormalFlush: this.flushEvery > 0 })
    c.referencePlan = null
    c.recordMaps = false
    for (const key of ['uRe', 'uIm', 'vRe', 'vIm', 'bRe', 'bIm', 'wRe', 'wIm'] as const) c.state[key].set(this.state[key])
    this.traces.forEach((t, k) => {
      c.traces[k].pumpOut.set(t.pumpOut.subarray(0, 2 * this.n))
      c.traces[k].stokesOut.set(t.stokesOut.subarray(0, 2 * this.n))
    })
    // Same draws from here on, so the thermal noise cancels in the difference of the two runs.
    if (this.rng instanceof SeededRandom && c.rng instanceof SeededRandom) c.rng.copyFrom(this.rng)
    c.n = this.n
    return c
  }

  private integrate(endN: number): void {
    const m = this.model
    const s = this.state
    const end = Math.min(m.nt + 1, endN)
    const start = this.n
    const nz = m.nz
    for (let n = start; n < end; n++) {
      if (this.wasm instanceof ThreadedSveaEngine) this.wasm.step(this.recordMaps ? this.maps.sampleAt(n) : 0)
      else if (this.wasm) this.wasm.step()
      else if (this.profile) interactProfile(s, this.profile, nz, m.dtS)
      else if (this.fast) {
        const c = m.exchangePerB
        const K = m.driveK, Er = m.svea.eRe, Ei = m.svea.eIm, h = m.dtS
        interactSvea(s.uRe, s.uIm, s.vRe, s.vIm, s.bRe, s.bIm, 1, nz - 1, K, 0.5 * c, Er, Ei, h)
        interactSvea(s.uRe, s.uIm, s.vRe, s.vIm, s.bRe, s.bIm, 0, 0, K, 0.25 * c, Er, Ei, h)
        interactSvea(s.uRe, s.uIm, s.vRe, s.vIm, s.bRe, s.bIm, nz, nz, K, 0.25 * c, Er, Ei, h)
      } else if (this.kerrFast) {
        interactSveaKerr(m, s, 0, 0, 0.5)
        interactSveaKerr(m, s, 1, nz - 1, 1)
        interactSveaKerr(m, s, nz, nz, 0.5)
      } else if (this.kerrNoiseFast) {
        // Node order 0, 1..nz−1, nz: the order of the random draws (as the general kernel's).
        interactSveaKerrNoise(m, s, 0, 0, 0.5, this.rng!)
        interactSveaKerrNoise(m, s, 1, nz - 1, 1, this.rng!)
        interactSveaKerrNoise(m, s, nz, nz, 0.5, this.rng!)
      } else if (this.noiseFast) {
        // Node order 0, 1..nz−1, nz: the order of the random draws (as the general kernel's).
        interactSveaNoise(m, s, 0, 0, 0.5, this.rng!)
        interactSveaNoise(m, s, 1, nz - 1, 1, this.rng!)
        interactSveaNoise(m, s, nz, nz, 0.5, this.rng!)
      } else if (this.higherOrderFast) {
        interactHigherOrder(m, s, 0, 0, 0.5, this.rng)
        interactHigherOrder(m, s, 1, nz - 1, 1, this.rng)
        interactHigherOrder(m, s, nz, nz, 0.5, this.rng)
      } else if (this.channelsFast) {
        // Node order 0, 1..nz−1, nz: the order of the random draws with noise (as the general kernel's).
        interactSveaChannels(m, s, 0, 0, 0.5, this.rng)
        interactSveaChannels(m, s, 1, nz - 1, 1, this.rng)
        interactSveaChannels(m, s, nz, nz, 0.5, this.rng)
      } else {
        // Node order 0, 1..nz−1, nz: the order of the random draws.
        interactGeneral(m, s, 0, 0, 0.5, this.rng)
        interactGeneral(m, s, 1, nz - 1, 1, this.rng)
        interactGeneral(m, s, nz, nz, 0.5, this.rng)
      }
      for (let k = 0; k < m.nCh; k++) {
        const base = k * m.nodes
        const t = this.traces[k]
        t.pumpOut[2 * n] = m.sqrtKappaP * s.uRe[base + nz]
        t.pumpOut[2 * n + 1] = m.sqrtKappaP * s.uIm[base + nz]
        t.stokesOut[2 * n] = m.sqrtKappa * s.vRe[base]
        t.stokesOut[2 * n + 1] = m.sqrtKappa * s.vIm[base]
      }
      if (m.advectionCourant > 0) advectAcoustic(m, s)
      if (this.recordMaps) this.maps.record(n, s, this.wasm instanceof ThreadedSveaEngine)
      if (n < m.nt) {
        if (this.wasm instanceof ThreadedSveaEngine) this.transportLater(n + 1)
        else {
          this.transport()
          this.inject(n + 1)
        }
        // At a step boundary; the threaded engine first does its pending transport, with its helpers then idle.
        if (this.flushEvery > 0 && (n + 1) % this.flushEvery === 0) {
          if (this.wasm instanceof ThreadedSveaEngine) this.wasm.settle()
          flushTiny(this.flushArrays)
        }
      }
    }
    // Whoever reads the state between advance() calls (a fork, the final figures) sees the transported fields.
    if (this.wasm instanceof ThreadedSveaEngine) this.wasm.settle()
    this.n = Math.max(this.n, end)
    if (this.done) this.close()
  }

  /** Per-step amplitude factors of free decay: acoustic |E| (per node with a profile), optical loss per cell, upwind advection's 1 − C. */
  private decayFactors(): number[] {
    const m = this.model
    const f = [Math.hypot(m.svea.eRe, m.svea.eIm), m.lossPerCell, 1 - m.advectionCourant]
    const p = this.profile
    if (p) for (let j = 0; j < p.eRe.length; j++) f.push(Math.hypot(p.eRe[j], p.eIm[j]), j > 0 ? p.lossCell[j] : 1)
    return f
  }

  /** True if every value written so far is finite (a guard: never hand out a NaN result). */
  isFinite(fromN: number): boolean {
    for (const t of this.traces)
      for (let i = 2 * fromN; i < 2 * this.n; i++) if (!Number.isFinite(t.pumpOut[i]) || !Number.isFinite(t.stokesOut[i])) return false
    const b = this.state.bRe
    for (let i = 0; i < b.length; i += Math.max(1, Math.floor(b.length / 64))) if (!Number.isFinite(b[i]) || !Number.isFinite(this.state.bIm[i])) return false
    return true
  }

  /** Light still inside the waveguide (J), per channel: what would leave in the coming steps. */
  leftInside(): { pump: number; stokes: number }[] {
    const m = this.model
    const s = this.state
    return this.config.channels.map((_, k) => {
      const base = k * m.nodes
      let p = 0, q = 0
      for (let j = 0; j < m.nz; j++) p += s.uRe[base + j] ** 2 + s.uIm[base + j] ** 2
      for (let j = 1; j <= m.nz; j++) q += s.vRe[base + j] ** 2 + s.vIm[base + j] ** 2
      return { pump: m.kappaP * p * m.dtS, stokes: m.rates.kappa * q * m.dtS }
    })
  }

  figures(wallTimeS: number) {
    return computeFigures(this.config, this.model, this.traces, this.leftInside(), wallTimeS, this.cellUpdates, this.referenceTraces)
  }

  private transport(): void {
    const m = this.model
    const s = this.state
    const nz = m.nz
    const loss = m.lossPerCell
    if (this.wasm) return this.wasm.transport()
    if (this.profile) return transportProfile(s, this.profile, nz)
    for (let k = 0; k < m.nCh; k++) {
      const base = k * m.nodes
      s.uRe.copyWithin(base + 1, base, base + nz)
      s.uIm.copyWithin(base + 1, base, base + nz)
      s.vRe.copyWithin(base, base + 1, base + nz + 1)
      s.vIm.copyWithin(base, base + 1, base + nz + 1)
      if (loss !== 1) {
        for (let j = base + 1; j <= base + nz; j++) (s.uRe[j] *= loss), (s.uIm[j] *= loss)
        for (let j = base; j < base + nz; j++) (s.vRe[j] *= loss), (s.vIm[j] *= loss)
      }
    }
  }

  /** The threaded engine's transport and the inputs of time index n, done with the next interaction step (one barrier per step). */
  private transportLater(n: number): void {
    const m = this.model
    const t = this.traces[0]
    const engine = this.wasm as ThreadedSveaEngine
    const f = this.flushEvery > 0 ? flushValue : (x: number) => x
    engine.transportLater(f(t.pumpIn[2 * n] / m.sqrtKappaP), f(t.pumpIn[2 * n + 1] / m.sqrtKappaP), f(t.stokesIn[2 * n] / m.sqrtKappa), f(t.stokesIn[2 * n + 1] / m.sqrtKappa))
  }

  private inject(n: number): void {
    const m = this.model
    const s = this.state
    // A sampled pulse's far tail can be subnormal: the boundary inputs take the flush rule every step.
    const f = this.flushEvery > 0 ? flushValue : (x: number) => x
    for (let k = 0; k < m.nCh; k++) {
      const base = k * m.nodes
      const t = this.traces[k]
      s.uRe[base] = f(t.pumpIn[2 * n] / m.sqrtKappaP)
      s.uIm[base] = f(t.pumpIn[2 * n + 1] / m.sqrtKappaP)
      s.vRe[base + m.nz] = f(t.stokesIn[2 * n] / m.sqrtKappa)
      s.vIm[base + m.nz] = f(t.stokesIn[2 * n + 1] / m.sqrtKappa)
    }
  }

  /** Thermal initial state, ⟨|b|²⟩ = ħω_s n_th/(wΔz) with w = ½ at the facets (docs/model.md, thermal noise); ∂t b starts at 0. */
  private thermalStart(rng: NormalSource): void {
    const m = this.model
    for (let i = 0; i < this.state.bRe.length; i++) {
      const j = i % m.nodes
      const sd = m.thermalRms * Math.SQRT1_2 * noiseWeight(j === 0 || j === m.nz ? 0.5 : 1)
      this.state.bRe[i] = sd * rng.normal()
      this.state.bIm[i] = sd * rng.normal()
    }
  }
}

export function planGrid(config: SimulationConfig): GridChoice {
  return chooseGrid(config)
}
