/*
 * The WebAssembly step engine for the single-channel SVEA fast path (docs/numerics.md, "Step engines").
 * The module (solver/engine/assembly/svea-step.ts, built by scripts/build-wasm.mjs) imports its memory, and
 * the run's six field arrays are Float64Array views into that memory, so neither side copies: the driver,
 * the observers and the maps read the same numbers the engine writes. One memory and instance per run
 * (a fork gets its own); the compiled module is shared by every run of the thread.
 *
 * Its interaction step is `interactSvea` (or, with Kerr, `interactSveaKerr`) two nodes at a time (f64x2),
 * giving the same bits; its transport is the driver's shift as a memory move, with the same loss multiply.
 */
import type { Model } from '../problem/coupled-modes'
import { fastPathApplies, type FieldState } from '../steppers/interaction-kernel'
import { kerrFastPathApplies } from '../steppers/svea-kerr-kernel'
import { SVEA_STEP_WASM_BASE64 } from './svea-step-binary'

/** Which code advances the run: the TypeScript kernels, the WebAssembly engine, or the engine where it applies. */
export type EngineChoice = 'ts' | 'wasm' | 'auto'
export const ENGINE_CHOICES = ['ts', 'wasm', 'auto'] as const

/** What the WebAssembly engine covers today (one channel, SVEA, no noise; Kerr on or off); `engineProblem` names the rest. */
export function wasmEngineApplies(m: Model): boolean {
  return fastPathApplies(m) || kerrFastPathApplies(m)
}

/** Why a forced 'wasm' cannot run this model (a sentence for the user), or null when it can. */
export function engineProblem(choice: EngineChoice, m: Model): string | null {
  if (choice !== 'wasm' || wasmEngineApplies(m)) return null
  return 'The WebAssembly engine covers one channel with the slowly varying acoustic envelope and no thermal noise'
}

interface Exports {
  sveaStep(uRe: number, uIm: number, vRe: number, vIm: number, bRe: number, bIm: number, nz: number, K: number, c: number, Er: number, Ei: number, h: number): void
  sveaKerrStep(uRe: number, uIm: number, vRe: number, vIm: number, bRe: number, bIm: number, nz: number, K: number, exchangePerB: number, Er: number, Ei: number, h: number, kp: number, ks: number, kerrHalfPump: number, kerrHalfStokes: number): void
  transport(uRe: number, uIm: number, vRe: number, vIm: number, nz: number, loss: number): void
}

// The Node-side lib (ES2023, no DOM) declares no WebAssembly values: the three constructors used here.
interface WasmApi {
  Module: new (bytes: Uint8Array) => object
  Instance: new (module: object, imports: object) => { exports: unknown }
  Memory: new (descriptor: { initial: number }) => { buffer: ArrayBuffer }
}
const wasm = (globalThis as unknown as { WebAssembly: WasmApi }).WebAssembly

let compiled: object | null = null

function engineModule(): object {
  compiled ??= new wasm.Module(Uint8Array.from(atob(SVEA_STEP_WASM_BASE64), (ch) => ch.charCodeAt(0)))
  return compiled
}

const PAGE_BYTES = 65536
/** The first page is left to the module (its stack and static data, none today). */
const BASE_BYTES = PAGE_BYTES

export class WasmSveaEngine {
  readonly state: FieldState
  private readonly fn: Exports
  /** Byte addresses of uRe, uIm, vRe, vIm, bRe, bIm. */
  private readonly at: number[]
  private readonly kerr: boolean

  constructor(private readonly m: Model) {
    if (!wasmEngineApplies(m)) throw new Error('WasmSveaEngine: model outside the engine (engineProblem says why)')
    this.kerr = kerrFastPathApplies(m)
    const n = m.nodes
    // Each array starts on a 16-byte boundary (v128 loads need no alignment; this only keeps the layout tidy).
    const stride = Math.ceil((8 * n) / 16) * 16
    const memory = new wasm.Memory({ initial: Math.ceil((BASE_BYTES + 6 * stride) / PAGE_BYTES) })
    this.fn = new wasm.Instance(engineModule(), { env: { memory } }).exports as unknown as Exports
    this.at = [0, 1, 2, 3, 4, 5].map((i) => BASE_BYTES + i * stride)
    const view = (i: number) => new Float64Array(memory.buffer, this.at[i], n)
    // wRe, wIm and the general kernel's scratch are not used on this path: empty.
    const none = new Float64Array(0)
    this.state = { uRe: view(0), uIm: view(1), vRe: view(2), vIm: view(3), bRe: view(4), bIm: view(5), wRe: none, wIm: none, scratch: none }
  }

  /** The interaction step at every node (interior, then the two facets; with Kerr: the general kernel's order). */
  step(): void {
    const m = this.m
    const a = this.at
    if (this.kerr) {
      this.fn.sveaKerrStep(a[0], a[1], a[2], a[3], a[4], a[5], m.nz, m.driveK, m.exchangePerB, m.svea.eRe, m.svea.eIm, m.dtS, m.kappaP, m.rates.kappa, m.kerrHalfPump, m.kerrHalfStokes)
      return
    }
    this.fn.sveaStep(a[0], a[1], a[2], a[3], a[4], a[5], m.nz, m.driveK, m.exchangePerB, m.svea.eRe, m.svea.eIm, m.dtS)
  }

  /** The exact shift along the characteristics with the loss per cell. */
  transport(): void {
    const a = this.at
    this.fn.transport(a[0], a[1], a[2], a[3], this.m.nz, this.m.lossPerCell)
  }
}

/** A forced 'wasm' for a model the engine does not cover; the message is for the user. */
export class EngineUnavailableError extends Error {}

/**
 * The engine a run uses: 'wasm' where it applies ('auto') or when forced, else 'ts'. The general-kernel
 * testing aid wins over both. A forced 'wasm' the engine cannot run throws EngineUnavailableError.
 */
export function resolveEngine(choice: EngineChoice, m: Model, forceGeneral: boolean): 'ts' | 'wasm' {
  if (forceGeneral || choice === 'ts') return 'ts'
  const problem = engineProblem(choice, m)
  if (problem) throw new EngineUnavailableError(problem)
  return wasmEngineApplies(m) ? 'wasm' : 'ts'
}
