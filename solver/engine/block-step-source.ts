/*
 * The work of the threaded step (engine/threaded-engine.ts) as plain JavaScript source: the helper thread
 * evaluates it without a TypeScript loader (it starts in tens of milliseconds, not half a second), and the
 * run's own thread builds its stepper from the same text, so every thread runs the same code.
 *
 * The nodes 0..nz are cut into contiguous chunks of `size` nodes; chunk k is [a, b] = [k·size, min(nz, a+size−1)].
 *  step(k, w):      sveaBlock on the chunk's interior nodes with c/2 and on a facet node (0 or nz) with c/4 — the
 *                   driver's weights; then the chunk publishes its edge values for its neighbours' shift into
 *                   edge set w: u[b] (the next chunk's incoming pump) and v[a] (the previous chunk's incoming Stokes).
 *  transport(k, r): the engine's shift inside the chunk (u[a+1..b] ← u[a..b−1], v[a..b−1] ← v[a+1..b], times the
 *                   loss per cell), then the two cells that cross a chunk boundary, from edge set r:
 *                   u[a] ← u[a−1]·loss, v[b] ← v[b+1]·loss.
 *  inject(k):       the boundary inputs the run's thread left in `inputs` (u[0] and v[nz], as the driver's inject).
 * One phase may do transport(k), inject(k) and step(k) in turn (runChunk): one time step's transport and the
 * next one's interaction, since after its shift a chunk's interaction reads its own nodes only.
 * Edge sets alternate from step to step (w = 0, 1, 0, …), so a chunk that has already published this step's
 * edges cannot overwrite the previous step's before its neighbour has read them; a barrier ends each phase.
 *  sample(k, first): the maps' sample of the chunk's columns after its interaction step (observers/map-recorder.ts,
 *                   sample(), one channel, the same expressions in the same order); chunks then hold whole
 *                   columns (their size is a multiple of the column width), so each column's sum is formed by
 *                   one thread in node order, as with one thread.
 * edges holds 2 sets of 8 numbers per chunk, one 64-byte cache line (so that neighbouring chunks on different
 * threads do not write one line): uRe[b], uIm[b], vRe[a], vIm[a], then 4 unused.
 */
export const CHUNK_STEPPER_SOURCE = `function chunkStepper(fn, f64, d) {
  const [pu, pui, pv, pvi, pb, pbi] = d.at
  const ou = pu / 8, oui = pui / 8, ov = pv / 8, ovi = pvi / 8
  const nz = d.nz, size = d.size, e = d.edges, loss = d.loss, set = 8 * d.chunks, inputs = d.inputs
  const K = d.K, Er = d.Er, Ei = d.Ei, h = d.h, cInner = 0.5 * d.c, cFacet = 0.25 * d.c
  const mp = d.maps, acc = mp ? new Float64Array(mp.acc) : null, obv = pb / 8, obvi = pbi / 8
  const stepper = {
    chunks: d.chunks,
    step(k, w) {
      const a = k * size, b = Math.min(nz, a + size - 1)
      const j0 = Math.max(a, 1), j1 = Math.min(b, nz - 1)
      if (j0 <= j1) fn.sveaBlock(pu, pui, pv, pvi, pb, pbi, j0, j1, K, cInner, Er, Ei, h)
      if (a === 0) fn.sveaBlock(pu, pui, pv, pvi, pb, pbi, 0, 0, K, cFacet, Er, Ei, h)
      if (b === nz) fn.sveaBlock(pu, pui, pv, pvi, pb, pbi, nz, nz, K, cFacet, Er, Ei, h)
      const x = w * set + 8 * k
      e[x] = f64[ou + b]
      e[x + 1] = f64[oui + b]
      e[x + 2] = f64[ov + a]
      e[x + 3] = f64[ovi + a]
    },
    transport(k, r) {
      const a = k * size, b = Math.min(nz, a + size - 1)
      fn.transport(pu + 8 * a, pui + 8 * a, pv + 8 * a, pvi + 8 * a, b - a, loss)
      const x = r * set + 8 * k
      if (a > 0) {
        f64[ou + a] = loss !== 1 ? e[x - 8] * loss : e[x - 8]
        f64[oui + a] = loss !== 1 ? e[x - 7] * loss : e[x - 7]
      }
      if (b < nz) {
        f64[ov + b] = loss !== 1 ? e[x + 10] * loss : e[x + 10]
        f64[ovi + b] = loss !== 1 ? e[x + 11] * loss : e[x + 11]
      }
    },
    sample(k, first) {
      const a = k * size, b = Math.min(nz, a + size - 1)
      const cn = mp.colNodes, cols = mp.cols, kp = mp.kp, ks = mp.ks, kb = mp.kb, useMax = mp.useMax
      const c1 = Math.min(cols, Math.ceil((b + 1) / cn))
      for (let c = a / cn; c < c1; c++) {
        const j0 = c * cn, j1 = Math.min(nz + 1, j0 + cn)
        let sp = first ? 0 : acc[c], ss = first ? 0 : acc[cols + c], sb = first ? 0 : acc[2 * cols + c]
        for (let j = j0; j < j1; j++) {
          const ur = f64[ou + j], ui = f64[oui + j], vr = f64[ov + j], vi = f64[ovi + j], br = f64[obv + j], bi = f64[obvi + j]
          const p = 0 + kp * (ur * ur + ui * ui)
          const q = 0 + ks * (vr * vr + vi * vi)
          const s = 0 + kb * (br * br + bi * bi)
          if (useMax) {
            if (p > sp) sp = p
            if (q > ss) ss = q
            if (s > sb) sb = s
          } else {
            sp += p
            ss += q
            sb += s
          }
        }
        acc[c] = sp
        acc[cols + c] = ss
        acc[2 * cols + c] = sb
      }
    },
    inject(k) {
      const a = k * size, b = Math.min(nz, a + size - 1)
      if (a === 0) (f64[ou] = inputs[0]), (f64[oui] = inputs[1])
      if (b === nz) (f64[ov + nz] = inputs[2]), (f64[ovi + nz] = inputs[3])
    },
  }
  return stepper
}

/* One chunk of the operation in ctrl[8]: bits 1..0 the operation (0 step, 1 transport, 2 transport and step),
 * bit 2 the edge set read, bit 3 the edge set written, bit 4 set when the transport takes the boundary inputs,
 * bit 5 when the step is followed by the maps' sample, bit 6 when that sample is its row's first. */
function runChunk(stepper, op, k) {
  const r = (op >>> 2) & 1, w = (op >>> 3) & 1
  if ((op & 3) !== 0) {
    stepper.transport(k, r)
    if (op & 16) stepper.inject(k)
  }
  if ((op & 3) !== 1) {
    stepper.step(k, w)
    if (op & 32) stepper.sample(k, (op & 64) !== 0)
  }
}

/* Takes chunks of the present phase until none is left; returns how many it did. ctrl[0] is the phase word:
 * bits 31..16 the phase number, bits 15..8 the first chunk not yet taken, bits 7..0 one past the last; ctrl[8]
 * the operation (runChunk), written before the word. The run's thread takes chunks from the front, helpers from
 * the back, so each thread keeps about the same nodes (in its own core's cache) from phase to phase while the
 * split still follows who is faster. A compare-exchange claims one chunk, so a thread that wakes up late cannot
 * take a chunk of a phase gone by; the operation is read after the claim, when the phase cannot have moved on
 * (the next one is published only once this chunk is finished). */
function takeChunks(ctrl, stepper, word, fromBack) {
  const phase = word >>> 16
  let done = 0
  for (;;) {
    const w = Atomics.load(ctrl, 0)
    const front = (w >>> 8) & 0xff, back = w & 0xff
    if (w >>> 16 !== phase || front >= back) break
    const k = fromBack ? back - 1 : front
    if (Atomics.compareExchange(ctrl, 0, w, fromBack ? w - 1 : w + 0x100) !== w) continue
    runChunk(stepper, Atomics.load(ctrl, 8), k)
    done++
  }
  // ctrl[16] counts the chunks finished in this phase; the run's thread waits for all of them. Each thread adds
  // its own once, when nothing is left to take: one contended add per thread and phase, not one per chunk.
  if (done > 0 && Atomics.add(ctrl, 16, done) + done === stepper.chunks && Atomics.load(ctrl, 48) === 1) Atomics.notify(ctrl, 16)
  return done
}`

/*
 * A helper thread: takes chunks whenever a phase has some left; otherwise spins a bounded number of times,
 * then sleeps in Atomics.wait with its "asleep" count (ctrl[32]) raised, so the run's thread knows to notify it.
 * ctrl (Int32; each group on its own 64-byte line): [0] phase word and [8] its operation, [16] chunks finished, [32] helpers
 * asleep, [48] run's thread asleep, [64] exit, [72] helpers ready.
 */
export const HELPER_SOURCE = `${CHUNK_STEPPER_SOURCE}
const { workerData: d } = require('node:worker_threads')
const fn = new WebAssembly.Instance(d.module, { env: { memory: d.memory } }).exports
const ctrl = new Int32Array(d.ctrl)
const stepper = chunkStepper(fn, new Float64Array(d.memory.buffer), { ...d, edges: new Float64Array(d.edges), inputs: new Float64Array(d.inputs) })
Atomics.add(ctrl, 72, 1)
Atomics.notify(ctrl, 72)
let spins = 0
while (Atomics.load(ctrl, 64) === 0) {
  const w = Atomics.load(ctrl, 0)
  if (((w >>> 8) & 0xff) < (w & 0xff) && takeChunks(ctrl, stepper, w, true) > 0) {
    spins = 0
    continue
  }
  if (++spins < d.spins) continue
  Atomics.add(ctrl, 32, 1)
  Atomics.wait(ctrl, 0, w)
  Atomics.sub(ctrl, 32, 1)
  spins = 0
}
`
