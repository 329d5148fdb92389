// `node --import tsx benchmarks/workers-drain.ts [runs] [windowNs]`: how fast one and then two worker
// processes (one solver thread each) drain the same batch of runs, and the ratio. A throwaway database is
// created and dropped. Not a test: it prints figures (benchmarks/README.md records them).
import { availableParallelism, loadavg } from 'node:os'
import { benchConfig, benchSetup } from './workers-setup'

const RUNS = Number(process.argv[2] ?? 8)
const WINDOW_NS = Number(process.argv[3] ?? 30)
const config = benchConfig(WINDOW_NS)
const bench = await benchSetup()
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ')

async function drain(workerCount: number): Promise<number> {
  const procs = await Promise.all(Array.from({ length: workerCount }, () => bench.spawnWorker()))
  const t0 = performance.now()
  const ids: string[] = []
  for (let i = 0; i < RUNS; i++) ids.push(await bench.submit(`batch ${i}`, config))
  for (;;) {
    const { rows } = await bench.pool.query(
      `select count(*) filter (where status = 'succeeded')::int as done, count(*) filter (where status = 'failed')::int as failed from runs where id = any($1)`,
      [ids],
    )
    if (rows[0].failed > 0) throw new Error('a run failed')
    if (rows[0].done === RUNS) break
    await new Promise((r) => setTimeout(r, 100))
  }
  const seconds = (performance.now() - t0) / 1000
  await Promise.all(procs.map(bench.stopWorker))
  return seconds
}

try {
  console.log(`batch: ${RUNS} runs of ${WINDOW_NS} ns at 0.5 ps on the 5 cm chip; ${availableParallelism()} cores, load ${load()}`)
  const one = await drain(1)
  console.log(`1 worker : ${one.toFixed(1)} s`)
  const two = await drain(2)
  console.log(`2 workers: ${two.toFixed(1)} s`)
  console.log(`ratio (1 worker / 2 workers): ${(one / two).toFixed(2)}; load after ${load()}`)
} finally {
  await bench.close()
}
