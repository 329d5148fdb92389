// The time loop of the multi-wave solver (network-kernel.ts): interaction at every node, port recording, maps,
// then exact transport along the characteristics (+z waves one cell forward, −z waves one back) and the new
// inputs. Same public surface as SimulationRun (solver/driver.ts), which solver/index.ts drives.
import type { GridChoice } from '@shared/physics/grid-step'
import { sampleInput } from '@shared/physics/pulse-envelope'
import type { ArrayDescriptor, FiguresOfMerit, SolverWarning } from '@shared/physics/simulation-result'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { computeFigures, type ChannelTraces } from '../observers/figures-of-merit'
import { MapRecorder, mapLayout } from '../observers/map-recorder'
import { preRunWarnings } from '../observers/warnings'
import { buildModel, type Model } from '../problem/coupled-modes'
import { planStorageReference, type ReferencePlan } from '../storage-reference'
import type { FieldState } from '../steppers/interaction-kernel'
import { noiseWeight } from '../steppers/general-kernel'
import type { SeededRandom } from '../steppers/seeded-random'
import { ZigguratNormal } from '../steppers/ziggurat-normal'
import { fastestDecayNepers, flushInterval, flushTiny, flushValue } from '../steppers/subnormal-flush'
import { allocateNetworkState, interactNetwork, type NetworkState } from './network-kernel'
import { buildNetworkModel, type NetworkModel } from './network-model'
import { pairResidualNote, waveFigures } from './wave-figures-observer'

export interface ExtraArray {
  name: string
  data: Float64Array
  descriptor: Omit<ArrayDescriptor, 'name'>
}

export class NetworkRun {
  /** The plain model of the pump–Stokes pair: grid, rates and the pair's figures. */
  readonly model: Model
  readonly net: NetworkModel
  readonly wave: NetworkState
  /** Input and output envelope of every wave (interleaved complex, √W). */
  readonly waveIn: Float64Array[]
  readonly waveOut: Float64Array[]
  /** Pump and first Stokes, as every run reports them. */
  readonly traces: ChannelTraces[]
  readonly maps: MapRecorder
  readonly warnings: SolverWarning[]
  readonly timeNs: Float64Array
  readonly zM: Float64Array
  readonly engine = 'ts' as const
  n = 0
  /** Storage runs: the same run without the read pulses, forked at plan.forkN (solver/storage-reference.ts). */
  private referencePlan: ReferencePlan | null = null
  private reference: NetworkRun | null = null
  /** A companion keeps no maps: only its port traces are read. */
  private keepMaps = true
  private readonly rng: SeededRandom | null
  /** What the maps read: pump, first Stokes and the phonon density of all fields together. */
  private readonly mapView: FieldState
  /** Steps between flushes of amplitudes below 1e-150 to zero (steppers/subnormal-flush.ts); 0: never (testing aid). */
  readonly flushEvery: number
  private readonly flushArrays: Float64Array[]

  constructor(
    readonly config: SimulationConfig,
    readonly grid: GridChoice,
    options: { subnormalFlush?: boolean } = {},
  ) {
    this.model = buildModel(config, grid)
    const m = (this.net = buildNetworkModel(config, grid))
    this.wave = allocateNetworkState(m)
    // Free decay per step: every acoustic field's |E| and the optical loss per cell.
    const decay = fastestDecayNepers([m.lossPerCell, ...m.fields.map((f) => Math.hypot(f.svea.eRe, f.svea.eIm))])
    this.flushEvery = options.subnormalFlush === false ? 0 : flushInterval(decay)
    this.flushArrays = [...this.wave.aRe, ...this.wave.aIm, ...this.wave.bRe, ...this.wave.bIm]
    this.waveIn = m.set.waves.map((w) => sampleInput(w.input, m.nt, m.dtS))
    this.waveOut = m.set.waves.map(() => new Float64Array(2 * (m.nt + 1)))
    this.traces = [{ pumpIn: this.waveIn[0], stokesIn: this.waveIn[1], pumpOut: this.waveOut[0], stokesOut: this.waveOut[1] }]
    const scales = { nodes: m.nodes, nCh: 1, nt: m.nt, kappaP: m.waves[0].powerPerFlux, rates: { kappa: m.waves[1].powerPerFlux }, stokesPhotonJ: 1 }
    this.maps = new MapRecorder(mapLayout(m.nt, m.nodes, config.grid.mapRows, config.grid.mapCols), scales, config.grid.mapReduction === 'max')
    const s = this.wave
    this.mapView = { uRe: s.aRe[0], uIm: s.aIm[0], vRe: s.aRe[1], vIm: s.aIm[1], bRe: new Float64Array(m.nodes), bIm: new Float64Array(m.nodes), wRe: new Float64Array(0), wIm: new Float64Array(0), scratch: new Float64Array(0) }
    this.warnings = preRunWarnings(config, this.model, m.nz, m.nt)
    this.timeNs = new Float64Array(m.nt + 1)
    for (let n = 0; n <= m.nt; n++) this.timeNs[n] = n * m.dtS * 1e9
    this.zM = new Float64Array(m.nodes)
    for (let j = 0; j < m.nodes; j++) this.zM[j] = j * m.dzM
    this.rng = config.options.noise.enabled ? new ZigguratNormal(config.options.noise.seed) : null
    if (this.rng) this.thermalStart(this.rng)
    this.inject(0)
    this.referencePlan = planStorageReference(config, m.dtS)
  }

  /** The reference's port traces (storage runs only, once forked). */
  get referenceTraces(): ChannelTraces[] | null {
    return this.reference?.traces ?? null
  }

  /** The first acoustic field (the main backward resonance), as the plain run's state exposes b. */
  get state(): { bRe: Float64Array; bIm: Float64Array } {
    return { bRe: this.wave.bRe[0], bIm: this.wave.bIm[0] }
  }

  get done(): boolean {
    return this.n > this.net.nt
  }

  /** Node-steps done (each advances every wave and field of the node), the storage reference's included. */
  get cellUpdates(): number {
    const extra = this.reference ? this.reference.n - (this.referencePlan?.forkN ?? this.reference.n) : 0
    return (this.n + extra) * this.net.nodes
  }

  /** Integrate up to `count` time indices (and the storage reference alongside); returns how many were done. */
  advance(count: number): number {
    const start = this.n
    const end = Math.min(this.net.nt + 1, this.n + count)
    const plan = this.referencePlan
    if (plan && !this.reference && end > plan.forkN) {
      this.integrate(plan.forkN)
      this.reference = this.fork(plan.config)
    }
    this.integrate(end)
    this.reference?.integrate(end)
    return end - start
  }

  /** A companion run with other inputs, continuing from this run's present state. */
  private fork(config: SimulationConfig): NetworkRun {
    const c = new NetworkRun(config, this.grid, { subnormalFlush: this.flushEvery > 0 })
    c.referencePlan = null
    c.keepMaps = false
    const copy = (from: Float64Array[], to: Float64Array[]) => from.forEach((a, k) => to[k].set(a))
    copy(this.wave.aRe, c.wave.aRe), copy(this.wave.aIm, c.wave.aIm), copy(this.wave.bRe, c.wave.bRe), copy(this.wave.bIm, c.wave.bIm)
    this.waveOut.forEach((t, k) => c.waveOut[k].set(t.subarray(0, 2 * this.n)))
    // Same draws from here on, so the thermal noise cancels in the difference of the two runs.
    if (this.rng && c.rng) c.rng.copyFrom(this.rng)
    c.n = this.n
    return c
  }

  private integrate(endN: number): void {
    const m = this.net
    const s = this.wave
    const start = this.n
    const end = Math.min(m.nt + 1, endN)
    const nz = m.nz
    for (let n = start; n < end; n++) {
      // Node order 0, 1..nz−1, nz: the order of the random draws, as in the plain run.
      interactNetwork(m, s, 0, 0, 0.5, this.rng)
      interactNetwork(m, s, 1, nz - 1, 1, this.rng)
      interactNetwork(m, s, nz, nz, 0.5, this.rng)
      for (let k = 0; k < m.waves.length; k++) {
        const w = m.waves[k]
        const j = w.direction === 1 ? nz : 0
        this.waveOut[k][2 * n] = w.sqrtPowerPerFlux * s.aRe[k][j]
        this.waveOut[k][2 * n + 1] = w.sqrtPowerPerFlux * s.aIm[k][j]
      }
      if (this.keepMaps) this.recordMaps(n)
      if (n < m.nt) {
        this.transport()
        this.inject(n + 1)
        if (this.flushEvery > 0 && (n + 1) % this.flushEvery === 0) flushTiny(this.flushArrays)
      }
    }
    this.n = Math.max(this.n, end)
  }

  /** Thermal initial state of every field, ⟨|b|²⟩ = ħω n/(wΔz) with w = ½ at the facets (as the plain run). */
  private thermalStart(rng: SeededRandom): void {
    const m = this.net
    m.fields.forEach((f, k) => {
      for (let j = 0; j < m.nodes; j++) {
        const sd = f.thermalRms * Math.SQRT1_2 * noiseWeight(j === 0 || j === m.nz ? 0.5 : 1)
        this.wave.bRe[k][j] = sd * rng.normal()
        this.wave.bIm[k][j] = sd * rng.normal()
      }
    })
  }

  private recordMaps(n: number): void {
    const L = this.maps.layout
    if ((n % L.rowSteps) % L.sampleStride === 0) {
      // |b|-like magnitude whose square is phonons per metre summed over fields.
      const out = this.mapView.bRe
      out.fill(0)
      this.net.fields.forEach((f, k) => {
        const re = this.wave.bRe[k], im = this.wave.bIm[k], inv = 1 / f.phononJ
        for (let j = 0; j < out.length; j++) out[j] += (re[j] * re[j] + im[j] * im[j]) * inv
      })
      for (let j = 0; j < out.length; j++) out[j] = Math.sqrt(out[j])
    }
    this.maps.record(n, this.mapView)
  }

  private transport(): void {
    const m = this.net
    const nz = m.nz
    const loss = m.lossPerCell
    for (let k = 0; k < m.waves.length; k++) {
      const forward = m.waves[k].direction === 1
      for (let part = 0; part < 2; part++) {
        const a = part === 0 ? this.wave.aRe[k] : this.wave.aIm[k]
        if (forward) {
          a.copyWithin(1, 0, nz)
          if (loss !== 1) for (let j = 1; j <= nz; j++) a[j] *= loss
        } else {
          a.copyWithin(0, 1, nz + 1)
          if (loss !== 1) for (let j = 0; j < nz; j++) a[j] *= loss
        }
      }
    }
  }

  private inject(n: number): void {
    const m = this.net
    m.waves.forEach((w, k) => {
      const j = w.direction === 1 ? 0 : m.nz
      // A sampled pulse's far tail can be subnormal: the boundary inputs take the flush rule every step.
      const re = this.waveIn[k][2 * n] / w.sqrtPowerPerFlux
      const im = this.waveIn[k][2 * n + 1] / w.sqrtPowerPerFlux
      this.wave.aRe[k][j] = this.flushEvery > 0 ? flushValue(re) : re
      this.wave.aIm[k][j] = this.flushEvery > 0 ? flushValue(im) : im
    })
  }

  isFinite(fromN: number): boolean {
    for (const t of this.waveOut) for (let i = 2 * fromN; i < 2 * this.n; i++) if (!Number.isFinite(t[i])) return false
    for (const b of [...this.wave.bRe, ...this.wave.bIm]) for (let i = 0; i < b.length; i += Math.max(1, Math.floor(b.length / 64))) if (!Number.isFinite(b[i])) return false
    return true
  }

  /** Light of each wave still inside the waveguide (J): what would leave in the coming steps. */
  leftInsideJ(): number[] {
    const m = this.net
    return m.waves.map((w, k) => {
      const re = this.wave.aRe[k], im = this.wave.aIm[k]
      let e = 0
      const [j0, j1] = w.direction === 1 ? [0, m.nz - 1] : [1, m.nz]
      for (let j = j0; j <= j1; j++) e += re[j] * re[j] + im[j] * im[j]
      return e * w.powerPerFlux * m.dtS
    })
  }

  figures(wallTimeS: number): FiguresOfMerit {
    const left = this.leftInsideJ()
    const f = computeFigures(this.config, this.model, this.traces, [{ pump: left[0], stokes: left[1] }], wallTimeS, this.cellUpdates, this.referenceTraces)
    const note = pairResidualNote(this.net)
    if (note) {
      f.channels[0].manleyRoweResidual = null
      f.channels[0].notDetermined.push(note)
    }
    return { ...f, waves: waveFigures(this.net, this.waveIn, this.waveOut, left) }
  }

  /** Per-wave port traces and the final state of every field, for the result and its ZIP. */
  extraArrays(): ExtraArray[] {
    const m = this.net
    const nT = m.nt + 1
    const out: ExtraArray[] = []
    m.set.waves.forEach((w, k) => {
      const [from, to] = w.direction === 1 ? ['z = 0', 'z = L'] : ['z = L', 'z = 0']
      const what = `${w.label} (carrier ν_p ${w.offsetGHz >= 0 ? '+' : '−'} ${Math.abs(w.offsetGHz).toPrecision(6)} GHz)`
      out.push({ name: `wave_${w.key}_in`, data: this.waveIn[k], descriptor: { dtype: 'c16', shape: [nT], units: '√W', description: `${what} envelope launched at ${from}` } })
      out.push({ name: `wave_${w.key}_out`, data: this.waveOut[k], descriptor: { dtype: 'c16', shape: [nT], units: '√W', description: `${what} envelope leaving at ${to}` } })
    })
    m.set.fields.forEach((f, k) => {
      const a = new Float64Array(2 * m.nodes)
      for (let j = 0; j < m.nodes; j++) (a[2 * j] = this.wave.bRe[k][j]), (a[2 * j + 1] = this.wave.bIm[k][j])
      out.push({ name: `${f.key}_final`, data: a, descriptor: { dtype: 'c16', shape: [m.nodes], units: '√(J/m)', description: `${f.label}: envelope b(z) at the end of the run` } })
    })
    return out
  }
}
