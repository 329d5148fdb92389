// What the port spectra add to a run: the time to compute them for the four ports of the fixed benchmark
// case next to the time of the run itself (whose result now includes them), the cost per sample and port on
// longer traces, and the longest single step of the sliced computation the run page uses. Prints figures;
// never asserts.
//   node --import tsx benchmarks/port-spectra.ts
import { SEGMENTS_PER_CALL, SpectrumAccumulator } from '@shared/analysis/power-spectrum'
import { simulateSync } from '../solver/index'
import { portSpectra, portTracesOf } from '../solver/observers/port-spectra'
import { gridCase } from './cases'

const ms = (t0: number) => performance.now() - t0

function runCase(nz: number, nt: number): void {
  const t0 = performance.now()
  const r = simulateSync(gridCase(nz, nt))
  const runMs = ms(t0)
  const traces = portTracesOf(r.manifest.arrays, r.arrays, r.timeNs.length)
  const t1 = performance.now()
  portSpectra(traces, r.manifest.grid!.dtS)
  const spectraMs = ms(t1)
  console.log(`case ${nz} × ${nt}: run with spectra ${runMs.toFixed(0)} ms, of which spectra of ${traces.length} ports ≈ ${spectraMs.toFixed(0)} ms (${((100 * spectraMs) / runMs).toFixed(1)} %)`)
}

function perSample(n: number): void {
  const traces = [1, 2, 3, 4].map((i) => {
    const data = new Float64Array(2 * n)
    for (let k = 0; k < n; k++) ((data[2 * k] = Math.cos(0.01 * i * k)), (data[2 * k + 1] = Math.sin(0.01 * i * k)))
    return { name: `p${i}`, label: `port ${i}`, data }
  })
  const t0 = performance.now()
  portSpectra(traces, 1e-12)
  const t = ms(t0)
  console.log(`4 ports × ${n} samples: ${t.toFixed(0)} ms, ${((t * 1e6) / (4 * n)).toFixed(0)} ns per sample and port`)
}

function longestStep(n: number): void {
  const data = new Float64Array(2 * n).fill(1)
  const acc = new SpectrumAccumulator(data, 1e-12)
  const calls: number[] = []
  while (!acc.done) {
    const t0 = performance.now()
    acc.advance(SEGMENTS_PER_CALL)
    calls.push(ms(t0))
  }
  calls.sort((x, y) => x - y)
  const q = (f: number) => calls[Math.min(calls.length - 1, Math.floor(f * calls.length))].toFixed(2)
  console.log(`page: ${n} samples, ${acc.segments} segments of ${acc.segmentSamples}; one call of ${SEGMENTS_PER_CALL} segment(s): median ${q(0.5)} ms, 99th percentile ${q(0.99)} ms, longest ${q(1)} ms`)
}

runCase(2000, 20000)
for (const n of [1 << 16, 1 << 20, 1 << 22]) perSample(n)
longestStep(1 << 22)
