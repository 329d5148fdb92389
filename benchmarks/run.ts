// `npm run bench [-- --quick | --engines | --threads]`: throughput, memory, linear-cost and work–precision figures of the solver,
// then the oscillation analysis's coverage table (oscillation-coverage.ts; --quick: white noise only).
// Prints figures and never asserts; record them in benchmarks/README.md with the date and machine.
import os from 'node:os'
import { simulateSync, type EngineChoice, type SimulationResult } from '../solver/index'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { brillouinRates } from '@shared/physics/grid-step'
import { exactDepletion } from '../tests/solver/closed-forms'
import { cwDepletionCase, gridCase } from './cases'
import { oscillationCoverage } from './oscillation-coverage'
import { optionKernelTable } from './option-kernels'

const quick = process.argv.includes('--quick')
/** --quick skips every run above this many cell-updates. */
const QUICK_CAP = 1e8
const MiB = 1024 ** 2

interface Measured {
  result: SimulationResult
  seconds: number
  peakRssMiB: number
  peakHeapMiB: number
}

/** One thread unless asked: every table but the threads table compares one-thread figures. */
function measure(config: SimulationConfig, engine: EngineChoice = 'auto', forceGeneralKernel = false, threads = 1): Measured {
  let peakRss = 0
  let peakHeap = 0
  const sample = () => {
    const m = process.memoryUsage()
    peakRss = Math.max(peakRss, m.rss)
    peakHeap = Math.max(peakHeap, m.heapUsed + m.arrayBuffers)
  }
  sample()
  const t0 = performance.now()
  // Throughput of the scheme itself: the error estimate's companion run would add a quarter of untimed work.
  const result = simulateSync({ ...config, options: { ...config.options, errorEstimate: false } }, { onProgress: sample, engine, forceGeneralKernel, threads })
  const seconds = (performance.now() - t0) / 1000
  sample()
  if (result.status !== 'finished') throw new Error(`benchmark run ${result.status}: ${result.message}`)
  return { result, seconds, peakRssMiB: peakRss / MiB, peakHeapMiB: peakHeap / MiB }
}

const pad = (s: string | number, n: number) => String(s).padStart(n)
const fmt = (x: number, p = 3) => x.toPrecision(p)

function throughputTable(): void {
  console.log('\n## Fixed cases (one channel, Δt = 1 ps; simulateSync)')
  console.log(`${pad('case', 28)} ${pad('Nz', 6)} ${pad('Nt', 7)} ${pad('cell-upd', 9)} ${pad('steps', 7)} ${pad('time s', 7)} ${pad('Mcell/s', 8)} ${pad('ns/cell', 8)} ${pad('peak rss MiB', 12)} ${pad('heap+ab MiB', 11)}`)
  const sizes: [number, number][] = [[2000, 20000], [8000, 40000]]
  const variants = [
    { label: 'SVEA', o: {} },
    { label: 'higher-order acoustic', o: { higherOrderAcoustic: true } },
    { label: 'SVEA + thermal noise', o: { noise: true } },
  ]
  for (const v of variants) {
    for (const [nz, nt] of sizes) {
      if (quick && nz * nt > QUICK_CAP) continue
      const m = measure(gridCase(nz, nt, v.o))
      const c = m.result.manifest.counters
      const g = m.result.manifest.grid!
      console.log(
        `${pad(v.label, 28)} ${pad(g.nz, 6)} ${pad(g.nt, 7)} ${pad(fmt(c.cellUpdates), 9)} ${pad(c.steps, 7)} ${pad(m.seconds.toFixed(2), 7)} ` +
          `${pad(fmt(c.cellUpdates / m.seconds / 1e6), 8)} ${pad(fmt((m.seconds * 1e9) / c.cellUpdates), 8)} ${pad(m.peakRssMiB.toFixed(0), 12)} ${pad(m.peakHeapMiB.toFixed(0), 11)}`,
      )
    }
  }
}

/**
 * Both step engines on the same runs, interleaved (ts, wasm, ts, wasm, …) so a change of machine load hits
 * both; best of 3. Kerr rows also time the general kernel, which computed Kerr runs before the flat Kerr path.
 */
function engineTable(): void {
  console.log('\n## Step engines side by side (one channel, SVEA; best of 3, interleaved; Mcell/s)')
  console.log(`${pad('case', 6)} ${pad('Nz', 6)} ${pad('Nt', 7)} ${pad('cell-upd', 9)} ${pad('ts general', 11)} ${pad('ts', 7)} ${pad('wasm', 7)} ${pad('wasm/ts', 8)} ${pad('wasm/plain wasm', 16)}`)
  const sizes: [number, number][] = [[2000, 20000], [8000, 40000]]
  for (const [nz, nt] of sizes) {
    if (quick && nz * nt > QUICK_CAP) continue
    const plain = gridCase(nz, nt)
    const kerr = { ...plain, waveguide: { ...plain.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...plain.options, kerr: true } }
    let plainWasm = 0
    for (const [label, config] of [['plain', plain], ['Kerr', kerr]] as const) {
      const best = { general: Infinity, ts: Infinity, wasm: Infinity }
      let cells = 0
      for (let rep = 0; rep < 3; rep++) {
        for (const engine of ['ts', 'wasm'] as const) {
          const m = measure(config, engine)
          cells = m.result.manifest.counters.cellUpdates
          best[engine] = Math.min(best[engine], m.seconds)
        }
        if (label === 'Kerr') best.general = Math.min(best.general, measure(config, 'ts', true).seconds)
      }
      const rate = (s: number) => cells / s / 1e6
      if (label === 'plain') plainWasm = rate(best.wasm)
      const general = Number.isFinite(best.general) ? fmt(rate(best.general)) : ''
      console.log(
        `${pad(label, 6)} ${pad(nz, 6)} ${pad(nt, 7)} ${pad(fmt(cells), 9)} ${pad(general, 11)} ${pad(fmt(rate(best.ts)), 7)} ${pad(fmt(rate(best.wasm)), 7)} ` +
          `${pad((best.ts / best.wasm).toFixed(2), 8)} ${pad((rate(best.wasm) / plainWasm).toFixed(2), 16)}`,
      )
    }
  }
}

/**
 * One run on one thread and on two (the WebAssembly engine's plain SVEA path, z in chunks shared by the
 * threads), interleaved 1, 2, 1, 2, … so a change of machine load hits both; best of 3. The load average
 * is printed beside each row: two threads pay only while the second core is idle.
 */
function threadTable(): void {
  console.log('\n## Threads on one run side by side (one channel, SVEA, WebAssembly engine; best of 3, interleaved; Mcell/s)')
  console.log(`${pad('Nz', 6)} ${pad('Nt', 7)} ${pad('cell-upd', 9)} ${pad('1 thread', 9)} ${pad('2 threads', 10)} ${pad('2/1', 6)} ${pad('load avg', 9)}`)
  for (const [nz, nt] of [[1000, 40000], [2000, 40000], [4000, 20000], [8000, 20000], [16000, 10000]]) {
    if (quick && nz * nt > QUICK_CAP) continue
    const config = gridCase(nz, nt)
    const best = [Infinity, Infinity]
    let cells = 0
    for (let rep = 0; rep < 3; rep++) {
      for (const threads of [1, 2]) {
        const m = measure(config, 'wasm', false, threads)
        cells = m.result.manifest.counters.cellUpdates
        best[threads - 1] = Math.min(best[threads - 1], m.seconds)
      }
    }
    const rate = (s: number) => cells / s / 1e6
    console.log(`${pad(nz, 6)} ${pad(nt, 7)} ${pad(fmt(cells), 9)} ${pad(fmt(rate(best[0])), 9)} ${pad(fmt(rate(best[1])), 10)} ${pad((best[0] / best[1]).toFixed(2), 6)} ${pad(os.loadavg()[0].toFixed(2), 9)}`)
  }
}

function scalingTable(): void {
  console.log('\n## Time per cell-update vs problem size (SVEA; flat = linear cost)')
  console.log(`${pad('cell-updates', 12)} ${pad('Nz', 6)} ${pad('Nt', 7)} ${pad('time s', 7)} ${pad('ns/cell', 8)} ${pad('peak rss MiB', 12)}`)
  for (const target of [1e6, 1e7, 1e8, 1e9]) {
    if (quick && target > QUICK_CAP) continue
    // Keep N_t = 10·N_z so state and traces grow together.
    const nz = Math.round(Math.sqrt(target / 10))
    const m = measure(gridCase(nz, 10 * nz))
    const c = m.result.manifest.counters
    console.log(`${pad(fmt(c.cellUpdates), 12)} ${pad(nz, 6)} ${pad(10 * nz, 7)} ${pad(m.seconds.toFixed(2), 7)} ${pad(fmt((m.seconds * 1e9) / c.cellUpdates), 8)} ${pad(m.peakRssMiB.toFixed(0), 12)}`)
  }
}

function workPrecision(): void {
  console.log('\n## Work–precision: CW depletion (docs/validation.md V4), Stokes output P_s(0) at 150 ns')
  const stokesOut = (r: SimulationResult) => {
    const a = r.channels[0].stokesOut
    const n = a.length / 2 - 1
    return a[2 * n] ** 2 + a[2 * n + 1] ** 2
  }
  const ref = measure(cwDepletionCase(0.5))
  const refW = stokesOut(ref.result)
  const base = cwDepletionCase(1)
  const rates = brillouinRates(base.waveguide)
  const exactW = exactDepletion(0.5, 1e-3, rates.gainPerWM, base.waveguide.lengthM, rates.frequencyRatio).stokesOutW
  console.log(`exact (Tang 1966) P_s(0) = ${exactW.toPrecision(7)} W; fine-step reference (Δt = 0.5 ps) = ${refW.toPrecision(7)} W, rel. diff ${fmt(Math.abs(refW - exactW) / exactW, 2)}`)
  console.log(`${pad('Δt ps', 6)} ${pad('Nz', 5)} ${pad('Nt', 7)} ${pad('cell-upd', 9)} ${pad('time s', 7)} ${pad('err vs ref', 10)} ${pad('order', 6)} ${pad('err vs exact', 12)}`)
  let prev: number | null = null
  for (const dtPs of [16, 8, 4, 2]) {
    const m = measure(cwDepletionCase(dtPs))
    const p = stokesOut(m.result)
    const err = Math.abs(p - refW) / refW
    const order = prev !== null ? Math.log2(prev / err).toFixed(2) : ''
    prev = err
    const g = m.result.manifest.grid!
    console.log(`${pad(dtPs, 6)} ${pad(g.nz, 5)} ${pad(g.nt, 7)} ${pad(fmt(m.result.manifest.counters.cellUpdates), 9)} ${pad(m.seconds.toFixed(2), 7)} ${pad(fmt(err, 2), 10)} ${pad(order, 6)} ${pad(fmt(Math.abs(p - exactW) / exactW, 2), 12)}`)
  }
}

console.log(`# Sonoweave solver benchmark ${new Date().toISOString()}${quick ? ' (--quick: runs above 1e8 cell-updates skipped)' : ''}`)
console.log(`node ${process.version}, ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}, load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`)
if (process.argv.includes('--engines')) {
  engineTable()
  optionKernelTable()
} else if (process.argv.includes('--threads')) {
  threadTable()
} else {
  throughputTable()
  engineTable()
  optionKernelTable()
  threadTable()
  scalingTable()
  workPrecision()
  oscillationCoverage(quick)
}
console.log(`\nload average at the end ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`)
