// `npm run solve -- … --engine ts|wasm|auto`: the flag reaches the solver, both engines write the same bytes,
// and a forced WebAssembly engine for options it does not cover is refused as bad input (exit 2), in words.
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { parseArgs, UsageError } from '../../solver/cli/args'
import { REPO, runCli } from './run-cli'

const tmp = mkdtempSync(join(tmpdir(), 'solve-engine-'))
afterAll(() => rmSync(tmp, { recursive: true, force: true }))
const EXAMPLE = join(REPO, 'solver/examples/store-and-retrieve-chalcogenide-rib.json')

describe('--engine', () => {
  it('takes ts, wasm or auto, in both spellings; absent means the automatic choice', () => {
    expect(parseArgs(['c.json', '--out', 'd', '--engine', 'ts']).engine).toBe('ts')
    expect(parseArgs(['c.json', '--out', 'd', '--engine=wasm']).engine).toBe('wasm')
    expect(parseArgs(['--engine', 'auto', 'c.json', '--out', 'd']).engine).toBe('auto')
    expect(parseArgs(['c.json', '--out', 'd']).engine).toBeUndefined()
  })

  it('names the accepted values for anything else', () => {
    for (const argv of [['c.json', '--out', 'd', '--engine', 'gpu'], ['c.json', '--out', 'd', '--engine']]) {
      expect(() => parseArgs(argv)).toThrow(UsageError)
      expect(() => parseArgs(argv)).toThrow('--engine takes ts, wasm, auto')
    }
  })

  it('ts and wasm write byte-identical arrays and manifests apart from the times', async () => {
    const dirs = { ts: join(tmp, 'ts'), wasm: join(tmp, 'wasm') }
    for (const [engine, out] of Object.entries(dirs)) {
      const r = await runCli([EXAMPLE, '--out', out, '--engine', engine])
      expect(r.stderr).toBe('')
      expect(r.code).toBe(0)
    }
    const files = readdirSync(dirs.ts).filter((f) => f.endsWith('.npy'))
    expect(files.length).toBeGreaterThan(4)
    expect(readdirSync(dirs.wasm).sort()).toEqual(readdirSync(dirs.ts).sort())
    for (const f of files) expect(readFileSync(join(dirs.wasm, f)).equals(readFileSync(join(dirs.ts, f))), f).toBe(true)
    const figures = (dir: string) => JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')).figures.channels
    expect(figures(dirs.ts)).toHaveLength(1)
    expect(figures(dirs.wasm)).toEqual(figures(dirs.ts))
  })

  it('a forced wasm for a run with thermal noise is refused (exit 2) with the reason and the remedy', async () => {
    const config = JSON.parse(readFileSync(EXAMPLE, 'utf8'))
    config.options = { ...config.options, noise: { enabled: true, temperatureK: 300, seed: 3 } }
    const path = join(tmp, 'noise.json')
    writeFileSync(path, JSON.stringify(config))
    const r = await runCli([path, '--out', join(tmp, 'noise-out'), '--engine', 'wasm'])
    expect(r.code).toBe(2)
    expect(r.stderr).toMatch(/The WebAssembly engine covers one channel .* no thermal noise/)
    expect(r.stderr).toMatch(/engine: choose the TypeScript engine \(ts\) or the automatic choice \(auto\)/)
  })
})
