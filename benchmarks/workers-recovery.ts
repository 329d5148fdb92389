// `node --import tsx benchmarks/workers-recovery.ts`: with the production watchdog settings (stale after
// 30 s, sweep every 10 s), how long after a SIGKILL of the worker holding a run another worker takes it.
import { benchConfig, benchSetup } from './workers-setup'

const bench = await benchSetup()
try {
  const a = await bench.spawnWorker()
  const b = await bench.spawnWorker()
  const runId = await bench.submit('survives a kill', benchConfig(60))
  const row = async () => (await bench.pool.query(`select status, attempt, worker_id, progress from runs where id = $1`, [runId])).rows[0]
  let taken
  while (!((taken = await row()).progress > 0.05)) await new Promise((r) => setTimeout(r, 100))
  const victim = [a, b].find((p) => taken.worker_id.includes(`:${p.pid}:`))!
  const t0 = performance.now()
  victim.kill('SIGKILL')
  let r
  while (!((r = await row()).attempt === 2 && r.status === 'running')) await new Promise((res) => setTimeout(res, 100))
  const retakenS = (performance.now() - t0) / 1000
  while ((r = await row()).status === 'running') await new Promise((res) => setTimeout(res, 100))
  console.log(`kill -9 → taken by the other worker after ${retakenS.toFixed(1)} s; finished ${((performance.now() - t0) / 1000).toFixed(1)} s after the kill, status ${r.status}`)
  await Promise.all([a, b].map(bench.stopWorker))
} finally {
  await bench.close()
}
