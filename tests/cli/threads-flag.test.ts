// `npm run solve -- … --threads 1|2`: the flag is read in our words, reaches the solver, one and two threads
// write the same bytes, and two threads forced on options they do not cover are refused as bad input (exit 2).
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { parseArgs, UsageError } from '../../solver/cli/args'
import { REPO, runCli } from './run-cli'

const tmp = mkdtempSync(join(tmpdir(), 'solve-threads-'))
afterAll(() => rmSync(tmp, { recursive: true, force: true }))
const EXAMPLE = join(REPO, 'solver/examples/store-and-retrieve-chalcogenide-rib.json')

describe('--threads', () => {
  it('takes 1 or 2, in both spellings; absent means the automatic choice', () => {
    expect(parseArgs(['c.json', '--out', 'd', '--threads', '1']).threads).toBe(1)
    expect(parseArgs(['c.json', '--out', 'd', '--threads=2']).threads).toBe(2)
    expect(parseArgs(['c.json', '--out', 'd']).threads).toBeUndefined()
  })

  it('names the accepted values for anything else', () => {
    for (const value of ['0', '3', 'two', '1.5', '-1']) {
      expect(() => parseArgs(['c.json', '--out', 'd', `--threads=${value}`])).toThrow(UsageError)
      expect(() => parseArgs(['c.json', '--out', 'd', `--threads=${value}`])).toThrow('--threads takes a whole number from 1 to 2')
    }
    expect(() => parseArgs(['c.json', '--out', 'd', '--threads'])).toThrow('--threads takes a whole number from 1 to 2')
  })

  it('one and two threads write byte-identical arrays', async () => {
    const dirs = { one: join(tmp, 'one'), two: join(tmp, 'two') }
    for (const [threads, out] of [['1', dirs.one], ['2', dirs.two]]) {
      const r = await runCli([EXAMPLE, '--out', out, '--threads', threads])
      expect(r.stderr).toBe('')
      expect(r.code).toBe(0)
    }
    const files = readdirSync(dirs.one).filter((f) => f.endsWith('.npy'))
    expect(files.length).toBeGreaterThan(4)
    expect(readdirSync(dirs.two).sort()).toEqual(readdirSync(dirs.one).sort())
    for (const f of files) expect(readFileSync(join(dirs.two, f)).equals(readFileSync(join(dirs.one, f))), f).toBe(true)
  })

  it('two threads forced on a run with thermal noise are refused (exit 2) with the reason and the remedy', async () => {
    const config = JSON.parse(readFileSync(EXAMPLE, 'utf8'))
    config.options = { ...config.options, noise: { enabled: true, temperatureK: 300, seed: 3 } }
    const path = join(tmp, 'noise.json')
    writeFileSync(path, JSON.stringify(config))
    const r = await runCli([path, '--out', join(tmp, 'noise-out'), '--threads', '2'])
    expect(r.code).toBe(2)
    expect(r.stderr).toMatch(/Two threads cover a uniform waveguide, one channel .* no thermal noise/)
    expect(r.stderr).toMatch(/threads: choose one thread or the automatic choice/)
  })
})
