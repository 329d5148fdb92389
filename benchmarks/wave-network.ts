// Throughput of the multi-wave solver (solver/network/) against the plain TypeScript SVEA path on the same grid:
// `node --import tsx benchmarks/wave-network.ts [nz nt]`. Prints M cell-updates/s per case and the cost per
// cell-update relative to the plain path, per envelope (waves + fields). Figures only, no assertions.
import { SimulationConfig } from '@shared/physics/simulation-config'
import { planGrid, SimulationRun } from '../solver/driver'
import { NetworkRun } from '../solver/network/network-run'
import { gridCase } from './cases'

const nz = Number(process.argv[2] ?? 1000)
const nt = Number(process.argv[3] ?? 10000)
const base = gridCase(nz, nt)
const pulse = { pulses: [{ shape: 'gaussian' as const, peakPowerW: 0.01, centreNs: 3, fwhmNs: 1 }], backgroundPowerW: 1e-4 }

function variant(name: string, wg: object, ch: object, options: object = {}) {
  const c = SimulationConfig.parse({ ...base, waveguide: { ...base.waveguide, ...wg }, channels: [{ ...base.channels[0], ...ch }], options: { ...base.options, ...options } })
  return { name, config: c }
}

const cases = [
  variant('plain pair through the network solver', {}, {}),
  variant('+ co-propagating probe', {}, { coProbe: pulse }),
  variant('+ second backward resonance', { additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 50, gainCoefficientMPerW: 2e-10 }] }, {}),
  variant('+ forward resonance, Stokes and anti-Stokes', { forwardResonances: [{ frequencyMHz: 2000, linewidthMHz: 80, gainCoefficientMPerW: 3e-10 }] }, { forwardInputs: [{ stokes: pulse, antiStokes: pulse }] }),
  variant('3 Stokes orders', {}, {}, { cascade: { stokesOrders: 3, seedPowerW: 1e-6 } }),
]

function time(run: { advance(n: number): number }, steps: number): number {
  const t0 = performance.now()
  run.advance(steps)
  return (performance.now() - t0) / 1000
}

// Warm-up on a small grid, so the JIT has compiled both paths before anything is timed.
{
  const small = gridCase(100, 10000)
  const g = planGrid(small)
  time(new SimulationRun(small, g, { engine: 'ts' }), g.nt + 1)
  for (const { config } of cases) time(new NetworkRun({ ...config, waveguide: { ...config.waveguide, lengthM: small.waveguide.lengthM }, windowNs: small.windowNs }, g), g.nt + 1)
}

const grid = planGrid(base)
const cells = (grid.nz + 1) * (grid.nt + 1)
const plainS = time(new SimulationRun(base, grid, { engine: 'ts' }), grid.nt + 1)
const plainRate = cells / plainS
console.log(`grid ${grid.nz + 1} × ${grid.nt + 1} = ${cells.toExponential(2)} cell-updates`)
console.log(`plain SVEA (TypeScript): ${(plainRate / 1e6).toFixed(1)} M cell-updates/s`)
for (const { name, config } of cases) {
  const run = new NetworkRun(config, grid)
  const envelopes = run.net.waves.length + run.net.fields.length
  const s = time(run, grid.nt + 1)
  const rate = cells / s
  console.log(
    `${name}: ${run.net.waves.length} waves + ${run.net.fields.length} fields, ${(rate / 1e6).toFixed(1)} M cell-updates/s, ` +
      `${(plainRate / rate).toFixed(2)}× the plain cost, relative speed per envelope ${((rate * envelopes) / (3 * plainRate)).toFixed(2)}`,
  )
}
