// The browser tests' world: a migrated database with the demo accounts, a client
// build in dist/, and the real server with an embedded worker on a free port. `npm test` passes its
// throwaway database in TEST_DATABASE_URL; a direct `npx vitest run -c vitest.e2e.config.ts` makes one.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync, mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
import { createDb as createDatabase, databaseUrl, dropDb, start, testDatabaseName } from '../../scripts/db.mjs'
import { REPO_ROOT } from '../../server/env'
import { migrateDatabase } from '../../server/db/migrate'

declare module 'vitest' {
  export interface ProvidedContext {
    e2eBaseUrl: string
    /** The served database, for tests that set up rows no page can make (an invitation whose token only goes by mail). */
    e2eDatabaseUrl: string
  }
}

const HEALTH_TIMEOUT_MS = 60_000
const BUILD_TRIES = 6
const BUILD_RETRY_S = 10

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.once('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
  })
}

function newest(path: string): number {
  const st = statSync(path)
  if (!st.isDirectory()) return st.mtimeMs
  return readdirSync(path).reduce((m, e) => Math.max(m, newest(join(path, e))), st.mtimeMs)
}

/** Builds the client when dist/ is missing or older than its sources. */
function ensureClientBuild(): void {
  const built = join(REPO_ROOT, 'dist', 'index.html')
  const sources = ['src', 'shared', 'index.html', 'vite.config.ts'].map((p) => join(REPO_ROOT, p))
  if (existsSync(built) && statSync(built).mtimeMs >= Math.max(...sources.map(newest))) return
  // Vite refuses to build while another build of this checkout runs (someone else's `npm test`): wait, retry.
  for (let attempt = 1; ; attempt++) {
    const r = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'], { cwd: REPO_ROOT, stdio: ['ignore', 'inherit', 'pipe'], encoding: 'utf8' })
    if (r.status === 0) return
    const locked = /another Vite build process/i.test(r.stderr ?? '')
    if (!locked || attempt >= BUILD_TRIES) {
      process.stderr.write(r.stderr ?? '')
      throw new Error('e2e: vite build failed')
    }
    spawnSync('sleep', [String(BUILD_RETRY_S)])
  }
}

// Accounts only: the demo runs (seed-runs.ts) would queue ahead of the runs under test on a busy machine.
function seed(url: string): void {
  for (const script of ['server/db/seed.ts']) {
    const r = spawnSync(process.execPath, ['--import', 'tsx', script], { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, DATABASE_URL: url } })
    if (r.status !== 0) throw new Error(`e2e: ${script} failed`)
  }
}

async function waitForHealth(base: string, server: ChildProcess): Promise<void> {
  const t0 = Date.now()
  while (Date.now() - t0 < HEALTH_TIMEOUT_MS) {
    if (server.exitCode !== null) throw new Error(`e2e: the server exited with code ${server.exitCode}`)
    try {
      const res = await fetch(`${base}/api/health`)
      if (res.ok) return
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 250))
  }
  throw new Error(`e2e: the server did not answer ${base}/api/health within ${HEALTH_TIMEOUT_MS / 1000} s`)
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  let url = process.env.TEST_DATABASE_URL
  let ownDb: string | null = null
  if (!url) {
    await start(undefined, { quiet: true, database: null })
    ownDb = testDatabaseName()
    createDatabase(ownDb)
    url = databaseUrl(ownDb)
  }
  try {
    await migrateDatabase(url)
    seed(url)
    ensureClientBuild()
  } catch (err) {
    if (ownDb) dropDb(ownDb) // nothing ran against it yet
    throw err
  }

  const port = await freePort()
  const dataDir = mkdtempSync(join(tmpdir(), 'sonoweave-e2e-'))
  // One process (not npx), so killing it stops the server and its worker threads.
  const server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: REPO_ROOT,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: {
      ...process.env,
      DATABASE_URL: url,
      PORT: String(port),
      HOST: '127.0.0.1',
      EMBEDDED_WORKER: 'true',
      WORKER_COUNT: '1',
      JWT_SECRET: randomBytes(32).toString('hex'),
      DATA_DIR: dataDir,
      LOG_LEVEL: 'warn',
      NODE_ENV: 'test',
    },
  })
  const base = `http://127.0.0.1:${port}`
  try {
    await waitForHealth(base, server)
  } catch (err) {
    server.kill('SIGKILL')
    rmSync(dataDir, { recursive: true, force: true })
    if (ownDb) dropDb(ownDb)
    throw err
  }
  project.provide('e2eBaseUrl', base)
  project.provide('e2eDatabaseUrl', url)

  return async () => {
    if (server.exitCode === null) {
      const exited = new Promise((r) => server.once('exit', r))
      server.kill('SIGTERM')
      await Promise.race([exited, new Promise((r) => setTimeout(r, 8_000))])
      if (server.exitCode === null) server.kill('SIGKILL')
    }
    rmSync(dataDir, { recursive: true, force: true })
    if (ownDb) {
      if (project.vitest.state.getCountOfFailedTests() > 0) console.log(`e2e: kept database ${ownDb} (drop it with: node scripts/db.mjs drop-db ${ownDb})`)
      else dropDb(ownDb)
    }
  }
}
