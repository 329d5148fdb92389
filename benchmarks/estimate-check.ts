// The resource estimate against the measured time, case by case, in one run: `node --import tsx
// benchmarks/estimate-check.ts [--skip-1km | --scan-1km] [--out file.json]`. For each case, first three history runs of the
// same kernel class (half the window; what the server would have seen before) whose measured speed
// calibrates the estimate exactly as the server does (server/modules/estimates/speed-calibration.ts); then
// the case itself, timed through simulateSync as a solver thread runs it (the error-estimate companion
// included where the case has one). Prints the benchmark-figure estimate, the calibrated estimate and its
// range, the measured time and the ratios, the load average before and after each case, and the measured
// speed factors of each class against the plain path's (written to --out as JSON). Figures only, no assertions.
import { writeFileSync } from 'node:fs'
import { loadavg } from 'node:os'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { estimateResources, envelopeCounts, PLAIN_FIELDS, PLAIN_WAVES } from '@shared/physics/resource-estimate'
import { describeKernel, kernelKey } from '@shared/physics/kernel-class'
import { calibrate, type CostObservation } from '../server/modules/estimates/speed-calibration'
import { simulateSync } from '../solver/index'
import { gridCase } from './cases'
import { fibre } from './sensing-fibre'

const load = () => loadavg()[0].toFixed(2)
const outAt = process.argv.indexOf('--out')
const outFile = outAt > 0 ? process.argv[outAt + 1] : null

/** One run as a solver thread runs it: wall time, cell-updates of the run and its companion, and the kernel class. */
function run(config: SimulationConfig, engine: 'ts' | 'auto' = 'auto'): CostObservation & { seconds: number } {
  const t0 = performance.now()
  const r = simulateSync(config, { engine })
  const seconds = (performance.now() - t0) / 1000
  if (r.status !== 'finished' || !r.manifest.kernel) throw new Error(`benchmark run ${r.status}: ${r.message}`)
  const { waves, fields } = envelopeCounts(config)
  const cellUpdates = r.manifest.counters.cellUpdates + (r.manifest.figures?.errorEstimate?.cellUpdates ?? 0)
  return { kernel: r.manifest.kernel, cellUpdates, envelopeRatio: (waves + fields) / (PLAIN_WAVES + PLAIN_FIELDS), wallS: seconds, cpuS: null, at: new Date(), seconds }
}

const withWindow = (c: SimulationConfig, f: number): SimulationConfig => ({ ...c, windowNs: c.windowNs * f })
const withOptions = (c: SimulationConfig, o: Partial<SimulationConfig['options']>): SimulationConfig => ({ ...c, options: { ...c.options, ...o } })
// n₂ of silica, about 2.6e-20 m²/W (common practice; Agrawal, Nonlinear Fiber Optics, ch. 2).
const kerr = (c: SimulationConfig): SimulationConfig => withOptions({ ...c, waveguide: { ...c.waveguide, kerrN2M2PerW: 2.6e-20 } }, { kerr: true })
const base = gridCase(2000, 40000)
// The engine's cases are larger, so their half-window history runs still pass the calibration's shortest run (0.5 s).
const wide = gridCase(4000, 60000)
const cases: Array<[string, SimulationConfig]> = [
  ['SVEA (plain)', wide],
  ['Kerr', kerr(wide)],
  ['thermal noise', gridCase(2000, 40000, { noise: true })],
  ['higher-order acoustic', gridCase(2000, 40000, { higherOrderAcoustic: true })],
  ['two channels', { ...base, channels: [base.channels[0], { ...base.channels[0], offsetGHz: 5 }] }],
  ['forward resonance (multi-wave)', { ...base, waveguide: { ...base.waveguide, forwardResonances: [{ frequencyMHz: 2000, linewidthMHz: 80, gainCoefficientMPerW: 3e-10, antiStokesMismatchPerM: 40 }] } }],
  ['long grid N_z = 8000 (threads auto)', gridCase(8000, 40000)],
  // Option pairs on their flat kernels: the estimate multiplies the options' factors.
  ['two channels with thermal noise', gridCase(2000, 40000, { channels: 2, noise: true })],
  ['two channels with Kerr and thermal noise', kerr(gridCase(2000, 40000, { channels: 2, noise: true }))],
  ['higher-order acoustic with Kerr', kerr(gridCase(2000, 40000, { higherOrderAcoustic: true }))],
  ['two channels with higher-order acoustic', gridCase(2000, 40000, { channels: 2, higherOrderAcoustic: true })],
]
if (!process.argv.includes('--skip-1km')) cases.push(['1 km sensing fibre, 1 m resolution (profile)', fibre(1000, 800)])
/** The history of a case: three runs of half its window, or with --scan-1km for the 1 km point, three earlier points of its scan. */
const scanPoint = (c: SimulationConfig, k: number): SimulationConfig => ({ ...c, detuningMHz: c.detuningMHz + 5 * (k - 3) })
const SCAN = '1 km sensing scan point (history: 3 earlier points)'
if (process.argv.includes('--scan-1km')) cases.splice(0, cases.length, [SCAN, fibre(1000, 800)])

// Warm-up: every kernel compiled before anything is timed.
if (cases.length === 0) throw new Error('no case')
for (const [, c] of cases) simulateSync(withWindow(c, 0.05))
simulateSync(withWindow(base, 0.05), { engine: 'ts' })
// The TypeScript engine's plain path: the reference of the option factors (no estimate: the product runs the engine).
const tsPlain = run(wide, 'ts')

const pad = (s: string | number, n: number) => String(s).padStart(n)
const rows: Array<Record<string, unknown>> = []
console.log(`load average at start ${load()}`)
console.log(`${pad('case', 46)} ${pad('class', 16)} ${pad('cell-upd', 9)} ${pad('bench est s', 11)} ${pad('calib est s', 11)} ${pad('range s', 13)} ${pad('measured s', 10)} ${pad('bench/meas', 10)} ${pad('calib/meas', 10)} ${pad('load', 10)}`)
for (const [name, config] of cases) {
  const loadBefore = load()
  const history = [0, 1, 2].map((k) => run(name === SCAN ? scanPoint(config, k) : withWindow(config, 0.5)))
  const grid = chooseGrid(config)
  const bench = estimateResources(config, grid)
  const calibrated = estimateResources(config, grid, 1, calibrate(history))
  const m = run(config)
  const b = calibrated.timeBasis
  const row = {
    name,
    kernel: kernelKey(m.kernel),
    predicted: kernelKey(calibrated.timeBasis.kernel),
    cellUpdates: m.cellUpdates,
    benchmarkEstimateS: bench.expectedSeconds,
    calibratedEstimateS: calibrated.expectedSeconds,
    basis: b.source,
    rangeS: [b.fastSeconds, b.slowSeconds],
    measuredS: m.seconds,
    measuredPerS: (m.cellUpdates * m.envelopeRatio) / m.seconds,
    load: [Number(loadBefore), Number(load())],
  }
  rows.push(row)
  const range = `${b.fastSeconds.toFixed(1)}–${b.slowSeconds.toFixed(1)}`
  console.log(
    `${pad(name, 46)} ${pad(row.kernel, 16)} ${pad(m.cellUpdates.toExponential(2), 9)} ${pad(bench.expectedSeconds.toFixed(2), 11)} ${pad(calibrated.expectedSeconds.toFixed(2), 11)} ${pad(range, 13)} ${pad(m.seconds.toFixed(2), 10)} ` +
      `${pad((bench.expectedSeconds / m.seconds).toFixed(2), 10)} ${pad((calibrated.expectedSeconds / m.seconds).toFixed(2), 10)} ${pad(`${loadBefore}→${load()}`, 10)}`,
  )
  if (row.kernel !== row.predicted) console.log(`  (ran as ${describeKernel(m.kernel)}; the estimate predicted ${describeKernel(calibrated.timeBasis.kernel)})`)
}

// Speed factors of each class against the TypeScript plain path measured in this run (plain-scheme cell-updates
// per second): the figures the constants of shared/physics/resource-estimate.ts stand for.
const plain = (tsPlain.cellUpdates * tsPlain.envelopeRatio) / tsPlain.seconds
console.log(`\nMeasured speed against the TypeScript plain path (${(plain / 1e6).toFixed(1)} M/s, same run; two channels per cell-update of one channel):`)
const factors = Object.fromEntries(rows.map((r) => [r.name as string, { kernel: r.kernel, perS: r.measuredPerS, factor: (r.measuredPerS as number) / plain }]))
for (const [name, f] of Object.entries(factors)) console.log(`  ${pad(name, 46)} ${pad(f.kernel as string, 16)} ${pad(((f.perS as number) / 1e6).toFixed(1), 7)} M/s  ×${f.factor.toFixed(2)}`)
console.log(`load average at end ${load()}`)
if (outFile) writeFileSync(outFile, JSON.stringify({ date: new Date().toISOString(), tsPlainPerS: plain, rows, factors }, null, 2) + '\n')
