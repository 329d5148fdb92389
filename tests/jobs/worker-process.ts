// Real worker processes for the job tests: `node --import tsx server/jobs/worker-main.ts` on the test
// database and the test file's own pg-boss schema, with a short watchdog so a kill is noticed quickly.
import { spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { testDatabaseUrl } from '../api/helpers'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))

/** Heartbeats come every 3 s (run-executor HEARTBEAT_MS); two missed ones count as lost in these tests. */
export const TEST_STALE_AFTER_S = 7
export const TEST_WATCHDOG_INTERVAL_S = 1

export interface WorkerProcess {
  child: ChildProcess
  output: () => string
  stop: () => Promise<void>
}

export async function spawnWorker(schema: string, threads = 1): Promise<WorkerProcess> {
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', 'server/jobs/worker-main.ts', '--threads', String(threads), '--queue-schema', schema,
      '--stale-after-s', String(TEST_STALE_AFTER_S), '--watchdog-interval-s', String(TEST_WATCHDOG_INTERVAL_S)],
    { cwd: ROOT, env: { ...process.env, DATABASE_URL: testDatabaseUrl(), LOG_LEVEL: 'warn', NODE_ENV: 'test' }, stdio: ['ignore', 'pipe', 'pipe'] },
  )
  let out = ''
  child.stdout!.on('data', (d) => (out += d))
  child.stderr!.on('data', (d) => (out += d))
  // Ready once it says it is taking runs.
  await new Promise<void>((resolve, reject) => {
    const t = setTimeout(() => reject(new Error(`worker did not start:\n${out}`)), 60_000)
    child.stdout!.on('data', () => out.includes('taking runs') && (clearTimeout(t), resolve()))
    child.on('exit', (code) => (clearTimeout(t), reject(new Error(`worker exited with ${code}:\n${out}`))))
  })
  return {
    child,
    output: () => out,
    stop: async () => {
      if (child.exitCode !== null || child.signalCode !== null) return
      const exited = new Promise((r) => child.once('exit', r))
      child.kill('SIGTERM')
      await exited
    },
  }
}

export async function waitFor<T>(what: string, probe: () => Promise<T | null | undefined | false>, timeoutMs = 60_000, everyMs = 100): Promise<T> {
  const t0 = Date.now()
  for (;;) {
    const v = await probe()
    if (v) return v
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`)
    await new Promise((r) => setTimeout(r, everyMs))
  }
}
