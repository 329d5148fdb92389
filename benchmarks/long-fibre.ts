// Cost of one point of a time-of-flight sensing scan on long fibres: `node --import tsx benchmarks/long-fibre.ts
// [--skip-1km]`. Standard single-mode fibre (n_g = 1.468, A_eff = 80 µm², g_B = 5e-11 m/W, ν_B = 10.8 GHz,
// Δν_B = 30 MHz, 0.2 dB/km), a 10 ns Gaussian pump pulse (resolution v_g·τ/2 ≈ 1 m) of 0.5 W and a 1 mW CW
// probe, a 2 m section 35 K warmer at 800 m (and at 8 km on 10 km). Prints cells, steps, cell-updates, wall time,
// M cell-updates/s and the resource estimate's prediction; the 1 km run is timed with and without the profile
// (the profile kernel against the plain TypeScript fast path and the default engine). Figures only, no assertions.
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { estimateResources } from '@shared/physics/resource-estimate'
import { planGrid, SimulationRun } from '../solver/driver'
import { fibre } from './sensing-fibre'

function describe(name: string, config: SimulationConfig) {
  const grid = planGrid(config)
  const e = estimateResources(config, grid)
  const traceMiB = (4 * 16 * (grid.nt + 1)) / 2 ** 20
  console.log(`${name}: Δt ${(grid.dtS * 1e12).toFixed(0)} ps, Δz ${grid.dzM.toFixed(4)} m, ${grid.nz} cells × ${grid.nt} steps = ${e.cellUpdates.toExponential(2)} cell-updates; estimate ${e.expectedSeconds.toFixed(1)} s at ${(e.cellUpdatesPerS / 1e6).toFixed(0)} M/s; traces ${traceMiB.toFixed(1)} MiB, largest array ${(traceMiB / 4).toFixed(1)} MiB`)
  return { grid, e }
}

function timed(name: string, config: SimulationConfig, steps?: number, engine: 'ts' | 'auto' = 'auto') {
  const { grid, e } = describe(name, config)
  const run = new SimulationRun(config, grid, { engine })
  const n = steps ?? grid.nt + 1
  const t0 = performance.now()
  run.advance(n)
  const s = (performance.now() - t0) / 1000
  const cells = n * grid.nz
  const predicted = (cells / e.cellUpdates) * e.expectedSeconds
  console.log(`  measured ${s.toFixed(2)} s for ${cells.toExponential(2)} cell-updates (${(cells / s / 1e6).toFixed(1)} M/s, ${run.profile ? 'profile kernel' : `engine ${run.engine}`}); estimate/measured = ${(predicted / s).toFixed(2)}`)
  return cells / s
}

// Warm-up so the JIT has compiled every path before anything is timed.
timed('warm-up (100 m)', fibre(100, 80), 2000)
timed('warm-up (100 m, no profile)', fibre(100, 80, { profile: false }), 2000)

if (!process.argv.includes('--skip-1km')) {
  timed('1 km, profile', fibre(1000, 800))
  timed('1 km, no profile, TypeScript fast path', fibre(1000, 800, { profile: false }), undefined, 'ts')
  timed('1 km, no profile, default engine', fibre(1000, 800, { profile: false }))
}
// 10 km: the estimate, and a measured slice of 3000 steps to check the rate at 10⁵ cells.
const auto = describe('10 km, automatic step', fibre(10_000, 8000))
const coarse = fibre(10_000, 8000, { timeStepPs: 1000 })
const rate = timed('10 km, Δt = 1 ns (slice of 3000 steps)', coarse, 3000)
const g = planGrid(coarse)
const cells = (g.nt + 1) * g.nz
console.log(`  10 km full point at the measured rate: ${(cells / rate / 60).toFixed(1)} min; 41-point scan ${((41 * cells) / rate / 3600).toFixed(1)} h (automatic step: ${(auto.e.cellUpdates / rate / 60).toFixed(0)} min per point)`)
