#!/usr/bin/env node
// `npm start`: everything from a fresh clone to a served app, in one command.
// dependencies → PostgreSQL → migrations → demo seed → client build → server (API + client + worker),
// restarted after a crash.
import { spawn } from 'node:child_process'
import { DbScriptError, start as startDb } from './db.mjs'
import { clientBuildStale, elapsed, ensureDependencies, fail, portFree, ROOT, runStep, TSX } from './lib.mjs'
import { supervise } from './supervise.mjs'

const t0 = performance.now()
ensureDependencies()

// All configuration is checked before anything slow happens (server/env.ts; one line per problem).
if (runStep(null, process.execPath, [...TSX, 'server/env.ts']) !== 0) process.exit(1)
const port = Number(process.env.PORT || 3001)
const host = process.env.HOST || '127.0.0.1'
if (!(await portFree(port, host))) {
  fail(`start: port ${port} on ${host} is already in use (another Sonoweave?); stop it or run with PORT=${port + 1} npm start`)
}

let databaseUrl = process.env.DATABASE_URL
if (databaseUrl) {
  console.log('start: using the database in DATABASE_URL (the local cluster is not started)')
} else {
  try {
    databaseUrl = (await startDb(undefined, { profile: 'serve' })).url
  } catch (err) {
    fail(err instanceof DbScriptError ? `db: ${err.message}` : String(err))
  }
}
const env = { DATABASE_URL: databaseUrl }

if (runStep(null, process.execPath, [...TSX, 'server/db/prepare.ts', '--seed'], env) !== 0) process.exit(1)
// Demo runs of solver/examples, once, for a demo group without runs; the server's worker computes them.
// Not fatal: the app is usable without them (the script prints why it failed).
runStep(null, process.execPath, [...TSX, 'server/db/seed-runs.ts'], env)
// The solver's WebAssembly engine from its AssemblyScript source (rewritten only when the bytes change).
if (runStep(null, process.execPath, ['scripts/build-wasm.mjs']) !== 0) fail('build: the WebAssembly engine did not build (see above)')
if (clientBuildStale()) {
  if (runStep('build: client', process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn']) !== 0) {
    fail('build: the client did not build (see above)')
  }
} else {
  console.log('build: client is up to date')
}
console.log(`start: ready to serve after ${elapsed(t0)}`)

// The server prints its URL once it listens. It runs one embedded job worker unless told otherwise.
// Supervised: a crash restarts it (a crash loop is given up on, saying so; scripts/supervise.mjs).
const supervisor = supervise({
  spawnChild: () =>
    spawn(process.execPath, [...TSX, 'server/index.ts'], {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, ...env, EMBEDDED_WORKER: process.env.EMBEDDED_WORKER ?? 'true' },
    }),
})
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => supervisor.stop(signal))
process.exit(await supervisor.done)
