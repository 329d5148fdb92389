#!/usr/bin/env node
// `npm test`: the same set-up as `npm start`, then type checks, the client build and every test,
// against a fresh database that is dropped afterwards (kept, and named, when something failed).
import { spawn } from 'node:child_process'
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import { createDb, databaseUrl, DbScriptError, dropDb, start as startDb, testDatabaseName } from './db.mjs'
import { elapsed, ensureDependencies, fail, ROOT, runStep, TSX } from './lib.mjs'
import { pruneOldTestDatabases } from './test-db-prune.mjs'

const t0 = performance.now()
ensureDependencies()

const name = testDatabaseName()
try {
  await startDb(undefined, { database: null })
  pruneOldTestDatabases()
  createDb(name)
} catch (err) {
  fail(err instanceof DbScriptError ? `db: ${err.message}` : String(err))
}
const url = databaseUrl(name)
// Both names point at the throwaway database, so nothing under test can reach the demo one.
const env = { TEST_DATABASE_URL: url, DATABASE_URL: url }
console.log(`test: database ${name}`)

const failures = []
if (runStep('test: migrate', process.execPath, [...TSX, 'server/db/migrate.ts'], env) !== 0) failures.push('migrations')
if (runStep('test: typecheck', 'npm', ['run', '--silent', 'typecheck']) !== 0) failures.push('typecheck')
// The dependency arrows, configuration reads, file names and unused code (eslint.config.js).
if (runStep('test: lint', 'npm', ['run', '--silent', 'lint']) !== 0) failures.push('lint')
// The committed WebAssembly engine must be the compile of its AssemblyScript source (scripts/build-wasm.mjs).
if (runStep('test: wasm engine', process.execPath, ['scripts/build-wasm.mjs', '--check']) !== 0) failures.push('wasm engine')
// The e2e run serves dist/; building it here also proves the client builds.
if (runStep('test: client build', process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn']) !== 0) failures.push('client build')

// The download tests open the ZIPs with a standard unzip, not only with our own reader.
ensureDebianTools([{ bin: '/usr/bin/unzip', pkg: 'unzip' }])
const VITEST = join('node_modules', 'vitest', 'vitest.mjs')
const totals = { passed: 0, failed: 0, skipped: 0 }
const unit = await runVitest('unit and API tests', [VITEST, 'run'])
if (unit !== 0) failures.push('vitest')
// The solver's validation tests once more on the TypeScript reference kernels (vitest.ts-engine.config.ts):
// the first pass ran them on the engine the solver picks by default.
if ((await runVitest('validation tests on the TypeScript engine', [VITEST, 'run', '-c', 'vitest.ts-engine.config.ts'])) !== 0) failures.push('validation on the TypeScript engine')

const E2E_CONFIG = 'vitest.e2e.config.ts'
if (existsSync(join(ROOT, E2E_CONFIG))) {
  ensureDebianTools([{ bin: '/usr/bin/chromium', pkg: 'chromium' }])
  if ((await runVitest('browser tests', [VITEST, 'run', '-c', E2E_CONFIG])) !== 0) failures.push('e2e')
}

if (failures.length) {
  console.log(`test: kept database ${name} for inspection (drop it: node scripts/db.mjs drop-db ${name})`)
  console.log(`test: FAILED: ${failures.join(', ')} (${elapsed(t0)})`)
} else {
  dropDb(name)
  console.log(`test: all green in ${elapsed(t0)}`)
}
// The closing line CI reads: the sum over every vitest run above.
console.log(`vitest: ${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped`)
process.exit(failures.length ? 1 : 0)

/** Runs vitest with output passed through, and adds its closing line to the totals. */
function runVitest(label, args) {
  return new Promise((resolve) => {
    const t = performance.now()
    const child = spawn(process.execPath, args, {
      cwd: ROOT,
      stdio: ['inherit', 'pipe', 'inherit'],
      env: { ...process.env, ...env, ...(process.stdout.isTTY ? { FORCE_COLOR: '1' } : {}) },
    })
    let tail = ''
    child.stdout.on('data', (chunk) => {
      process.stdout.write(chunk)
      tail = (tail + chunk.toString()).slice(-4096)
    })
    child.on('close', (code) => {
      const plain = tail.replace(/\x1b\[[0-9;]*m/g, '')
      const lines = [...plain.matchAll(/^vitest: (\d+) passed, (\d+) failed, (\d+) skipped$/gm)]
      const last = lines.at(-1)
      if (last) {
        totals.passed += Number(last[1])
        totals.failed += Number(last[2])
        totals.skipped += Number(last[3])
      } else if (code !== 0) {
        totals.failed += 1 // vitest stopped before reporting (a config or start-up error)
      }
      console.log(`test: ${label} ${code === 0 ? 'done' : 'FAILED'} in ${elapsed(t)}`)
      resolve(code ?? 1)
    })
  })
}

/** Installs the Debian packages whose programs the tests call, once, when a program is missing. */
function ensureDebianTools(tools) {
  const missing = tools.filter((t) => !existsSync(t.bin))
  if (missing.length === 0) return
  const pkgs = missing.map((t) => t.pkg)
  if (process.getuid?.() !== 0) fail(`test: the tests need ${missing.map((t) => t.bin).join(', ')}; install them with \`sudo apt-get install ${pkgs.join(' ')}\``)
  console.log(`test: installing ${pkgs.join(', ')} with apt-get (once)…`)
  const aptEnv = { DEBIAN_FRONTEND: 'noninteractive' }
  if (runStep(null, 'apt-get', ['update'], aptEnv) !== 0 || runStep(null, 'apt-get', ['install', '-y', '--no-install-recommends', ...pkgs], aptEnv) !== 0) {
    fail(`test: apt-get could not install ${pkgs.join(', ')}; install those Debian packages by hand and retry`)
  }
}
