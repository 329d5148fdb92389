// One database per test file, cloned from a migrated template. Files that run job queues, sweep feeders or
// watchdogs act on every row of their database, so sharing one database lets one file's feeder hand another
// file's work to a queue nobody listens on. A clone (CREATE DATABASE … TEMPLATE) takes well under a second.
import { execFileSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'

/** The migrated template every file database is cloned from; global-db.ts makes it. */
export const TEMPLATE_ENV = 'TEST_TEMPLATE_DATABASE_URL'

function adminSql(anyUrl: string, sql: string): void {
  const admin = new URL(anyUrl)
  admin.pathname = '/postgres'
  execFileSync('psql', [admin.toString(), '-v', 'ON_ERROR_STOP=1', '-q', '-c', sql], { stdio: ['ignore', 'ignore', 'pipe'] })
}

export function templateNameFor(baseName: string): string {
  return `${baseName}_tpl`
}

/** Makes the template from the run's migrated database; nothing may be connected to it while this runs. */
export function createTemplate(baseUrl: string): string {
  const url = new URL(baseUrl)
  const base = url.pathname.slice(1)
  const tpl = templateNameFor(base)
  adminSql(baseUrl, `drop database if exists "${tpl}" with (force)`)
  adminSql(baseUrl, `create database "${tpl}" template "${base}"`)
  url.pathname = `/${tpl}`
  return url.toString()
}

export function dropDatabaseAt(url: string): void {
  adminSql(url, `drop database if exists "${new URL(url).pathname.slice(1)}" with (force)`)
}

/** A fresh, migrated database for one test file; its URL. */
export function createFileDatabase(): string {
  const templateUrl = process.env[TEMPLATE_ENV]
  if (!templateUrl) throw new Error(`${TEMPLATE_ENV} is not set: run through \`npm test\` or vitest with tests/setup/global-db.ts`)
  const url = new URL(templateUrl)
  const name = `${url.pathname.slice(1).replace(/_tpl$/, '')}_f${randomBytes(3).toString('hex')}`
  adminSql(templateUrl, `create database "${name}" template "${url.pathname.slice(1)}"`)
  url.pathname = `/${name}`
  return url.toString()
}
