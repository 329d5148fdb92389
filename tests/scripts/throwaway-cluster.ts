// A PostgreSQL cluster of a test's own in a temp folder on a free port (made by scripts/db.mjs), which
// the test may restart or stop without touching the checkout's cluster that other tests use.
import { spawnSync } from 'node:child_process'
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { databaseUrl, start, stop, type Cluster, type StartOptions } from '../../scripts/db.mjs'

export function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const srv = createServer().listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number }
      srv.close(() => resolve(port))
    })
  })
}

export interface ThrowawayCluster {
  cluster: Cluster
  /** The folder holding the cluster (and its password file); removed by remove(). */
  parent: string
  url: (database?: string) => string
  /** pg_ctl restart -m fast: every connection is cut, as in a database restart in production. */
  restart: () => void
  remove: () => void
}

function pgCtl(cluster: Cluster, args: string[]): void {
  const version = readFileSync(join(cluster.dataDir, 'PG_VERSION'), 'utf8').trim()
  const bin = `/usr/lib/postgresql/${version}/bin/pg_ctl`
  const asRoot = process.getuid?.() === 0
  const [file, argv] = asRoot ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args]
  const r = spawnSync(file, argv, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] })
  if (r.status !== 0) throw new Error(`pg_ctl ${args.join(' ')} failed: ${r.stdout}${r.stderr}`)
}

export async function startThrowawayCluster(opts: StartOptions = {}): Promise<ThrowawayCluster> {
  const parent = mkdtempSync(join(tmpdir(), 'sonoweave-pg-'))
  chmodSync(parent, 0o755) // the postgres user must be able to enter it when we run as root
  const cluster = { dataDir: join(parent, 'pg'), port: await freePort() }
  await start(cluster, { quiet: true, ...opts })
  return {
    cluster,
    parent,
    url: (database = 'sonoweave') => databaseUrl(database, cluster),
    // -l: the restarted server must not write to (and so hold open) the pipe pg_ctl was started with.
    restart: () => pgCtl(cluster, ['-D', cluster.dataDir, '-l', join(cluster.dataDir, 'server.log'), '-m', 'fast', '-w', '-t', '60', 'restart']),
    remove: () => {
      try {
        if (existsSync(join(cluster.dataDir, 'PG_VERSION'))) stop(cluster, { quiet: true })
      } finally {
        rmSync(parent, { recursive: true, force: true })
      }
    },
  }
}
