#!/usr/bin/env node
// A private PostgreSQL cluster for this checkout: .data/pg, 127.0.0.1 only, a fixed non-default port.
// Plain Node with no dependencies: it runs before `npm ci` on a fresh machine.
//
//   node scripts/db.mjs start | stop | status | url [NAME] | create-db NAME | drop-db NAME
//
// PGPORT overrides the port (default 55433), so two checkouts on one machine need not clash.
//
// Two profiles. 'serve' (`npm start`, `npm run db:start`) holds a group's results: fsync, full-page writes
// and synchronous commit on, and it brings a cluster made by an older version (or by a test run) up to
// that. 'test' (`npm test`, `npm run dev`, vitest) makes a new cluster without them, because a test
// database is thrown away anyway, and never weakens an existing one. Every new cluster has data checksums
// and a password for its `postgres` role, kept beside the data folder (.data/pg-password, mode 0600).
import { spawnSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync, appendFileSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { basename, dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..')
export const DEFAULT_PORT = 55433
export const APP_DB = 'sonoweave'
const PG_ROOT = '/usr/lib/postgresql'
const IS_ROOT = process.getuid?.() === 0
// The server refuses to run as root; as root we hand the cluster to Debian's `postgres` user.
const RUN_AS = IS_ROOT ? 'postgres' : null

/** A one-line failure meant for the person at the terminal; the CLI prints it without a stack. */
export class DbScriptError extends Error {}

/** The cluster this checkout uses, unless a caller (a test) names another. */
export function defaultCluster() {
  const port = Number(process.env.PGPORT ?? DEFAULT_PORT)
  if (!Number.isInteger(port) || port < 1024 || port > 65535) {
    throw new DbScriptError(`PGPORT=${process.env.PGPORT} is not a usable port; set PGPORT to a number between 1024 and 65535`)
  }
  return { dataDir: join(ROOT, '.data', 'pg'), port }
}

/** Where the `postgres` role's password is kept: beside the data folder, e.g. .data/pg-password. */
export function passwordFile(cluster = defaultCluster()) {
  return join(dirname(cluster.dataDir), `${basename(cluster.dataDir)}-password`)
}

function readPassword(cluster) {
  try {
    return readFileSync(passwordFile(cluster), 'utf8').trim() || null
  } catch {
    return null // a cluster made before passwords (trust), until `npm start` adds one
  }
}

/** Made once, readable by this user only (like the session secret in .data/jwt-secret). */
function ensurePassword(cluster) {
  const existing = readPassword(cluster)
  if (existing) return existing
  const password = randomBytes(24).toString('hex') // hex: safe in a URL without escaping
  mkdirSync(dirname(passwordFile(cluster)), { recursive: true })
  writeFileSync(passwordFile(cluster), `${password}\n`, { mode: 0o600 })
  chmodSync(passwordFile(cluster), 0o600)
  return password
}

export function databaseUrl(name = APP_DB, cluster = defaultCluster()) {
  const password = readPassword(cluster)
  return `postgres://postgres${password ? `:${password}` : ''}@127.0.0.1:${cluster.port}/${name}`
}

function run(cmd, args, { asPg = false, env } = {}) {
  const [file, argv] = asPg && RUN_AS ? ['runuser', ['-u', RUN_AS, '--', cmd, ...args]] : [cmd, args]
  const r = spawnSync(file, argv, { encoding: 'utf8', env: { ...process.env, ...env } })
  if (r.error) throw new DbScriptError(`could not run ${cmd}: ${r.error.message}`)
  return { code: r.status ?? 1, out: `${r.stdout ?? ''}${r.stderr ?? ''}`.trim() }
}

function versionsInstalled() {
  if (!existsSync(PG_ROOT)) return []
  return readdirSync(PG_ROOT)
    .filter((v) => existsSync(join(PG_ROOT, v, 'bin', 'initdb')))
    .sort((a, b) => Number(a) - Number(b))
}

/** The binaries matching the cluster's PG_VERSION if it exists, else the newest installed. */
function binDir(dataDir) {
  const versions = versionsInstalled()
  const versionFile = join(dataDir, 'PG_VERSION')
  if (existsSync(versionFile)) {
    const v = readFileSync(versionFile, 'utf8').trim()
    if (versions.includes(v)) return join(PG_ROOT, v, 'bin')
    throw new DbScriptError(`${dataDir} was made by PostgreSQL ${v}, which is not installed; install postgresql-${v} or delete ${dataDir} (its data is lost)`)
  }
  return versions.length ? join(PG_ROOT, versions.at(-1), 'bin') : null
}

export function ensureInstalled() {
  if (versionsInstalled().length) return
  if (!IS_ROOT) throw new DbScriptError('PostgreSQL is not installed; run `sudo apt-get install postgresql` or run this as root')
  console.log('db: installing PostgreSQL with apt-get (once)…')
  // Debian would otherwise create and start its own `main` cluster on 5432; we only need the binaries.
  const confDir = '/etc/postgresql-common'
  mkdirSync(confDir, { recursive: true })
  if (!existsSync(join(confDir, 'createcluster.conf'))) writeFileSync(join(confDir, 'createcluster.conf'), 'create_main_cluster = false\n')
  const env = { DEBIAN_FRONTEND: 'noninteractive', UCF_FORCE_CONFFOLD: '1' }
  const steps = [
    ['apt-get', ['update']],
    ['apt-get', ['install', '-y', '--no-install-recommends', '-o', 'Dpkg::Options::=--force-confdef', '-o', 'Dpkg::Options::=--force-confold', 'postgresql']],
  ]
  for (const [cmd, args] of steps) {
    const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } })
    if (r.status !== 0) throw new DbScriptError(`\`${cmd} ${args.join(' ')}\` failed; install the Debian package postgresql by hand and retry`)
  }
  if (!versionsInstalled().length) throw new DbScriptError(`apt-get finished but no initdb appeared under ${PG_ROOT}`)
}

/** postgres must be able to walk down to the data folder; a clone under a 700 folder breaks initdb. */
function checkReachable(dir) {
  if (!RUN_AS) return
  let blocked = null
  for (let d = dir; ; d = dirname(d)) {
    if (existsSync(d) && run('test', ['-x', d], { asPg: true }).code !== 0) blocked = d
    if (d === dirname(d)) break
  }
  if (blocked) {
    const mode = (statSync(blocked).mode & 0o777).toString(8)
    throw new DbScriptError(`PostgreSQL runs as user postgres, which cannot enter ${blocked} (mode ${mode}); run \`chmod o+x ${blocked}\` or put the project under a folder others can enter`)
  }
}

/** Settings that make a power cut lose recent commits or tear pages: only for throwaway test clusters. */
const FAST_SETTINGS = ['fsync = off', 'synchronous_commit = off', 'full_page_writes = off']
/** What 'serve' requires; ALTER SYSTEM puts these in postgresql.auto.conf, which overrides postgresql.conf. */
const DURABLE_SETTINGS = { fsync: 'on', synchronous_commit: 'on', full_page_writes: 'on' }
/** Password (SCRAM) over loopback TCP only; the cluster has no Unix socket. */
const HBA = ['# sonoweave (scripts/db.mjs): password sign-in over loopback only', 'host all all 127.0.0.1/32 scram-sha-256', 'host all all ::1/128 scram-sha-256', ''].join('\n')

function initCluster(cluster, profile) {
  const { dataDir } = cluster
  const dataParent = dirname(dataDir)
  mkdirSync(dataParent, { recursive: true })
  checkReachable(dataParent)
  mkdirSync(dataDir, { recursive: true, mode: 0o700 })
  if (RUN_AS) run('chown', ['-R', `${RUN_AS}:${RUN_AS}`, dataDir])
  run('chmod', ['700', dataDir])
  if (existsSync(join(dataDir, 'PG_VERSION'))) return false
  const bin = binDir(dataDir)
  const password = ensurePassword(cluster)
  // initdb reads the password from a file its user (postgres, when we are root) can read; removed at once.
  const pwDir = mkdtempSync(join(tmpdir(), 'sonoweave-initdb-'))
  const pwFile = join(pwDir, 'pw')
  try {
    writeFileSync(pwFile, `${password}\n`, { mode: 0o600 })
    if (RUN_AS) run('chown', ['-R', `${RUN_AS}:${RUN_AS}`, pwDir])
    const args = ['-D', dataDir, '-U', 'postgres', '--auth=scram-sha-256', `--pwfile=${pwFile}`, '--data-checksums', '-E', 'UTF8', '--locale=C.UTF-8']
    // A test cluster is thrown away with its data; skipping initdb's own fsync saves time there.
    if (profile === 'test') args.push('--no-sync')
    const r = run(join(bin, 'initdb'), args, { asPg: true })
    if (r.code !== 0) throw new DbScriptError(`initdb failed: ${lastLine(r.out)}`)
  } finally {
    rmSync(pwDir, { recursive: true, force: true })
  }
  writeFileSync(join(dataDir, 'pg_hba.conf'), HBA)
  // Only reachable over TCP on loopback; the port is passed at start so PGPORT can change it.
  appendFileSync(join(dataDir, 'postgresql.conf'), [
    '', '# sonoweave (scripts/db.mjs)',
    "listen_addresses = '127.0.0.1'", "unix_socket_directories = ''",
    'max_connections = 200', "log_min_messages = 'warning'",
    ...(profile === 'test' ? ['# a test cluster: speed over durability (a power cut can lose recent writes)', ...FAST_SETTINGS] : []),
    '',
  ].join('\n'))
  if (RUN_AS) run('chown', [`${RUN_AS}:${RUN_AS}`, join(dataDir, 'pg_hba.conf')])
  return true
}

function lastLine(text) {
  return text.split('\n').filter(Boolean).at(-1) ?? '(no output)'
}

function readPidFile(dataDir) {
  const file = join(dataDir, 'postmaster.pid')
  if (!existsSync(file)) return null
  const lines = readFileSync(file, 'utf8').split('\n')
  return { file, pid: Number(lines[0]), port: Number(lines[3]) }
}

/**
 * After a crash the pid file survives, and in a container its pid is soon reused by an unrelated
 * process. A pid file counts as live only if that pid is a postgres serving this data folder.
 */
export function removeStalePidFile(dataDir) {
  const info = readPidFile(dataDir)
  if (!info) return false
  let cmdline = ''
  try {
    cmdline = readFileSync(`/proc/${info.pid}/cmdline`, 'utf8').replaceAll('\0', ' ')
  } catch {
    /* no such process */
  }
  if (/postgres|postmaster/.test(cmdline) && cmdline.includes(dataDir)) return false
  rmSync(info.file, { force: true })
  return true
}

export function status(cluster = defaultCluster()) {
  const { dataDir } = cluster
  if (!existsSync(join(dataDir, 'PG_VERSION'))) return { running: false, initialised: false }
  const bin = binDir(dataDir)
  const r = run(join(bin, 'pg_ctl'), ['-D', dataDir, 'status'], { asPg: true })
  const pid = readPidFile(dataDir)
  return { running: r.code === 0, initialised: true, port: r.code === 0 ? pid?.port : undefined }
}

function portFree(port) {
  return new Promise((resolvePort) => {
    const srv = createServer()
    srv.once('error', () => resolvePort(false))
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolvePort(true)))
  })
}

/**
 * Idempotent: installs if needed, initialises once, reuses a running cluster, creates the app database.
 * profile 'serve' also brings an older cluster's durability and sign-in up to date (see the top of the file).
 */
export async function start(cluster = defaultCluster(), { quiet = false, database = APP_DB, profile = 'test' } = {}) {
  if (profile !== 'serve' && profile !== 'test') throw new DbScriptError(`unknown profile ${profile}`)
  const say = quiet ? () => {} : (m) => console.log(`db: ${m}`)
  ensureInstalled()
  if (initCluster(cluster, profile)) say(`initialised a new cluster in ${cluster.dataDir}${profile === 'test' ? ' (test settings: fast, not crash-safe)' : ''}`)
  if (removeStalePidFile(cluster.dataDir)) say('removed a stale postmaster.pid left by a crash')
  let st = status(cluster)
  if (profile === 'serve' && !st.running) enableChecksums(cluster, say)
  if (st.running && st.port !== cluster.port) {
    throw new DbScriptError(`the cluster in ${cluster.dataDir} is already running on port ${st.port}; stop it with \`npm stop\` or set PGPORT=${st.port}`)
  }
  if (st.running) {
    say(`reusing the cluster already running on 127.0.0.1:${cluster.port}`)
  } else {
    if (!(await portFree(cluster.port))) {
      throw new DbScriptError(`port ${cluster.port} on 127.0.0.1 is taken by another program; set PGPORT to a free port`)
    }
    const bin = binDir(cluster.dataDir)
    const logFile = join(cluster.dataDir, 'server.log')
    const r = run(join(bin, 'pg_ctl'), ['-D', cluster.dataDir, '-l', logFile, '-w', '-t', '60', '-o', `-p ${cluster.port}`, 'start'], { asPg: true })
    st = status(cluster)
    // Another `npm start`/`npm test` may have won the race to start it; that is fine.
    if (!st.running) {
      const log = existsSync(logFile) ? readFileSync(logFile, 'utf8') : r.out
      throw new DbScriptError(`PostgreSQL did not start: ${lastLine(log)} (full log: ${logFile})`)
    }
    say(`started PostgreSQL on 127.0.0.1:${cluster.port}`)
  }
  if (profile === 'serve') {
    requirePassword(cluster, say)
    requireDurability(cluster, say)
    if (checksumsOff(cluster)) say('data checksums are off in this cluster (made by an older version); to turn them on, stop it (`npm stop`) and run `npm start` again')
  }
  if (database && createDb(database, cluster)) say(`created database ${database}`)
  return { url: databaseUrl(database ?? APP_DB, cluster) }
}

/** A cluster made before passwords trusted every local user as superuser: give `postgres` a password. */
function requirePassword(cluster, say) {
  const hbaFile = join(cluster.dataDir, 'pg_hba.conf')
  const hba = readFileSync(hbaFile, 'utf8')
  const trusting = hba.split('\n').some((l) => /^\s*(local|host\w*)\s.*\btrust\s*$/.test(l))
  if (!trusting && readPassword(cluster)) return
  const password = ensurePassword(cluster)
  const set = psql(`alter role postgres password '${password}'`, cluster)
  if (set.code !== 0) throw new DbScriptError(`could not set the database password: ${lastLine(set.out)}`)
  writeFileSync(`${hbaFile}.before-password`, hba) // kept in case it held rules of the owner's own
  writeFileSync(hbaFile, HBA)
  const reload = psql('select pg_reload_conf()', cluster)
  if (reload.code !== 0) throw new DbScriptError(`could not reload the database settings: ${lastLine(reload.out)}`)
  say(`the postgres role now needs a password (kept in ${passwordFile(cluster)}); DATABASE_URL carries it`)
}

function settings(cluster, names) {
  const r = psql(`select name || '=' || setting from pg_settings where name in (${names.map((n) => `'${n}'`).join(', ')})`, cluster)
  if (r.code !== 0) throw new DbScriptError(`could not read the database settings: ${lastLine(r.out)}`)
  return Object.fromEntries(r.out.split('\n').filter(Boolean).map((l) => l.split('=')))
}

/** A cluster made by a test run (or an older version) trades durability for speed: undo that. */
function requireDurability(cluster, say) {
  const now = settings(cluster, Object.keys(DURABLE_SETTINGS))
  const off = Object.keys(DURABLE_SETTINGS).filter((n) => now[n] !== DURABLE_SETTINGS[n])
  if (off.length === 0) return
  // All three take effect on reload; synchronous_commit for new sessions.
  for (const name of off) {
    const r = psql(`alter system set ${name} = ${DURABLE_SETTINGS[name]}`, cluster)
    if (r.code !== 0) throw new DbScriptError(`could not turn on ${name}: ${lastLine(r.out)}`)
  }
  psql('select pg_reload_conf()', cluster)
  say(`turned on ${off.join(', ')} (the cluster had test settings, which a power cut could cost data)`)
}

function checksumsOff(cluster) {
  return settings(cluster, ['data_checksums']).data_checksums === 'off'
}

/** pg_checksums needs the cluster stopped and cleanly shut down; it rewrites every page once. */
function enableChecksums(cluster, say) {
  const bin = binDir(cluster.dataDir)
  const control = run(join(bin, 'pg_controldata'), ['-D', cluster.dataDir], { asPg: true })
  if (!/Data page checksum version:\s+0\b/.test(control.out)) return
  say('turning on data checksums (once; this reads and rewrites the whole cluster)…')
  const r = run(join(bin, 'pg_checksums'), ['--enable', '-D', cluster.dataDir], { asPg: true })
  if (r.code !== 0) say(`could not turn on data checksums: ${lastLine(r.out)}; the cluster runs without them`)
}

export function stop(cluster = defaultCluster(), { quiet = false } = {}) {
  const say = quiet ? () => {} : (m) => console.log(`db: ${m}`)
  if (!status(cluster).running) {
    removeStalePidFile(cluster.dataDir)
    say('not running')
    return false
  }
  const r = run(join(binDir(cluster.dataDir), 'pg_ctl'), ['-D', cluster.dataDir, '-m', 'fast', '-w', 'stop'], { asPg: true })
  if (r.code !== 0) throw new DbScriptError(`pg_ctl stop failed: ${lastLine(r.out)}`)
  say('stopped')
  return true
}

function psql(sql, cluster, database = 'postgres') {
  const bin = binDir(cluster.dataDir)
  const args = ['-h', '127.0.0.1', '-p', String(cluster.port), '-U', 'postgres', '-d', database, '-v', 'ON_ERROR_STOP=1', '-tAc', sql]
  const password = readPassword(cluster)
  return run(join(bin, 'psql'), args, { env: { PGCONNECT_TIMEOUT: '10', ...(password ? { PGPASSWORD: password } : {}) } })
}

const SAFE_NAME = /^[a-z_][a-z0-9_]{0,62}$/

function checkName(name) {
  if (!SAFE_NAME.test(name ?? '')) throw new DbScriptError(`database name "${name}" must be lower-case letters, digits and _`)
}

export function databaseExists(name, cluster = defaultCluster()) {
  checkName(name)
  const r = psql(`select 1 from pg_database where datname = '${name}'`, cluster)
  if (r.code !== 0) throw new DbScriptError(`could not reach PostgreSQL on port ${cluster.port}: ${lastLine(r.out)}`)
  return r.out === '1'
}

export function listDatabases(cluster = defaultCluster()) {
  const r = psql('select datname from pg_database order by 1', cluster)
  if (r.code !== 0) throw new DbScriptError(`could not reach PostgreSQL on port ${cluster.port}: ${lastLine(r.out)}`)
  return r.out.split('\n').map((s) => s.trim()).filter(Boolean)
}

/** Returns true when it created the database, false when it was there already. */
export function createDb(name, cluster = defaultCluster()) {
  if (databaseExists(name, cluster)) return false
  const r = psql(`create database "${name}"`, cluster)
  if (r.code !== 0 && !/already exists/.test(r.out)) throw new DbScriptError(`create database ${name} failed: ${lastLine(r.out)}`)
  return r.code === 0
}

export function dropDb(name, cluster = defaultCluster()) {
  checkName(name)
  if (name === APP_DB) throw new DbScriptError(`refusing to drop the app database ${APP_DB}`)
  const r = psql(`drop database if exists "${name}" with (force)`, cluster)
  if (r.code !== 0) throw new DbScriptError(`drop database ${name} failed: ${lastLine(r.out)}`)
}

/** A unique, sortable name for a throwaway test database: sonoweave_test_<utc time>_<random>. */
export function testDatabaseName() {
  const stamp = new Date().toISOString().replace(/[-:T]/g, '').slice(0, 14)
  return `sonoweave_test_${stamp}_${randomBytes(3).toString('hex')}`
}

async function main(argv) {
  const [cmd, arg] = argv
  switch (cmd) {
    case 'start': {
      const { url } = await start(defaultCluster(), { profile: 'serve' })
      console.log(`db: DATABASE_URL=${url.replace(/:[^:@/]+@/, ':…@')} (password in ${passwordFile()}; \`node scripts/db.mjs url\` prints it whole)`)
      return
    }
    case 'stop':
      stop()
      return
    case 'status': {
      const st = status()
      console.log(st.running ? `running on 127.0.0.1:${st.port}` : st.initialised ? 'stopped' : 'not initialised')
      process.exitCode = st.running ? 0 : 3
      return
    }
    case 'url':
      if (arg) checkName(arg)
      console.log(databaseUrl(arg ?? APP_DB))
      return
    case 'create-db':
      checkName(arg)
      await start(defaultCluster(), { quiet: true, database: null })
      console.log(createDb(arg) ? `created ${arg}` : `${arg} already exists`)
      return
    case 'drop-db':
      dropDb(arg)
      console.log(`dropped ${arg}`)
      return
    default:
      console.error('usage: node scripts/db.mjs start | stop | status | url [NAME] | create-db NAME | drop-db NAME')
      process.exitCode = 2
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main(process.argv.slice(2)).catch((err) => {
    console.error(err instanceof DbScriptError ? `db: ${err.message}` : err)
    process.exit(1)
  })
}
