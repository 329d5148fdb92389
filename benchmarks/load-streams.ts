// `node --import tsx benchmarks/load-streams.ts [--streams 200] [--requests 300]`: the API under load on the
// loopback address only. Starts the real server (no embedded worker, so no solver competes for the CPU) on a
// throwaway database with the demo accounts, signs in, queues a run, then measures GET /api/runs latency
// (a) alone and (b) while N live event streams of that run stay open. Bounded in count and time; prints
// figures and never asserts. Record them in benchmarks/README.md with the date and machine.
import { spawn, spawnSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { createServer } from 'node:net'
import os from 'node:os'
import { parseArgs } from 'node:util'
import { createDb as createDatabase, databaseUrl, dropDb, start, testDatabaseName } from '../scripts/db.mjs'
import { migrateDatabase } from '../server/db/migrate'
import { chipConfig, gaussian } from '../tests/solver/chip-fixtures'

const { values } = parseArgs({ options: { streams: { type: 'string', default: '200' }, requests: { type: 'string', default: '300' } } })
const STREAMS = Number(values.streams)
const REQUESTS = Number(values.requests)
const CONCURRENCY = 4
const DEADLINE_MS = 5 * 60_000

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = createServer()
    s.once('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
  })

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]
}

async function timeListRequests(base: string, headers: Record<string, string>, groupId: string): Promise<number[]> {
  const latencies: number[] = []
  let next = 0
  const worker = async () => {
    while (next < REQUESTS) {
      next++
      const t0 = performance.now()
      const res = await fetch(`${base}/api/runs?groupId=${groupId}&pageSize=25`, { headers })
      await res.arrayBuffer()
      if (!res.ok) throw new Error(`GET /api/runs answered ${res.status}`)
      latencies.push(performance.now() - t0)
    }
  }
  await Promise.all(Array.from({ length: CONCURRENCY }, worker))
  return latencies.sort((a, b) => a - b)
}

function summary(label: string, l: number[]): string {
  return `| ${label} | ${l.length} | ${percentile(l, 50).toFixed(1)} | ${percentile(l, 95).toFixed(1)} | ${l[l.length - 1].toFixed(1)} |`
}

async function main(): Promise<void> {
  const deadline = setTimeout(() => {
    console.error('load benchmark: over its time bound, stopping')
    process.exit(2)
  }, DEADLINE_MS)
  await start(undefined, { quiet: true, database: null })
  const name = testDatabaseName()
  createDatabase(name)
  const url = databaseUrl(name)
  const port = await freePort()
  const base = `http://127.0.0.1:${port}`
  let server: ReturnType<typeof spawn> | null = null
  const streams: AbortController[] = []
  try {
    await migrateDatabase(url)
    const seeded = spawnSync(process.execPath, ['--import', 'tsx', 'server/db/seed.ts'], { env: { ...process.env, DATABASE_URL: url }, stdio: 'ignore' })
    if (seeded.status !== 0) throw new Error('seed failed')
    server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      env: { ...process.env, DATABASE_URL: url, PORT: String(port), HOST: '127.0.0.1', EMBEDDED_WORKER: 'false', JWT_SECRET: randomBytes(32).toString('hex'), LOG_LEVEL: 'warn', NODE_ENV: 'test' },
      stdio: ['ignore', 'ignore', 'inherit'],
    })
    for (let i = 0; ; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break
      } catch {
        /* not listening yet */
      }
      if (i > 240) throw new Error('server did not start')
      await new Promise((r) => setTimeout(r, 250))
    }
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'tomas@halden-lab.example', password: 'demo-password-2' }) })
    if (!signIn.ok) throw new Error(`sign-in answered ${signIn.status}`)
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0]
    const headers = { cookie }
    const { groups } = (await (await fetch(`${base}/api/groups`, { headers })).json()) as { groups: Array<{ id: string }> }
    const groupId = groups[0].id
    const config = chipConfig({ windowNs: 10, channels: [{ pump: { pulses: [gaussian(1, 4, 0.3)] }, stokes: { backgroundPowerW: 0.001 } }] })
    const created = await fetch(`${base}/api/runs`, { method: 'POST', headers: { ...headers, 'content-type': 'application/json' }, body: JSON.stringify({ groupId, title: 'Load benchmark', config }) })
    if (!created.ok) throw new Error(`POST /api/runs answered ${created.status}: ${await created.text()}`)
    const runId = ((await created.json()) as { id: string }).id

    await timeListRequests(base, headers, groupId) // warm-up: JIT, pools, caches
    const alone = await timeListRequests(base, headers, groupId)

    let open = 0
    for (let i = 0; i < STREAMS; i++) {
      const ctl = new AbortController()
      streams.push(ctl)
      const res = await fetch(`${base}/api/runs/${runId}/events`, { headers, signal: ctl.signal })
      if (!res.ok || !res.body) throw new Error(`stream ${i} answered ${res.status}`)
      open++
      const reader = res.body.getReader()
      void (async () => {
        try {
          for (;;) if ((await reader.read()).done) break
        } catch {
          /* aborted at the end */
        }
      })()
    }
    const withStreams = await timeListRequests(base, headers, groupId)
    const health = await fetch(`${base}/api/health`)

    console.log(`# API under load, ${new Date().toISOString().slice(0, 10)}, ${os.cpus()[0]?.model ?? 'cpu'} × ${os.cpus().length}, load average ${os.loadavg()[0].toFixed(1)}, Node ${process.version}`)
    console.log(`GET /api/runs (25 rows) × ${REQUESTS}, ${CONCURRENCY} at a time, latency in ms; ${open} live event streams open in the second row; health after: ${health.status}`)
    console.log('| condition | requests | p50 | p95 | max |')
    console.log('| --- | ---: | ---: | ---: | ---: |')
    console.log(summary('no streams', alone))
    console.log(summary(`${open} live streams`, withStreams))
  } finally {
    for (const s of streams) s.abort()
    if (server && server.exitCode === null) {
      const exited = new Promise((r) => server!.once('exit', r))
      server.kill('SIGTERM')
      await Promise.race([exited, new Promise((r) => setTimeout(r, 8_000))])
      if (server.exitCode === null) server.kill('SIGKILL')
    }
    dropDb(name)
    clearTimeout(deadline)
  }
}

await main()
