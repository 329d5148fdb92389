// `node --import tsx benchmarks/kerr-accuracy.ts [ts|wasm]`: the Kerr step's discretisation error on the convergence
// case of tests/solver/convergence.test.ts (5 cm chip, 1 W and 50 mW Gaussian pulses, Kerr on), at 40, 80 and 160
// cells against a 1280-cell run, for n₂ = 1e-17 and 1e-16 m²/W (about 0.05 and 0.5 rad of self-phase per step at
// 40 cells). Prints the largest |difference| of each output trace relative to the trace's peak; never asserts.
// Figures in docs/numerics.md (method of characteristics, Kerr).
import { simulateSync } from '../solver/index'
import { chipConfig, gaussian } from '../tests/solver/chip-fixtures'

const VG = 299_792_458 / 2.44
const engine = (process.argv[2] ?? 'wasm') as 'ts' | 'wasm'

function outputs(nz: number, n2: number) {
  const config = chipConfig({
    windowNs: 3.5,
    grid: { timeStepPs: (0.05 / (VG * nz)) * 1e12, mapRows: 16, mapCols: 16 },
    options: { kerr: true, errorEstimate: false },
    waveguide: { kerrN2M2PerW: n2 },
    channels: [{ pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }],
  })
  return simulateSync(config, { engine }).channels[0]
}

/** Largest |a − reference| on a's samples (the reference has `f` times as many), over the reference's peak. */
function relativeError(a: Float64Array, ref: Float64Array, f: number): number {
  let e = 0
  let peak = 0
  for (let n = 0; n < Math.min(a.length / 2, ref.length / (2 * f)); n++) {
    e = Math.max(e, Math.hypot(a[2 * n] - ref[2 * f * n], a[2 * n + 1] - ref[2 * f * n + 1]))
    peak = Math.max(peak, Math.hypot(ref[2 * f * n], ref[2 * f * n + 1]))
  }
  return e / peak
}

console.log(`# Kerr step error, ${engine} engine, ${new Date().toISOString()}`)
for (const n2 of [1e-17, 1e-16]) {
  const ref = outputs(1280, n2)
  const cells = [40, 80, 160].map((nz) => {
    const o = outputs(nz, n2)
    return `${nz} cells: Stokes ${relativeError(o.stokesOut, ref.stokesOut, 1280 / nz).toExponential(3)}, pump ${relativeError(o.pumpOut, ref.pumpOut, 1280 / nz).toExponential(3)}`
  })
  console.log(`n₂ = ${n2} m²/W: ${cells.join(' | ')}`)
}
