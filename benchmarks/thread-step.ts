// `node --import tsx benchmarks/thread-step.ts`: the step engine alone (no driver, no port recording or maps),
// one thread (engine/wasm-engine.ts) against two (engine/threaded-engine.ts, its transport left for the next
// step's phase as the driver does: one barrier per step) on the fixed case's grid,
// interleaved, best of 3; and the share of the chunks the run's own thread took (½ when both threads are
// scheduled throughout, 1 when the helper never got a core). Prints figures, never asserts.
import os from 'node:os'
import { planGrid } from '../solver/driver'
import { buildModel } from '../solver/problem/coupled-modes'
import { ThreadedSveaEngine } from '../solver/engine/threaded-engine'
import { WasmSveaEngine } from '../solver/engine/wasm-engine'
import { gridCase } from './cases'

const STEPS = 5000
console.log(`# Step engine alone, one vs two threads ${new Date().toISOString()}; load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`)
console.log('   Nz  ns/node 1 thread  ns/node 2 threads   1/2  own share  load avg')
for (const nz of [1000, 2000, 4000, 8000, 16000]) {
  const config = gridCase(nz, 20000)
  const m = buildModel(config, planGrid(config))
  const one = new WasmSveaEngine(m)
  const two = new ThreadedSveaEngine(m, 2)
  const best = [Infinity, Infinity]
  for (let rep = 0; rep < 3; rep++) {
    for (const [i, e] of [[0, one], [1, two]] as const) {
      const t0 = performance.now()
      for (let s = 0; s < STEPS; s++) {
        e.step()
        if (e instanceof ThreadedSveaEngine) e.transportLater(0, 0, 0, 0)
        else e.transport()
      }
      if (e instanceof ThreadedSveaEngine) e.settle()
      best[i] = Math.min(best[i], performance.now() - t0)
    }
  }
  two.close()
  const perNode = (ms: number) => ((ms * 1e6) / STEPS / m.nodes).toFixed(2)
  console.log(`${String(nz).padStart(5)}  ${perNode(best[0]).padStart(15)}  ${perNode(best[1]).padStart(17)}  ${(best[0] / best[1]).toFixed(2).padStart(4)}  ${(two.ownChunks / two.allChunks).toFixed(2).padStart(9)}  ${os.loadavg()[0].toFixed(2).padStart(8)}`)
}
