// `node --import tsx benchmarks/option-kernels.ts` (also part of `npm run bench -- --engines`): options on the
// TypeScript fast path, side by side. The
// plain SVEA case (Nz × Nt of the engines table), then thermal noise, the higher-order acoustic term and two
// channels (1 GHz apart) each through the general kernel (forced) and through its flat kernel (solver/steppers/
// svea-noise-kernel.ts, higher-order-kernel.ts, svea-channels-kernel.ts), and four channels through the flat
// kernel's form for any count, and two channels with Kerr (n₂ = 1e-17 m²/W) through the general kernel (forced) and
// the flat several-channel kernel, all on the TypeScript engine.
// Interleaved case by case, best of 3, so a change of machine load hits every column. Prints M cell-updates/s
// (a cell-update is one node of one channel in one step) and each flat kernel's ratio to the plain path; never
// asserts. Record the figures in benchmarks/README.md with the date and load.
import os from 'node:os'
import { fileURLToPath } from 'node:url'
import { simulateSync } from '../solver/index'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { gridCase } from './cases'

const pad = (s: string | number, n: number) => String(s).padStart(n)
const fmt = (x: number, p = 3) => x.toPrecision(p)
/** The smaller grid twice as long: the general kernel with noise is slow. */
const SIZES: [number, number][] = [[2000, 20000], [8000, 10000]]

/** Cell-updates per second of one run on the TypeScript engine, without the error estimate's companion run. */
function rate(config: SimulationConfig, forceGeneralKernel: boolean): number {
  const t0 = performance.now()
  const r = simulateSync({ ...config, options: { ...config.options, errorEstimate: false } }, { engine: 'ts', forceGeneralKernel })
  const seconds = (performance.now() - t0) / 1000
  if (r.status !== 'finished') throw new Error(`benchmark run ${r.status}: ${r.message}`)
  return r.manifest.counters.cellUpdates / seconds / 1e6
}

const withKerr = (c: SimulationConfig): SimulationConfig => ({ ...c, waveguide: { ...c.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...c.options, kerr: true } })

export function optionKernelTable(): void {
  console.log('\n## Options on the fast path (TypeScript engine; best of 3, interleaved; Mcell/s)')
  console.log(
    `${pad('Nz', 6)} ${pad('Nt', 7)} ${pad('plain', 7)} ${pad('noise gen', 10)} ${pad('noise flat', 11)} ${pad('flat/plain', 11)} ${pad('h-o gen', 8)} ${pad('h-o flat', 9)} ${pad('flat/plain', 11)} ` +
      `${pad('2 ch gen', 9)} ${pad('2 ch flat', 10)} ${pad('flat/plain', 11)} ${pad('4 ch flat', 10)} ${pad('flat/plain', 11)} ` +
      `${pad('2 ch Kerr gen', 14)} ${pad('2 ch Kerr flat', 15)} ${pad('flat/plain', 11)} ${pad('load avg', 9)}`,
  )
  for (const [nz, nt] of SIZES) {
    const runs: [string, SimulationConfig, boolean][] = [
      ['plain', gridCase(nz, nt), false],
      ['noiseGeneral', gridCase(nz, nt, { noise: true }), true],
      ['noiseFlat', gridCase(nz, nt, { noise: true }), false],
      ['higherGeneral', gridCase(nz, nt, { higherOrderAcoustic: true }), true],
      ['higherFlat', gridCase(nz, nt, { higherOrderAcoustic: true }), false],
      ['channelsGeneral', gridCase(nz, nt, { channels: 2 }), true],
      ['channelsFlat', gridCase(nz, nt, { channels: 2 }), false],
      ['fourChannelsFlat', gridCase(nz, nt, { channels: 4 }), false],
      ['channelsKerrGeneral', withKerr(gridCase(nz, nt, { channels: 2 })), true],
      ['channelsKerrFlat', withKerr(gridCase(nz, nt, { channels: 2 })), false],
    ]
    const best: Record<string, number> = {}
    for (let rep = 0; rep < 3; rep++) for (const [key, config, general] of runs) best[key] = Math.max(best[key] ?? 0, rate(config, general))
    console.log(
      `${pad(nz, 6)} ${pad(nt, 7)} ${pad(fmt(best.plain), 7)} ${pad(fmt(best.noiseGeneral), 10)} ${pad(fmt(best.noiseFlat), 11)} ${pad((best.noiseFlat / best.plain).toFixed(2), 11)} ` +
        `${pad(fmt(best.higherGeneral), 8)} ${pad(fmt(best.higherFlat), 9)} ${pad((best.higherFlat / best.plain).toFixed(2), 11)} ` +
        `${pad(fmt(best.channelsGeneral), 9)} ${pad(fmt(best.channelsFlat), 10)} ${pad((best.channelsFlat / best.plain).toFixed(2), 11)} ` +
        `${pad(fmt(best.fourChannelsFlat), 10)} ${pad((best.fourChannelsFlat / best.plain).toFixed(2), 11)} ` +
        `${pad(fmt(best.channelsKerrGeneral), 14)} ${pad(fmt(best.channelsKerrFlat), 15)} ${pad((best.channelsKerrFlat / best.plain).toFixed(2), 11)} ${pad(os.loadavg()[0].toFixed(2), 9)}`,
    )
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  console.log(`# Options on the fast path ${new Date().toISOString()}; node ${process.version}, ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}`)
  optionKernelTable()
}
