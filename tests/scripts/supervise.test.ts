// scripts/supervise.mjs with real child processes: a crashing child comes back, a crash loop is given up
// on with a line saying so, a clean exit or a requested stop ends the supervision.
import { spawn } from 'node:child_process'
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { supervise } from '../../scripts/supervise.mjs'
import { waitFor } from '../jobs/worker-process'

const dir = mkdtempSync(join(tmpdir(), 'sonoweave-supervise-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

/** A child that counts its starts in `file`, exits with `crashCode` on the first `crashes` of them, then stays up. */
function child(file: string, crashes: number, crashCode = 7) {
  const script = `
    const fs = require('node:fs'); const f = ${JSON.stringify(file)}
    const n = (fs.existsSync(f) ? Number(fs.readFileSync(f, 'utf8')) : 0) + 1
    fs.writeFileSync(f, String(n))
    if (n <= ${crashes}) process.exit(${crashCode})
    setInterval(() => {}, 1000)`
  return () => spawn(process.execPath, ['-e', script], { stdio: 'ignore' })
}
const starts = (file: string) => (existsSync(file) ? Number(readFileSync(file, 'utf8')) : 0)
const fast = { firstDelayMs: 20, maxDelayMs: 100 }

describe('supervise', () => {
  it('restarts a crashed child, saying so each time, and passes a stop on to it', async () => {
    const file = join(dir, 'twice')
    const lines: string[] = []

    const s = supervise({ spawnChild: child(file, 2), log: (l) => lines.push(l), ...fast })
    await waitFor('the third start', async () => starts(file) === 3 && s.pid !== null)
    const pid = s.pid!
    s.stop('SIGTERM')

    expect(await s.done).toBe(0)
    expect(lines).toEqual([
      'the server exited with code 7; restarting it in 0.02 s (1 crash within 60 s; it is given up on at 5)',
      'the server exited with code 7; restarting it in 0.04 s (2 crashes within 60 s; it is given up on at 5)',
    ])
    expect(() => process.kill(pid, 0)).toThrow() // the child is gone
  })

  it('restarts a child killed by a signal', async () => {
    const file = join(dir, 'killed')
    const lines: string[] = []
    const s = supervise({ spawnChild: child(file, 0), log: (l) => lines.push(l), ...fast })
    await waitFor('the first start', async () => starts(file) === 1 && s.pid !== null)

    process.kill(s.pid!, 'SIGKILL')
    await waitFor('the restart', async () => starts(file) === 2)
    s.stop()

    expect(await s.done).toBe(0)
    expect(lines).toEqual(['the server was killed by SIGKILL; restarting it in 0.02 s (1 crash within 60 s; it is given up on at 5)'])
  })

  it('gives up on a crash loop, with a line saying why', async () => {
    const file = join(dir, 'loop')
    const lines: string[] = []

    const code = await supervise({ spawnChild: child(file, Infinity, 1), log: (l) => lines.push(l), maxCrashes: 3, windowMs: 60_000, ...fast }).done

    expect(code).toBe(1)
    expect(starts(file)).toBe(3)
    expect(lines.at(-1)).toBe('the server exited with code 1; it crashed 3 times within 60 s, so it is not restarted again (see the errors above)')
  })

  it('does not restart a child that ends cleanly', async () => {
    const lines: string[] = []

    const code = await supervise({ spawnChild: () => spawn(process.execPath, ['-e', 'process.exit(0)']), log: (l) => lines.push(l), ...fast }).done

    expect(code).toBe(0)
    expect(lines).toEqual([])
  })
})
