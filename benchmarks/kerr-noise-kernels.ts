// `node --import tsx benchmarks/kerr-noise-kernels.ts [rounds]`: the cost of Kerr phases and of thermal noise
// against the plain SVEA path of the same engine, measured side by side in one process. On the fixed case
// (benchmarks/cases.ts, one channel, Δt = 1 ps) at 2000 × 20000 and 8000 × 10000: plain and Kerr (n₂ = 1e-17 m²/W)
// on the TypeScript and the WebAssembly engine, thermal noise (295 K, seed 7) on the TypeScript engine (noise has
// no WebAssembly kernel), and Kerr with noise on the TypeScript engine, through its flat kernel and through the
// general kernel (forced) that ran it before, one thread. Each round runs every case once, in turn, so a change of machine load hits
// every column alike; a round's ratios use that round's own plain rate. Prints every round's M cell-updates/s
// and ratios, then the range of each ratio over the rounds, with the load average; never asserts. Record the
// figures in benchmarks/README.md with the date and load.
import os from 'node:os'
import { simulateSync } from '../solver/index'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { gridCase } from './cases'

const SIZES: [number, number][] = [[2000, 20000], [8000, 10000]]
const rounds = Number(process.argv[2] ?? 5)

/** M cell-updates per second of one run, without the error estimate's companion run. */
function rate(config: SimulationConfig, engine: 'ts' | 'wasm', forceGeneralKernel = false): number {
  const t0 = performance.now()
  const r = simulateSync({ ...config, options: { ...config.options, errorEstimate: false } }, { engine, threads: 1, forceGeneralKernel })
  const seconds = (performance.now() - t0) / 1000
  if (r.status !== 'finished') throw new Error(`benchmark run ${r.status}: ${r.message}`)
  return r.manifest.counters.cellUpdates / seconds / 1e6
}

const fmt = (x: number) => x.toPrecision(3).padStart(6)
console.log(`# Kerr and noise against plain ${new Date().toISOString()}; node ${process.version}, ${os.cpus()[0]?.model ?? 'unknown CPU'} × ${os.cpus().length}`)
for (const [nz, nt] of SIZES) {
  const plain = gridCase(nz, nt)
  const kerr = { ...plain, waveguide: { ...plain.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...plain.options, kerr: true } }
  const noise = gridCase(nz, nt, { noise: true })
  const kerrNoise = { ...noise, waveguide: { ...noise.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...noise.options, kerr: true } }
  rate(plain, 'ts')
  rate(plain, 'wasm')
  const ratios: Record<string, number[]> = { 'kerr ts': [], 'kerr wasm': [], 'noise ts': [], 'kerr+noise ts': [], 'kerr+noise general': [] }
  console.log(`\nNz × Nt = ${nz} × ${nt}; M cell-updates/s`)
  console.log('round plain ts  kerr ts  noise ts  plain wasm  kerr wasm  kerr+noise ts  kerr+noise general | kerr/plain ts  kerr/plain wasm  noise/plain ts  kerr+noise/plain ts (general)  load')
  for (let r = 0; r < rounds; r++) {
    const pt = rate(plain, 'ts')
    const kt = rate(kerr, 'ts')
    const nts = rate(noise, 'ts')
    const pw = rate(plain, 'wasm')
    const kw = rate(kerr, 'wasm')
    const knt = rate(kerrNoise, 'ts')
    const kng = rate(kerrNoise, 'ts', true)
    ratios['kerr ts'].push(kt / pt)
    ratios['kerr+noise ts'].push(knt / pt)
    ratios['kerr+noise general'].push(kng / pt)
    ratios['kerr wasm'].push(kw / pw)
    ratios['noise ts'].push(nts / pt)
    console.log(
      `${String(r + 1).padStart(5)}   ${fmt(pt)}   ${fmt(kt)}    ${fmt(nts)}      ${fmt(pw)}     ${fmt(kw)}         ${fmt(knt)}              ${fmt(kng)} |          ${(kt / pt).toFixed(2)}             ${(kw / pw).toFixed(2)}            ${(nts / pt).toFixed(2)}                    ${(knt / pt).toFixed(2)} (${(kng / pt).toFixed(2)})  ${os.loadavg()[0].toFixed(2)}`,
    )
  }
  for (const [k, v] of Object.entries(ratios)) {
    const sorted = [...v].sort((a, b) => a - b)
    console.log(`${k}/plain: ${sorted[0].toFixed(2)}–${sorted[sorted.length - 1].toFixed(2)} (median ${sorted[Math.floor(sorted.length / 2)].toFixed(2)})`)
  }
}
