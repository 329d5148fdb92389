// scripts/db.mjs against a second, private cluster in a temp folder on its own port, so the
// checkout's cluster (which other tests use) is never stopped.
import { spawn, spawnSync } from 'node:child_process'
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { createServer, type Server } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from 'vitest'
import { start, status, stop, type Cluster } from '../../scripts/db.mjs'

const asRoot = process.getuid?.() === 0

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const srv = createServer().listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number }
      srv.close(() => resolve(port))
    })
  })
}

const postmasterPid = (c: Cluster) => Number(readFileSync(join(c.dataDir, 'postmaster.pid'), 'utf8').split('\n')[0])

async function selectOne(url: string): Promise<number> {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    return (await client.query('select 1 as one')).rows[0].one
  } finally {
    await client.end()
  }
}

describe('scripts/db.mjs', () => {
  let parent: string
  let cluster: Cluster

  beforeAll(async () => {
    parent = mkdtempSync(join(tmpdir(), 'sonoweave-db-test-')) // mode 700, as mkdtemp makes it
    cluster = { dataDir: join(parent, 'pg'), port: await freePort() }
  })

  afterAll(() => {
    try {
      if (existsSync(join(cluster.dataDir, 'PG_VERSION'))) stop(cluster, { quiet: true })
    } finally {
      rmSync(parent, { recursive: true, force: true })
    }
  })

  it.runIf(asRoot)('refuses, in one line, a folder the postgres user cannot enter', async () => {
    await expect(start(cluster, { quiet: true })).rejects.toThrow(`cannot enter ${parent} (mode 700); run \`chmod o+x ${parent}\``)
  })

  it('initialises, starts and creates the database; a second start reuses the running server', async () => {
    chmodSync(parent, 0o755)

    const first = await start(cluster, { quiet: true })
    const pidAfterFirst = postmasterPid(cluster)
    const second = await start(cluster, { quiet: true })

    expect(second.url).toBe(first.url)
    expect(first.url).toBe(`postgres://postgres@127.0.0.1:${cluster.port}/sonoweave`)
    expect(postmasterPid(cluster)).toBe(pidAfterFirst)
    expect(status(cluster)).toEqual({ running: true, initialised: true, port: cluster.port })
    expect(await selectOne(first.url)).toBe(1)
  })

  it('stops, and stopping again is harmless', () => {
    expect(stop(cluster, { quiet: true })).toBe(true)
    expect(stop(cluster, { quiet: true })).toBe(false)
    expect(status(cluster).running).toBe(false)
  })

  it('starts despite a stale postmaster.pid naming a dead process or a reused pid', async () => {
    const dead = spawnSync('true').pid as number
    // After a container restart the old pid often belongs to some other process of the same user,
    // which PostgreSQL itself would take for a live server.
    const samePgUser = asRoot ? spawn('setpriv', ['--reuid=postgres', '--regid=postgres', '--clear-groups', 'sleep', '60']) : spawn('sleep', ['60'])
    onTestFinished(() => void samePgUser.kill())
    for (const stalePid of [dead, process.pid, samePgUser.pid as number]) {
      writeFileSync(join(cluster.dataDir, 'postmaster.pid'), `${stalePid}\n${cluster.dataDir}\n0\n${cluster.port}\n\n127.0.0.1\n0 0\nready\n`)

      const { url } = await start(cluster, { quiet: true })

      expect(postmasterPid(cluster)).not.toBe(stalePid)
      expect(await selectOne(url)).toBe(1)
      stop(cluster, { quiet: true })
    }
  })

  it('says which variable to change when the port is taken or the cluster runs on another port', async () => {
    const squatter: Server = await new Promise((resolve) => {
      const s = createServer().listen(cluster.port, '127.0.0.1', () => resolve(s))
    })
    await expect(start(cluster, { quiet: true })).rejects.toThrow(`port ${cluster.port} on 127.0.0.1 is taken by another program; set PGPORT`)
    await new Promise((resolve) => squatter.close(resolve))

    await start(cluster, { quiet: true })
    const elsewhere = { ...cluster, port: await freePort() }
    await expect(start(elsewhere, { quiet: true })).rejects.toThrow(`already running on port ${cluster.port}; stop it with \`npm stop\` or set PGPORT=${cluster.port}`)
  })
})
