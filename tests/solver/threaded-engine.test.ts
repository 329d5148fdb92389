// Two threads on one run (solver/engine/threaded-engine.ts) against one thread: the interaction of a node
// touches that node only and the transport is an exact shift, so cutting z into chunks must not change one
// bit (docs/numerics.md, "Threaded step"). Whole runs compare every returned array with Object.is; the engine
// alone is stepped against the one-thread engine with chunks of 1, 2, 3 and 7 nodes and up to 4 threads,
// odd and even cell counts, so every chunk edge case (a facet inside a chunk, a one-node chunk) is crossed.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { simulateSync, type SimulationResult } from '../../solver/index'
import { planGrid, SimulationRun } from '../../solver/driver'
import { buildModel } from '../../solver/problem/coupled-modes'
import { ThreadedSveaEngine } from '../../solver/engine/threaded-engine'
import { WasmSveaEngine } from '../../solver/engine/wasm-engine'
import { MapRecorder, mapLayout } from '../../solver/observers/map-recorder'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44
const cells = (n: number) => ({ timeStepPs: (0.05 / (VG * n)) * 1e12, mapRows: 32, mapCols: 32 })
const crossing = { pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)], backgroundPowerW: 1e-3 } }
const example = (name: string) => SimulationConfig.parse(JSON.parse(readFileSync(new URL(`../../solver/examples/${name}.json`, import.meta.url), 'utf8')))

const RUNS: Record<string, SimulationConfig> = {
  'chip, 41 cells (odd), lossy, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30 }, channels: [crossing] }),
  'chip, 40 cells (even), CW depletion, lossless, detuned': chipConfig({ windowNs: 4, grid: cells(40), detuningMHz: 25, channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }] }),
  'chip, 1201 cells (odd, three chunks), lossy, crossing pulses': chipConfig({ windowNs: 3, grid: cells(1201), waveguide: { lossDbPerM: 30 }, channels: [crossing] }),
  'chip, 1201 cells, maps by block mean (a column of 31 nodes: chunks of 527)': chipConfig({ windowNs: 3, grid: { ...cells(1201), mapCols: 39, mapRows: 50, mapReduction: 'mean' }, waveguide: { lossDbPerM: 30 }, channels: [crossing] }),
  'storage 150 ps, SVEA (its reference run on one thread)': example('storage-150ps-svea'),
  'CW amplifier, lossy fibre': example('cw-amplifier-silica-fibre'),
}

function firstDifference(a: SimulationResult, b: SimulationResult): string | null {
  const names = Object.keys(a.arrays)
  if (names.join() !== Object.keys(b.arrays).join()) return `array names ${names} vs ${Object.keys(b.arrays)}`
  for (const name of names) {
    const x = a.arrays[name], y = b.arrays[name]
    if (x.length !== y.length) return `${name}: length ${x.length} vs ${y.length}`
    for (let i = 0; i < x.length; i++) if (!Object.is(x[i], y[i])) return `${name}[${i}]: ${x[i]} vs ${y[i]}`
  }
  return null
}

describe('two threads: whole runs bit-identical to one thread', () => {
  for (const [name, config] of Object.entries(RUNS)) {
    it(name, () => {
      const one = simulateSync(config, { threads: 1 })
      const two = simulateSync(config, { threads: 2 })
      expect(one.status).toBe('finished')
      expect(two.status).toBe('finished')
      expect(firstDifference(one, two)).toBeNull()
    })
  }
})

/** A state of random numbers (boundary cells included), the same in both engines. */
function fill(states: { uRe: Float64Array }[], seed: number): void {
  let x = seed
  const next = () => ((x = (Math.imul(x, 1103515245) + 12345) >>> 0) / 2 ** 32 - 0.5) * 1e-3
  const keys = ['uRe', 'uIm', 'vRe', 'vIm', 'bRe', 'bIm'] as const
  const n = states[0].uRe.length
  for (const key of keys) for (let j = 0; j < n; j++) {
    const v = next()
    for (const s of states) (s as unknown as Record<string, Float64Array>)[key][j] = v
  }
}

describe('threaded engine: any chunk size and thread count gives the one-thread bits', () => {
  const cases: [number, number, number, number, number][] = [
    // [cells, threads, nodes per chunk, loss dB/m, steps]
    [7, 2, 1, 30, 25],
    [8, 2, 2, 0, 25],
    [41, 3, 3, 30, 25],
    [40, 4, 7, 30, 25],
    [101, 2, 50, 0, 25],
    // Past the engine's first trial of the helpers' share (256 phases), after which the run's thread may go on alone.
    [41, 2, 4, 30, 700],
  ]
  for (const [nz, threads, chunk, lossDbPerM, steps] of cases) for (const helpersOnly of [false, true]) {
    const who = helpersOnly ? 'every chunk on a helper' : 'chunks taken by whichever thread is free'
    it(`${nz} cells, ${threads} threads, chunks of ${chunk} node(s), loss ${lossDbPerM} dB/m, ${steps} steps, ${who}`, () => {
      const config = chipConfig({ windowNs: 1, grid: cells(nz), detuningMHz: 12, waveguide: { lossDbPerM } })
      const m = buildModel(config, planGrid(config))
      expect(m.nz).toBe(nz)
      const one = new WasmSveaEngine(m)
      const many = new ThreadedSveaEngine(m, threads, chunk, helpersOnly)
      try {
        fill([one.state, many.state], nz * 7919 + threads)
        // Large fields, so the exchange is far from the identity and every term counts.
        for (const s of [one.state, many.state]) for (const a of [s.uRe, s.uIm]) for (let j = 0; j < a.length; j++) a[j] *= 1e3
        for (let step = 0; step < steps; step++) {
          one.step()
          many.step()
          one.transport()
          many.transport()
        }
        for (const key of ['uRe', 'uIm', 'vRe', 'vIm', 'bRe', 'bIm'] as const) {
          const a = one.state[key], b = many.state[key]
          let bad = -1
          for (let j = 0; j < a.length; j++) if (!Object.is(a[j], b[j])) (bad = j), (j = a.length)
          expect(bad, `${key} first differs at node ${bad}`).toBe(-1)
        }
        // Not a vacuous comparison: the state moved.
        expect(one.state.bRe.some((v) => v !== 0)).toBe(true)
        for (const key of ['uRe', 'vRe', 'bRe'] as const) expect(one.state[key].every(Number.isFinite), key).toBe(true)
        if (helpersOnly) expect([many.ownChunks, many.allChunks]).toEqual([0, 2 * steps * Math.ceil((nz + 1) / chunk)])
      } finally {
        many.close()
      }
    })
  }
})

describe('threaded engine: the transport left for the next step gives the one-thread bits', () => {
  // The driver's threaded path: transportLater(inputs) and one phase per step (the shift, the boundary inputs,
  // then the interaction), against the one-thread engine's step, transport and the driver's inject.
  const cases: [number, number, number, number][] = [
    // [cells, threads, nodes per chunk, loss dB/m]
    [7, 2, 1, 30],
    [40, 2, 3, 0],
    [41, 3, 4, 30],
    [1201, 2, 512, 30],
  ]
  for (const [nz, threads, chunk, lossDbPerM] of cases) for (const helpersOnly of [false, true]) {
    it(`${nz} cells, ${threads} threads, chunks of ${chunk}, loss ${lossDbPerM} dB/m, ${helpersOnly ? 'every chunk on a helper' : 'any thread'}`, () => {
      const config = chipConfig({ windowNs: 1, grid: cells(nz), detuningMHz: 12, waveguide: { lossDbPerM } })
      const m = buildModel(config, planGrid(config))
      const one = new WasmSveaEngine(m)
      const many = new ThreadedSveaEngine(m, threads, chunk, helpersOnly)
      try {
        fill([one.state, many.state], nz * 31 + threads)
        for (const s of [one.state, many.state]) for (const a of [s.uRe, s.uIm]) for (let j = 0; j < a.length; j++) a[j] *= 1e3
        const steps = 300
        const input = (n: number, i: number) => Math.sin(0.37 * n + i) * (i < 2 ? 1e3 : 1)
        for (let n = 0; n < steps; n++) {
          one.step()
          many.step()
          // Between the phases the state is the one after the interaction step, as the driver's ports read it.
          expect(Object.is(many.state.uRe[nz], one.state.uRe[nz]) && Object.is(many.state.vIm[0], one.state.vIm[0])).toBe(true)
          one.transport()
          const s = one.state
          ;[s.uRe[0], s.uIm[0], s.vRe[nz], s.vIm[nz]] = [input(n, 0), input(n, 1), input(n, 2), input(n, 3)]
          many.transportLater(input(n, 0), input(n, 1), input(n, 2), input(n, 3))
          // Now and then the state is read mid-run (a fork): settle() does the pending transport first.
          if (n % 97 === 0) many.settle()
        }
        many.settle()
        for (const key of ['uRe', 'uIm', 'vRe', 'vIm', 'bRe', 'bIm'] as const) {
          const a = one.state[key], b = many.state[key]
          let bad = -1
          for (let j = 0; j < a.length; j++) if (!Object.is(a[j], b[j])) (bad = j), (j = a.length)
          expect(bad, `${key} first differs at node ${bad}`).toBe(-1)
        }
        expect(one.state.bRe.some((v) => v !== 0)).toBe(true)
        for (const key of ['uRe', 'vRe', 'bRe'] as const) expect(one.state[key].every(Number.isFinite), key).toBe(true)
      } finally {
        many.close()
      }
    })
  }
})

describe('threaded engine: the maps sampled in the phase equal the sample the recorder takes itself', () => {
  // [cells, nodes per chunk, map columns, reduction]: chunks round up to whole columns (3 → 4 nodes for columns of 2).
  const cases: [number, number, number, 'max' | 'mean'][] = [
    [41, 3, 21, 'mean'],
    [41, 3, 21, 'max'],
    [100, 7, 9, 'mean'],
  ]
  for (const [nz, chunk, cols, reduction] of cases) for (const helpersOnly of [false, true]) {
    it(`${nz} cells, chunks of ${chunk}, ${cols} columns by block ${reduction}, ${helpersOnly ? 'every chunk on a helper' : 'any thread'}`, () => {
      const config = chipConfig({ windowNs: 1, grid: cells(nz), waveguide: { lossDbPerM: 30 } })
      const m = buildModel(config, planGrid(config))
      const steps = 200
      const layout = mapLayout(steps, m.nodes, 24, cols)
      const mapsOne = new MapRecorder(layout, m, reduction === 'max')
      const mapsMany = new MapRecorder(layout, m, reduction === 'max')
      const one = new WasmSveaEngine(m)
      const acc = mapsMany.shareAccumulators().buffer as SharedArrayBuffer
      const many = new ThreadedSveaEngine(m, 2, chunk, helpersOnly, { ...mapsMany.samplerSettings, acc })
      try {
        fill([one.state, many.state], nz + cols)
        for (const s of [one.state, many.state]) for (const a of [s.uRe, s.uIm]) for (let j = 0; j < a.length; j++) a[j] *= 1e3
        for (let n = 0; n <= steps; n++) {
          one.step()
          mapsOne.record(n, one.state)
          many.step(mapsMany.sampleAt(n))
          mapsMany.record(n, many.state, true)
          one.transport()
          many.transportLater(one.state.uRe[0], one.state.uIm[0], one.state.vRe[nz], one.state.vIm[nz])
        }
        for (const key of ['pumpPowerW', 'stokesPowerW', 'acousticPhononsPerM'] as const) {
          const a = mapsOne[key], b = mapsMany[key]
          expect(a.length).toBe(layout.rows * layout.cols)
          let bad = -1
          for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) (bad = i), (i = a.length)
          expect(bad, `${key} first differs at ${bad}`).toBe(-1)
          // Not vacuous: the map has content that varies along z.
          expect(new Set(a).size).toBeGreaterThan(cols)
        }
      } finally {
        many.close()
      }
    })
  }
})

describe('two threads: stopping', () => {
  const config = RUNS['chip, 1201 cells (odd, three chunks), lossy, crossing pulses']
  it('a stop request ends the run at the next chunk check, as on one thread', () => {
    let polls = 0
    const r = simulateSync(config, { threads: 2, shouldAbort: () => ++polls > 3 })
    expect(r.status).toBe('aborted')
    expect(r.manifest.counters.steps).toBeGreaterThan(0)
    expect(r.manifest.counters.steps).toBeLessThan(planGrid(config).nt)
  })
  it('closing a run ends its helper: the engine takes no further step', () => {
    const run = new SimulationRun(config, planGrid(config), { threads: 2 })
    run.advance(5)
    run.close()
    expect(() => run.advance(1)).toThrow('used after close')
  })
})
