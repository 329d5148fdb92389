/*
 * The threaded step engine: the plain single-channel SVEA step of the WebAssembly engine with z cut into
 * contiguous chunks that the run's own thread and its helper threads (node:worker_threads) take in turn
 * (docs/numerics.md, "Threaded step"). The field arrays live in one shared WebAssembly memory (the shared
 * build of the same AssemblyScript source). A time step is one phase: each chunk does the previous step's
 * transport shift and boundary inputs, then this step's interaction (a chunk's shift needs only the edge values
 * its neighbours published the step before, kept in two alternating sets). The phase ends at a barrier (Atomics
 * on a SharedArrayBuffer: a bounded spin, then Atomics.wait), so the driver's port recording and maps see the
 * whole field after the interaction step, as with one thread; one barrier per step, not two, since the run's
 * thread then waits only once per step for the slower thread. Chunks are taken, not dealt:
 * on a loaded machine a helper that is not scheduled leaves its share to the others instead of holding
 * everyone at the barrier.
 *
 * Why the bits are those of one thread: the interaction of a node reads and writes that node only, in the
 * same lane arithmetic whatever chunk it falls in (assembly/svea-step.ts); the shift moves numbers and
 * multiplies each once by the same loss; the number at each chunk edge that crosses into the neighbour is
 * handed over through `edges` (engine/block-step-source.ts) and multiplied the same way.
 */
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from '../steppers/interaction-kernel'
import { CHUNK_STEPPER_SOURCE, HELPER_SOURCE } from './block-step-source'
import { SVEA_STEP_SHARED_WASM_BASE64 } from './svea-step-binary'
import { Worker } from 'node:worker_threads'

interface WasmApi {
  Module: new (bytes: Uint8Array) => object
  Instance: new (module: object, imports: object) => { exports: unknown }
  Memory: new (descriptor: { initial: number; maximum: number; shared: boolean }) => { buffer: SharedArrayBuffer }
}
const wasm = (globalThis as unknown as { WebAssembly: WasmApi }).WebAssembly

interface Stepper {
  readonly chunks: number
}
type StepperFactory = (fn: unknown, f64: Float64Array, d: object) => Stepper
type TakeChunks = (ctrl: Int32Array, stepper: Stepper, word: number, fromBack: boolean) => number
type RunChunk = (stepper: Stepper, op: number, k: number) => void
const [chunkStepper, takeChunks, runChunk] = new Function(`${CHUNK_STEPPER_SOURCE}; return [chunkStepper, takeChunks, runChunk]`)() as [StepperFactory, TakeChunks, RunChunk]

let compiled: object | null = null
const sharedModule = () => (compiled ??= new wasm.Module(Uint8Array.from(atob(SVEA_STEP_SHARED_WASM_BASE64), (ch) => ch.charCodeAt(0))))

const PAGE_BYTES = 65536
const BASE_BYTES = PAGE_BYTES
/** Nodes per chunk: ~3 µs of work, so claiming one (a compare-exchange) costs nothing; ≤ 255 chunks per phase. */
export const CHUNK_NODES = 512
/** Spins before sleeping (some hundreds of µs): a helper kept awake between phases spares the run's thread a futex wake (tens of µs) per phase. */
const SPINS = 200_000
/** A helper that has not finished its chunk in this time has died: the run fails rather than hangs. */
const STALL_MS = 30_000
/**
 * Helpers that took under this share of the chunks over TRIAL_PHASES phases are not getting a core (a loaded
 * machine): the run's thread then computes SOLO_PHASES phases alone, and tries again. Waiting at each barrier for
 * a chunk held by a descheduled helper would otherwise make two threads slower than one.
 */
const MIN_HELPER_SHARE = 0.2
const TRIAL_PHASES = 256
const SOLO_PHASES = 4096
/** Each failed trial in a row doubles the time alone, up to this: a trial on a busy machine costs the run waits for a descheduled helper. */
const MAX_SOLO_PHASES = 65536
// Operations (runChunk in engine/block-step-source.ts): bits 1..0 what, bit 2 the edge set read, bit 3 the set
// written, bit 4 the transport takes the boundary inputs.
const OP_STEP = 0
const OP_TRANSPORT = 1
const OP_TRANSPORT_STEP = 2
const READ_SET_1 = 4
const WRITE_SET_1 = 8
const WITH_INPUTS = 16
const WITH_SAMPLE = 32
const FIRST_SAMPLE = 64
// ctrl slots (engine/block-step-source.ts), each group on its own 64-byte cache line so that claiming a chunk
// and counting finished ones do not contend for one line; the operation shares the phase word's line, since
// it is read right after a chunk is claimed.
const WORD = 0
const OP = 8
const FINISHED = 16
const HELPERS_ASLEEP = 32
const MAIN_ASLEEP = 48
const EXIT = 64
/** Helpers started and ready to take chunks (a helper starts in tens of ms; until then the run's thread works alone). */
const READY = 72
const CTRL_INTS = 80

/**
 * The maps' sample taken inside the phase (observers/map-recorder.ts: samplerSettings, shareAccumulators), so the
 * run's thread does not scan the whole field alone while the helpers wait.
 */
export interface MapSampler {
  cols: number
  colNodes: number
  kp: number
  ks: number
  kb: number
  useMax: boolean
  /** The recorder's shared accumulators: P, S, B, cols each. */
  acc: SharedArrayBuffer
}

export class ThreadedSveaEngine {
  readonly state: FieldState
  private readonly ctrl: Int32Array
  private readonly stepper: Stepper
  private readonly helpers: Worker[] = []
  private readonly chunks: number
  /** Boundary inputs of a transport left for the next phase: u at node 0, v at node nz (re, im). */
  private readonly inputs: Float64Array
  private phase = 0
  /** The edge set the last interaction step wrote (it alternates: block-step-source.ts). */
  private edgeSet = 0
  /** A transport is owed: done at the start of the next step's phase, or by settle(). */
  private pendingTransport = 0
  private closed = false
  /** Chunks the run's own thread did, and all chunks handed out (the helpers did the rest): for the benchmark. */
  ownChunks = 0
  allChunks = 0
  private trialOwn = 0
  private trialPhases = 0
  private solo = 0
  private soloLength = SOLO_PHASES

  /**
   * `threads` − 1 helpers start here. Testing aids: `chunkNodes` (any value gives the same bits), and
   * `helpersOnly`, which leaves every chunk to the helpers so that the tests see each one computed off the run's thread.
   */
  constructor(
    m: Model,
    readonly threads: number,
    chunkNodes = CHUNK_NODES,
    private readonly helpersOnly = false,
    maps: MapSampler | null = null,
  ) {
    const n = m.nodes
    // With the maps' sample in the phase, a chunk holds whole map columns (block-step-source.ts, sample).
    const width = maps?.colNodes ?? 1
    const size = Math.ceil(Math.max(chunkNodes, Math.ceil(n / 0xff)) / width) * width
    this.chunks = Math.ceil(n / size)
    // Each array starts on a 64-byte cache line, and chunks hold a multiple of 8 nodes where they can (512), so two
    // threads working on neighbouring chunks do not write one line.
    const stride = Math.ceil((8 * n) / 64) * 64
    const pages = Math.ceil((BASE_BYTES + 6 * stride) / PAGE_BYTES)
    const memory = new wasm.Memory({ initial: pages, maximum: pages, shared: true })
    const module = sharedModule()
    const fn = new wasm.Instance(module, { env: { memory } }).exports
    const at = [0, 1, 2, 3, 4, 5].map((i) => BASE_BYTES + i * stride)
    const view = (i: number) => new Float64Array(memory.buffer, at[i], n)
    const none = new Float64Array(0)
    this.state = { uRe: view(0), uIm: view(1), vRe: view(2), vIm: view(3), bRe: view(4), bIm: view(5), wRe: none, wIm: none, scratch: none }
    const ctrl = new SharedArrayBuffer(4 * CTRL_INTS)
    const edges = new SharedArrayBuffer(8 * 2 * 8 * this.chunks)
    const inputs = new SharedArrayBuffer(8 * 4)
    this.inputs = new Float64Array(inputs)
    this.ctrl = new Int32Array(ctrl)
    // First = last = 0: no work until the first phase.
    this.ctrl[WORD] = 0
    const d = { nz: m.nz, size, chunks: this.chunks, at, K: m.driveK, c: m.exchangePerB, Er: m.svea.eRe, Ei: m.svea.eIm, h: m.dtS, loss: m.lossPerCell, maps }
    this.stepper = chunkStepper(fn, new Float64Array(memory.buffer), { ...d, edges: new Float64Array(edges), inputs: this.inputs })
    for (let t = 1; t < threads; t++) {
      const w = new Worker(HELPER_SOURCE, { eval: true, workerData: { ...d, module, memory, ctrl, edges, inputs, spins: SPINS } })
      // A helper never keeps the process alive; close() ends it.
      w.unref()
      this.helpers.push(w)
    }
  }

  /**
   * The interaction step at every node; a transport left by transportLater() is done first, chunk by chunk in
   * the same phase (each chunk's shift needs only the edges its neighbours published in the previous step).
   * `sample` (MapRecorder.sampleAt): the maps' sample of this step is taken in the phase too.
   */
  step(sample: 0 | 1 | 2 = 0): void {
    const read = this.edgeSet === 1 ? READ_SET_1 : 0
    this.edgeSet ^= 1
    const write = this.edgeSet === 1 ? WRITE_SET_1 : 0
    const op = this.pendingTransport ? OP_TRANSPORT_STEP | this.pendingTransport | read : OP_STEP
    this.pendingTransport = 0
    this.run(op | write | (sample === 0 ? 0 : sample === 2 ? WITH_SAMPLE | FIRST_SAMPLE : WITH_SAMPLE))
  }

  /** The exact shift along the characteristics, the cells crossing a chunk edge from the published edges. */
  transport(): void {
    this.settle()
    this.pendingTransport = OP_TRANSPORT
    this.settle()
  }

  /**
   * The shift and then the boundary inputs (u at node 0 and v at node nz, real and imaginary parts, as the
   * driver's inject), left for the next step() so that one barrier per time step suffices; `settle()` does them
   * now. Until then the state holds the fields after the interaction step.
   */
  transportLater(u0Re: number, u0Im: number, vNzRe: number, vNzIm: number): void {
    this.settle()
    const x = this.inputs
    x[0] = u0Re
    x[1] = u0Im
    x[2] = vNzRe
    x[3] = vNzIm
    this.pendingTransport = OP_TRANSPORT | WITH_INPUTS
  }

  /** Does a pending transport (and its inputs) now, so that the state is the one a single thread would hold. */
  settle(): void {
    if (!this.pendingTransport) return
    const op = this.pendingTransport | (this.edgeSet === 1 ? READ_SET_1 : 0)
    this.pendingTransport = 0
    this.run(op)
  }

  /** Ends the helper threads (the field arrays stay readable). Idempotent. */
  close(): void {
    if (this.closed) return
    this.closed = true
    const c = this.ctrl
    Atomics.store(c, EXIT, 1)
    Atomics.store(c, WORD, 0)
    Atomics.notify(c, WORD)
    for (const w of this.helpers) void w.terminate()
  }

  private run(op: number): void {
    if (this.closed) throw new Error('ThreadedSveaEngine: used after close()')
    const c = this.ctrl
    if (this.helpersOnly) this.waitForHelpers()
    else if (this.solo > 0 || Atomics.load(c, READY) < this.threads - 1) {
      // Alone: the same chunks in order, nothing published (a helper finds no phase to take from and sleeps).
      if (this.solo > 0) this.solo--
      for (let k = 0; k < this.chunks; k++) runChunk(this.stepper, op, k)
      this.ownChunks += this.chunks
      this.allChunks += this.chunks
      return
    }
    this.phase = (this.phase + 1) & 0x7fff
    const word = (this.phase << 16) | this.chunks
    Atomics.store(c, FINISHED, 0)
    Atomics.store(c, OP, op)
    Atomics.store(c, WORD, word)
    if (Atomics.load(c, HELPERS_ASLEEP) > 0) Atomics.notify(c, WORD)
    const own = this.helpersOnly ? 0 : takeChunks(c, this.stepper, word, false)
    this.ownChunks += own
    this.allChunks += this.chunks
    this.barrier()
    this.trialOwn += own
    if (++this.trialPhases < TRIAL_PHASES || this.helpersOnly) return
    if (1 - this.trialOwn / (TRIAL_PHASES * this.chunks) < MIN_HELPER_SHARE && this.threads > 1) {
      this.solo = this.soloLength
      this.soloLength = Math.min(MAX_SOLO_PHASES, 2 * this.soloLength)
    } else this.soloLength = SOLO_PHASES
    this.trialOwn = 0
    this.trialPhases = 0
  }

  /** Blocks until every helper has started (testing aid; a run never waits for them). */
  private waitForHelpers(): void {
    const since = Date.now()
    for (let ready; (ready = Atomics.load(this.ctrl, READY)) < this.threads - 1; ) {
      Atomics.wait(this.ctrl, READY, ready, 50)
      if (Date.now() - since > STALL_MS) throw new Error('A solver helper thread did not start')
    }
  }

  /** Waits until every chunk of the present phase is finished (some may still be in a helper's hands). */
  private barrier(): void {
    const c = this.ctrl
    let spins = 0
    const since = Date.now()
    for (;;) {
      const finished = Atomics.load(c, FINISHED)
      if (finished === this.chunks) return
      if (++spins < SPINS) continue
      Atomics.store(c, MAIN_ASLEEP, 1)
      Atomics.wait(c, FINISHED, finished, 100)
      Atomics.store(c, MAIN_ASLEEP, 0)
      spins = 0
      if (Date.now() - since > STALL_MS) {
        this.close()
        throw new Error('A solver helper thread stopped responding')
      }
    }
  }
}
