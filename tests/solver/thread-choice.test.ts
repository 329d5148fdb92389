// When a run gets a second thread (solver/engine/thread-choice.ts): automatically only on the WebAssembly
// engine's plain SVEA path, on a long grid and a long run, with a second core idle; forced counts are
// honoured or refused with the reason, never silently replaced.
import { describe, expect, it } from 'vitest'
import { planGrid, SimulationRun } from '../../solver/driver'
import { buildModel } from '../../solver/problem/coupled-modes'
import { resolveThreads, ThreadCountError } from '../../solver/engine/thread-choice'
import { CoreLease } from '../../solver/engine/core-lease'
import { estimateResources, SPEED_FACTOR_TWO_THREADS, THREAD_MIN_CELLS, THREAD_MIN_NODE_STEPS } from '@shared/physics/resource-estimate'
import { simulateSync } from '../../solver/index'
import { chipConfig } from './chip-fixtures'

const VG = 299_792_458 / 2.44
const cells = (n: number) => ({ timeStepPs: (0.05 / (VG * n)) * 1e12, mapRows: 16, mapCols: 16 })
const cw = [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }]
const modelOf = (nz: number, extra: Parameters<typeof chipConfig>[0] = {}) => {
  const config = chipConfig({ windowNs: 2, grid: cells(nz), channels: cw, ...extra })
  return buildModel(config, planGrid(config))
}
const idle = () => ({ cores: 2, load: 0.9 })
const busy = () => ({ cores: 2, load: 2.1 })
const oneCore = () => ({ cores: 1, load: 0 })

describe('automatic thread count', () => {
  const large = modelOf(THREAD_MIN_CELLS)
  it('two on a long plain grid with an idle second core', () => {
    expect(large.nodes * (large.nt + 1)).toBeGreaterThan(THREAD_MIN_NODE_STEPS)
    expect(resolveThreads('auto', large, 'wasm', false, idle)).toBe(2)
  })
  it('one on a busy machine or a single core', () => {
    expect(resolveThreads('auto', large, 'wasm', false, busy)).toBe(1)
    expect(resolveThreads('auto', large, 'wasm', false, oneCore)).toBe(1)
  })
  it('one below the measured break-even grid', () => {
    expect(resolveThreads('auto', modelOf(THREAD_MIN_CELLS - 1), 'wasm', false, idle)).toBe(1)
  })
  it('one on the TypeScript engine and for options outside the plain path', () => {
    expect(resolveThreads('auto', large, 'ts', false, idle)).toBe(1)
    expect(resolveThreads('auto', large, 'wasm', true, idle)).toBe(1)
    const kerr = modelOf(THREAD_MIN_CELLS, { waveguide: { kerrN2M2PerW: 1e-17 }, options: { kerr: true } })
    expect(resolveThreads('auto', kerr, 'wasm', false, idle)).toBe(1)
    const advection = modelOf(THREAD_MIN_CELLS, { options: { acousticAdvection: true } })
    expect(resolveThreads('auto', advection, 'wasm', false, idle)).toBe(1)
  })
})

describe('forced thread count', () => {
  const small = modelOf(41)
  it('is honoured on the plain path whatever the size and load', () => {
    expect(resolveThreads(2, small, 'wasm', false, busy)).toBe(2)
    expect(resolveThreads(1, modelOf(THREAD_MIN_CELLS), 'wasm', false, idle)).toBe(1)
  })
  it('is refused with the reason outside it, or out of range', () => {
    expect(() => resolveThreads(2, small, 'ts', false, idle)).toThrow(ThreadCountError)
    expect(() => resolveThreads(2, small, 'ts', false, idle)).toThrow('WebAssembly engine only')
    const noise = modelOf(41, { options: { noise: { enabled: true, temperatureK: 300, seed: 1 } } })
    expect(() => resolveThreads(2, noise, 'wasm', false, idle)).toThrow('no thermal noise')
    expect(() => resolveThreads(3, small, 'wasm', false, idle)).toThrow('The thread count is 1 or 2')
  })
  it('reaches the run, and a refusal is a failed run naming the threads option', () => {
    const config = chipConfig({ windowNs: 2, grid: cells(41), channels: cw })
    const run = new SimulationRun(config, planGrid(config), { threads: 2 })
    expect(run.threads).toBe(2)
    run.close()
    expect(new SimulationRun(config, planGrid(config), { threads: 1 }).threads).toBe(1)
    const refused = simulateSync(config, { threads: 2, engine: 'ts' })
    expect(refused.status).toBe('failed')
    expect(refused.manifest.issues?.map((i) => i.path)).toEqual(['threads'])
  })
})

describe('resource estimate', () => {
  it('counts the second thread on the runs the automatic choice gives two, and only there', () => {
    const at = (nz: number, extra: Parameters<typeof chipConfig>[0] = {}) => {
      const config = chipConfig({ windowNs: 2, grid: cells(nz), channels: cw, ...extra })
      return estimateResources(config, planGrid(config)).cellUpdatesPerS
    }
    const small = at(THREAD_MIN_CELLS - 1)
    expect(at(THREAD_MIN_CELLS) / small).toBeCloseTo(SPEED_FACTOR_TWO_THREADS, 12)
    const kerr = { waveguide: { kerrN2M2PerW: 1e-17 }, options: { kerr: true } }
    expect(at(THREAD_MIN_CELLS, kerr)).toBe(at(THREAD_MIN_CELLS - 1, kerr))
  })
})

describe('core lease: one count of computing threads for all solver threads of a server', () => {
  const large = modelOf(THREAD_MIN_CELLS)
  it('a run takes a helper only from a free core, and gives it back', () => {
    const buffer = CoreLease.buffer(2, 2)
    const a = new CoreLease(buffer, 0)
    const b = new CoreLease(buffer, 1)
    a.enter()
    expect(resolveThreads('auto', large, 'wasm', false, idle, a)).toBe(2)
    expect(a.inUse).toBe(2)
    b.enter()
    // Both cores are taken (a run and its helper): the second run keeps to its own thread.
    expect(resolveThreads('auto', large, 'wasm', false, idle, b)).toBe(1)
    expect(b.inUse).toBe(3)
    a.giveHelper()
    a.leave()
    expect(resolveThreads('auto', large, 'wasm', false, idle, b)).toBe(2)
    expect(b.inUse).toBe(2)
  })
  it('a forced helper is counted even without a free core', () => {
    const buffer = CoreLease.buffer(1, 1)
    const a = new CoreLease(buffer, 0)
    a.enter()
    expect(resolveThreads(2, large, 'wasm', false, idle, a)).toBe(2)
    expect(a.inUse).toBe(2)
  })
  it('a solver thread that ended mid-run gives back all it held', () => {
    const buffer = CoreLease.buffer(4, 2)
    const a = new CoreLease(buffer, 0)
    const b = new CoreLease(buffer, 1)
    a.enter()
    b.enter()
    expect(resolveThreads('auto', large, 'wasm', false, idle, a)).toBe(2)
    CoreLease.release(buffer, 0)
    expect(b.inUse).toBe(1)
  })
  it('a run gives its helper back when it closes', () => {
    const config = chipConfig({ windowNs: 2, grid: cells(41), channels: cw })
    const lease = new CoreLease(CoreLease.buffer(2, 1), 0)
    lease.enter()
    const run = new SimulationRun(config, planGrid(config), { threads: 2, coreLease: lease })
    expect(lease.inUse).toBe(2)
    run.close()
    run.close()
    expect(lease.inUse).toBe(1)
  })
})
