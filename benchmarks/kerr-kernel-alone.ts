// `node --import tsx benchmarks/kerr-kernel-alone.ts`: the TypeScript interaction kernels alone, no driver: the plain
// step and the Kerr step over 8000 nodes, 3000 repetitions each, four rounds, in ns per node. The fields are arbitrary
// (smooth, of order 1e-3); what is timed is the arithmetic of one node, the same for any values without subnormals.
// Figures in benchmarks/README.md (Kerr and thermal noise against the plain path); never asserts.
import type { Model } from '../solver/problem/coupled-modes'
import type { FieldState } from '../solver/steppers/interaction-kernel'
import { interactSvea } from '../solver/steppers/interaction-kernel'
import { interactSveaKerr } from '../solver/steppers/svea-kerr-kernel'

const NODES = 8000
const REPEATS = 3000
const field = () => Float64Array.from({ length: NODES }, (_, i) => 1e-3 * Math.sin(i * 0.37) + 1e-3)
const s: FieldState = { uRe: field(), uIm: field(), vRe: field(), vIm: field(), bRe: field(), bIm: field(), wRe: new Float64Array(0), wIm: new Float64Array(0), scratch: new Float64Array(0) }
// Only the fields the two kernels read.
const m = { driveK: 1e3, dtS: 1e-12, svea: { eRe: 0.99, eIm: 0.01 }, exchangePerB: 1e-4, kappaP: 1, rates: { kappa: 1 }, kerrHalfPump: 1e-6, kerrHalfStokes: 1e-6 } as unknown as Model

function nsPerNode(kerr: boolean): number {
  const t0 = performance.now()
  for (let r = 0; r < REPEATS; r++) {
    if (kerr) interactSveaKerr(m, s, 0, NODES - 1, 1)
    else interactSvea(s.uRe, s.uIm, s.vRe, s.vIm, s.bRe, s.bIm, 0, NODES - 1, m.driveK, 0.5 * m.exchangePerB, m.svea.eRe, m.svea.eIm, m.dtS)
  }
  return ((performance.now() - t0) / REPEATS / NODES) * 1e6
}

for (let round = 0; round < 4; round++) {
  const plain = nsPerNode(false)
  const kerr = nsPerNode(true)
  console.log(`plain ${plain.toFixed(2)} ns/node  Kerr ${kerr.toFixed(2)} ns/node  Kerr/plain rate ${(plain / kerr).toFixed(3)}`)
}
