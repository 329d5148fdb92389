import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { readNpyArray } from '@shared/analysis/trace-parse/npy'
import type { RunManifest } from '../../solver/io/manifest'
import { REPO, runCli, startCli } from './run-cli'

const tmp = mkdtempSync(join(tmpdir(), 'solve-cli-'))
afterAll(() => rmSync(tmp, { recursive: true, force: true }))

const example = (name: string) => JSON.parse(readFileSync(join(REPO, 'solver/examples', name), 'utf8'))
const writeConfig = (name: string, config: unknown) => {
  const path = join(tmp, name)
  writeFileSync(path, typeof config === 'string' ? config : JSON.stringify(config))
  return path
}

describe('npm run solve', () => {
  it('runs a small store-and-retrieve example and writes NPY files that match the manifest', async () => {
    const out = join(tmp, 'store')
    const r = await runCli([join(REPO, 'solver/examples/store-and-retrieve-chalcogenide-rib.json'), '--out', out])
    expect(r.stderr).toBe('')
    expect(r.code).toBe(0)
    expect(r.stdout).toMatch(/cell-updates/)
    expect(r.stdout).toMatch(/progress 100 %/) // not a TTY: plain lines

    const m = JSON.parse(readFileSync(join(out, 'manifest.json'), 'utf8')) as RunManifest
    expect(m.status).toBe('finished')
    expect(m.config.windowNs).toBe(6)
    expect(m.grid!.nt).toBe(m.estimate.steps)
    // The estimate counts work exactly as the solver does: the run and its error-estimate companion.
    expect(m.figures!.errorEstimate!.cellUpdates).toBe(m.estimate.errorEstimate!.cellUpdates)
    expect(m.estimate.cellUpdates).toBe(m.counters.cellUpdates + m.figures!.errorEstimate!.cellUpdates)
    expect(new Set(readdirSync(out))).toEqual(new Set(['manifest.json', ...m.arrays.map((a) => a.file)]))
    for (const a of m.arrays) {
      const bytes = readFileSync(join(out, a.file))
      const npy = readNpyArray(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength))
      expect(npy.descr).toBe(a.npyDescr)
      expect(npy.descr).toBe(`<${a.dtype}`)
      expect(npy.shape).toEqual(a.shape)
      expect((10 + npy.headerLength) % 64).toBe(0)
      expect(npy.data.every(Number.isFinite)).toBe(true)
    }
    // The launched data pulse is the configured one: peak |A|² = 10 mW at t ≈ 1 ns (the Gaussian's centre).
    const read = (f: string) => {
      const b = readFileSync(join(out, f))
      return readNpyArray(new Uint8Array(b.buffer, b.byteOffset, b.byteLength)).data
    }
    const pumpIn = read('ch1_pump_in.npy')
    const timeNs = read('time_ns.npy')
    let peak = 0
    let at = 0
    for (let k = 0; k < timeNs.length; k++) {
      const p = pumpIn[2 * k] ** 2 + pumpIn[2 * k + 1] ** 2
      if (p > peak) (peak = p), (at = timeNs[k])
    }
    expect(peak).toBeCloseTo(0.01, 4)
    expect(Math.abs(at - 1)).toBeLessThan(0.005)
  })

  it('prints the JSON Schema of the configuration with --schema', async () => {
    const r = await runCli(['--schema'])
    expect(r.code).toBe(0)
    const schema = JSON.parse(r.stdout)
    expect(schema.required).toEqual(expect.arrayContaining(['waveguide', 'channels', 'windowNs']))
    expect(schema.properties.waveguide.properties.lengthM.exclusiveMinimum).toBe(0)
    expect(schema.properties.waveguide.properties.lengthM.description).toMatch(/\(m\)/)
  })

  it('refuses an invalid config with field-level messages and exit code 2, writing nothing', async () => {
    const cfg = example('store-and-retrieve-chalcogenide-rib.json')
    cfg.waveguide.lengthM = -1
    cfg.channels[0].stokes.pulses[1].centreNs = 99
    const out = join(tmp, 'bad')
    const r = await runCli([writeConfig('bad.json', cfg), '--out', out])
    expect(r.code).toBe(2)
    expect(r.stderr).toMatch(/waveguide\.lengthM: /)
    expect(r.stderr).toMatch(/channels\.0\.stokes\.pulses\.1\.centreNs: The pulse centre must lie inside/)
    expect(existsSync(out)).toBe(false)
  })

  it('refuses malformed JSON, a missing file and missing arguments with exit code 2', async () => {
    const a = await runCli([writeConfig('broken.json', '{"waveguide": '), '--out', join(tmp, 'x')])
    expect(a.code).toBe(2)
    expect(a.stderr).toMatch(/not valid JSON/)
    const b = await runCli([join(tmp, 'nope.json'), '--out', join(tmp, 'x')])
    expect(b.code).toBe(2)
    expect(b.stderr).toMatch(/Cannot read/)
    const c = await runCli([join(tmp, 'nope.json')])
    expect(c.code).toBe(2)
    expect(c.stderr).toMatch(/--out DIR/)
  })

  it('will not overwrite a non-empty output directory without --force', async () => {
    const out = join(tmp, 'occupied')
    mkdirSync(out)
    writeFileSync(join(out, 'keep.txt'), 'mine')
    const r = await runCli([join(REPO, 'solver/examples/storage-150ps-svea.json'), '--out', out])
    expect(r.code).toBe(2)
    expect(r.stderr).toMatch(/not empty; use --force/)
    expect(readFileSync(join(out, 'keep.txt'), 'utf8')).toBe('mine')
  })

  it('refuses a run over the resource limit and names the knobs', async () => {
    const cfg = example('cw-amplifier-silica-fibre.json')
    cfg.grid.timeStepPs = 1 // 2.4e5 cells × 6e5 steps ≈ 1.5e11 cell-updates
    const r = await runCli([writeConfig('huge.json', cfg), '--out', join(tmp, 'huge')])
    expect(r.code).toBe(2)
    expect(r.stderr).toMatch(/Refused: .*cell-updates.*shorten the window.*coarser time step.*shorter waveguide/)
    expect(existsSync(join(tmp, 'huge'))).toBe(false)
  })

  it('stops on Ctrl-C (SIGINT) with exit code 130 and leaves no output behind', async () => {
    const cfg = example('cw-amplifier-silica-fibre.json')
    cfg.grid.timeStepPs = 20 // ≈ 3.7e8 cell-updates: long enough to interrupt
    const out = join(tmp, 'interrupted')
    const run = startCli([writeConfig('long.json', cfg), '--out', out])
    try {
      await new Promise<void>((resolve) => {
        const poll = setInterval(() => {
          if (/progress \d+ %/.test(run.output())) clearInterval(poll), resolve()
        }, 20)
      })
      run.child.kill('SIGINT')
      const r = await run.done
      expect(r.code).toBe(130)
      expect(r.stderr).toMatch(/Interrupted .*nothing was written/)
      expect(existsSync(out)).toBe(false)
      expect(readdirSync(tmp).filter((f) => f.includes('partial'))).toEqual([])
    } finally {
      run.child.kill('SIGKILL')
    }
  })
})
