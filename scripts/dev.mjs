#!/usr/bin/env node
// `npm run dev`: PostgreSQL + migrations + demo seed, then the Vite dev server (client, hot reload)
// and the API under `tsx watch` (restarts on server changes). Ctrl-C stops both.
import { DbScriptError, start as startDb } from './db.mjs'
import { ensureDependencies, fail, killGroup, portFree, runStep, spawnGroup, TSX } from './lib.mjs'

ensureDependencies()
if (runStep(null, process.execPath, [...TSX, 'server/env.ts']) !== 0) process.exit(1)
const apiPort = Number(process.env.PORT || 3001)
if (!(await portFree(apiPort, process.env.HOST || '127.0.0.1'))) {
  fail(`dev: port ${apiPort} is already in use (another Sonoweave?); stop it or run with PORT=${apiPort + 1} npm run dev`)
}

let databaseUrl = process.env.DATABASE_URL
if (!databaseUrl) {
  try {
    databaseUrl = (await startDb()).url
  } catch (err) {
    fail(err instanceof DbScriptError ? `db: ${err.message}` : String(err))
  }
}
const env = { DATABASE_URL: databaseUrl, EMBEDDED_WORKER: process.env.EMBEDDED_WORKER ?? 'true' }
if (runStep(null, process.execPath, [...TSX, 'server/db/prepare.ts', '--seed'], env) !== 0) process.exit(1)

// Each child leads its own process group: tsx watch and vite both fork, and a plain kill of the
// parent would leave the real server running.
const api = spawnGroup(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'watch', '--clear-screen=false', 'server/index.ts'], env)
// vite.config.ts reads PORT for its /api proxy target.
const web = spawnGroup(process.execPath, ['node_modules/vite/bin/vite.js', '--host', '127.0.0.1'], { PORT: String(apiPort) })
const children = [api, web]

let stopping = false
function stopAll(code = 0) {
  if (stopping) return
  stopping = true
  for (const c of children) killGroup(c, 'SIGTERM')
  const force = setTimeout(() => {
    for (const c of children) killGroup(c, 'SIGKILL')
    process.exit(code)
  }, 5_000)
  let left = children.filter((c) => c.exitCode === null && c.signalCode === null).length
  if (left === 0) process.exit(code)
  for (const c of children) {
    c.once('exit', () => {
      if (--left === 0) {
        clearTimeout(force)
        process.exit(code)
      }
    })
  }
}
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => stopAll(0))
// If either side dies on its own, take the other down too rather than leave half a dev setup.
for (const c of children) c.on('exit', (code) => !stopping && (console.error('dev: a child process exited; stopping'), stopAll(code ?? 1)))
