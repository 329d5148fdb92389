// Helpers shared by start.mjs, test.mjs and dev.mjs. Plain Node: these run before `npm ci`.
import { spawn, spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { createServer } from 'node:net'
import { join } from 'node:path'
import { ROOT } from './db.mjs'

export { ROOT }

/** Ends the script with one line for the person at the terminal, no stack trace. */
export function fail(line, code = 1) {
  console.error(`${line}`)
  process.exit(code)
}

export function elapsed(t0) {
  return `${((performance.now() - t0) / 1000).toFixed(1)} s`
}

// npm writes node_modules/.package-lock.json after package-lock.json in the same run, so a lock
// much newer than it means the lock changed since (a pull, a branch switch) and node_modules is stale.
const LOCK_SLACK_MS = 5_000

export function dependenciesStale() {
  const hidden = join(ROOT, 'node_modules', '.package-lock.json')
  if (!existsSync(hidden)) return 'node_modules is missing'
  if (statSync(join(ROOT, 'package-lock.json')).mtimeMs > statSync(hidden).mtimeMs + LOCK_SLACK_MS) return 'package-lock.json changed'
  return null
}

export function ensureDependencies() {
  const why = dependenciesStale()
  if (!why) return
  console.log(`setup: ${why}; running npm ci…`)
  const t0 = performance.now()
  const r = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: ROOT, stdio: 'inherit' })
  if (r.status !== 0) fail('setup: npm ci failed (see above); fix the error and run the command again')
  console.log(`setup: dependencies installed in ${elapsed(t0)}`)
}

/** Runs a command with inherited output; returns its exit code. */
export function runStep(label, cmd, args, env = {}) {
  const t0 = performance.now()
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ...env } })
  const code = r.status ?? 1
  if (label) console.log(`${label} ${code === 0 ? 'done' : 'FAILED'} in ${elapsed(t0)}`)
  return code
}

/** Node with tsx, as one process (npx/tsx binaries add a wrapper that survives a kill). */
export const TSX = ['--import', 'tsx']

export function portFree(port, host) {
  return new Promise((resolve) => {
    const srv = createServer()
    srv.once('error', () => resolve(false))
    srv.listen(port, host, () => srv.close(() => resolve(true)))
  })
}

function newestMtime(path) {
  if (!existsSync(path)) return 0
  const st = statSync(path)
  if (!st.isDirectory()) return st.mtimeMs
  let newest = st.mtimeMs
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)))
  return newest
}

/** True when dist/ is older than anything the client build reads. */
export function clientBuildStale() {
  const built = join(ROOT, 'dist', 'index.html')
  if (!existsSync(built)) return true
  const inputs = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tsconfig.app.json', 'package-lock.json']
  const newestInput = Math.max(...inputs.map((p) => newestMtime(join(ROOT, p))))
  return newestInput > statSync(built).mtimeMs
}

/** Starts a child in its own process group so the whole tree can be stopped together. */
export function spawnGroup(cmd, args, env = {}) {
  return spawn(cmd, args, { cwd: ROOT, stdio: 'inherit', detached: true, env: { ...process.env, ...env } })
}

export function killGroup(child, signal = 'SIGTERM') {
  if (child.exitCode !== null || child.signalCode !== null) return
  try {
    process.kill(-child.pid, signal)
  } catch {
    /* already gone */
  }
}
