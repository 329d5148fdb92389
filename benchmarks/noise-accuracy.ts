// `node --import tsx benchmarks/noise-accuracy.ts [--quick]`: accuracy of the thermal-noise option.
//  1. Order table: the scheme's exact stationary spontaneous Stokes power (discrete Lyapunov equation of its
//     one-step map, tests/solver/scheme-covariance.ts) against the closed form ħω_s n_th ∫(e^{gL} − 1)dν
//     (Boyd, Rzążewski & Narum, Phys. Rev. A 42, 5514, 1990) as the grid is refined.
//  2. Seed average: the same power from random realisations on a 100-cell grid, with its standard error
//     from batch means, against the closed form and the exact covariance.
// Prints figures and never asserts; record them in benchmarks/README.md with the date and machine.
import os from 'node:os'
import { simulateSync } from '../solver/index'
import { chipConfig } from '../tests/solver/chip-fixtures'
import { schemeMaps, spontaneousStokesClosedFormW, stationaryNoise } from '../tests/solver/scheme-covariance'

const quick = process.argv.includes('--quick')
const VG = 299_792_458 / 2.44
const LENGTH_M = 0.05
const GAIN_PER_WM = 300

function config(cells: number, pumpW: number, linewidthMHz: number, windowNs: number, seed = 1) {
  return chipConfig({
    windowNs,
    waveguide: { linewidthMHz },
    channels: [{ pump: { backgroundPowerW: pumpW } }],
    grid: { timeStepPs: (LENGTH_M / (VG * cells)) * 1e12, mapRows: 16, mapCols: 16 },
    options: { noise: { enabled: true, temperatureK: 300, seed }, errorEstimate: false },
  })
}

function exactAndClosed(cells: number, pumpW: number, linewidthMHz: number) {
  const maps = schemeMaps(config(cells, pumpW, linewidthMHz, 1))
  const m = maps.run.model
  const closed = spontaneousStokesClosedFormW(m.stokesPhotonJ, m.noiseOccupation, m.rates.gammaBPerS, GAIN_PER_WM * pumpW * LENGTH_M)
  return { exact: stationaryNoise(maps).stokesOutW, closed, gammaDt: m.rates.gammaBPerS * m.dtS }
}

function orderTable(): void {
  console.log('\n## Exact stationary spontaneous Stokes power of the scheme vs the closed form (chip, 34 MHz, 0.2 W: G_B P L = 3)')
  console.log('| cells | Γ_B Δt | relative error | ratio to the next finer grid |')
  console.log('| ---: | ---: | ---: | ---: |')
  const cells = quick ? [12, 25, 50] : [12, 25, 50, 100, 200]
  const rows = cells.map((n) => {
    const r = exactAndClosed(n, 0.2, 34)
    return { n, gammaDt: r.gammaDt, err: r.exact / r.closed - 1 }
  })
  rows.forEach((r, i) => {
    const next = rows[i + 1]
    console.log(`| ${r.n} | ${r.gammaDt.toExponential(2)} | ${r.err.toExponential(3)} | ${next ? (r.err / next.err).toFixed(3) : ''} |`)
  })
}

function seedAverage(): void {
  // A broad line (3 GHz) makes the output's correlation time 2/Γ_B short (0.1 ns), so that a 0.1 % standard
  // error needs ~10⁶ correlation times of simulated light rather than ~10⁸ at 34 MHz.
  const cells = 100, pumpW = 0.2, linewidthMHz = 3000
  const windowNs = 2000, warmUpNs = 10, batchNs = 100
  const seeds = quick ? 4 : 200
  const { exact, closed } = exactAndClosed(cells, pumpW, linewidthMHz)
  const batches: number[] = []
  const t0 = performance.now()
  for (let seed = 1; seed <= seeds; seed++) {
    const r = simulateSync(config(cells, pumpW, linewidthMHz, windowNs, seed))
    if (r.status !== 'finished') throw new Error(r.message)
    const out = r.channels[0].stokesOut
    const dtNs = r.manifest.grid!.dtS * 1e9
    const perBatch = Math.round(batchNs / dtNs)
    for (let start = Math.ceil(warmUpNs / dtNs); start + perBatch <= out.length / 2; start += perBatch) {
      let s = 0
      for (let n = start; n < start + perBatch; n++) s += out[2 * n] ** 2 + out[2 * n + 1] ** 2
      batches.push(s / perBatch)
    }
    if (seed % 20 === 0) console.log(`  after ${seed} seeds: ${summary(batches, closed, exact)}`)
  }
  const seconds = (performance.now() - t0) / 1000
  console.log(`\n## Seed-averaged spontaneous Stokes power, ${cells} cells, Δν_B = ${linewidthMHz} MHz, G_B P L = ${GAIN_PER_WM * pumpW * LENGTH_M}`)
  console.log(`${seeds} seeds × ${windowNs} ns, ${batches.length} batches of ${batchNs} ns after ${warmUpNs} ns, ${seconds.toFixed(0)} s`)
  console.log(`closed form ${closed.toExponential(6)} W; exact covariance of the scheme ${exact.toExponential(6)} W (${((exact / closed - 1) * 100).toFixed(4)} %)`)
  console.log(summary(batches, closed, exact))
}

function summary(batches: number[], closed: number, exact: number): string {
  const mean = batches.reduce((a, b) => a + b, 0) / batches.length
  const sd = Math.sqrt(batches.reduce((a, b) => a + (b - mean) ** 2, 0) / (batches.length - 1))
  const se = sd / Math.sqrt(batches.length)
  return `seed average ${mean.toExponential(6)} W ± ${((se / mean) * 100).toFixed(3)} % (1σ): ${((mean / closed - 1) * 100).toFixed(3)} % from the closed form, ${((mean / exact - 1) * 100).toFixed(3)} % from the exact covariance`
}

console.log(`# noise accuracy, ${new Date().toISOString().slice(0, 10)}, ${os.cpus()[0]?.model ?? 'cpu'} × ${os.cpus().length}, Node ${process.version}${quick ? ' (quick)' : ''}`)
orderTable()
seedAverage()
