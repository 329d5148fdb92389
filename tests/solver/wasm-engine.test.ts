// The WebAssembly step engine against the TypeScript reference kernel (solver/steppers/interaction-kernel.ts,
// interactSvea): whole runs, both ways, every returned array compared bit for bit (Object.is on each number).
// The engine claims the same IEEE operations in the same order (docs/numerics.md, "Step engines"), so any
// reordering, fused multiply-add or lane mix-up shows as a differing bit. The cases are the shipped examples
// (storage with its reference run, depletion, a lossy fibre amplifier) and chip cases of docs/validation.md
// with odd and even cell counts (the engine pairs nodes two by two) and acoustic advection.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { CELL_UPDATES_PER_S_SVEA, estimateResources, SPEED_FACTOR_SEVERAL_CHANNELS, SPEED_FACTOR_WASM_ENGINE, wasmEngineCovers } from '@shared/physics/resource-estimate'
import { SimulationRun, simulateSync, type SimulationResult } from '../../solver/index'
import { planGrid } from '../../solver/driver'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44
const cells = (n: number) => ({ timeStepPs: (0.05 / (VG * n)) * 1e12, mapRows: 32, mapCols: 32 })
const crossing = { pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)], backgroundPowerW: 1e-3 } }
const example = (name: string) => SimulationConfig.parse(JSON.parse(readFileSync(new URL(`../../solver/examples/${name}.json`, import.meta.url), 'utf8')))

const withKerr = (c: SimulationConfig): SimulationConfig => ({ ...c, waveguide: { ...c.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...c.options, kerr: true } })

const CASES: Record<string, SimulationConfig> = {
  'storage 150 ps, SVEA (with its reference run)': example('storage-150ps-svea'),
  'store and retrieve': example('store-and-retrieve-chalcogenide-rib'),
  'store, refresh, retrieve': example('store-refresh-retrieve-chalcogenide-rib'),
  'pulsed-pump depletion': example('pulsed-pump-depletion-chalcogenide-rib'),
  'CW amplifier, lossy fibre': example('cw-amplifier-silica-fibre'),
  // Detuned from the Brillouin resonance, so the acoustic step factor e^{−λΔt} is complex (both its parts enter).
  'storage 150 ps, detuned by 20 MHz': { ...example('storage-150ps-svea'), detuningMHz: 20 },
  'chip, 41 cells (odd), lossy, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30 }, channels: [crossing] }),
  'chip, 40 cells (even), CW depletion, lossless, detuned': chipConfig({ windowNs: 4, grid: cells(40), detuningMHz: 25, channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }] }),
  // Kerr phases (n₂ of a chalcogenide glass, order of magnitude from memory; large enough to turn the phases).
  'chip, 41 cells, Kerr, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: 10, waveguide: { kerrN2M2PerW: 1e-17, lossDbPerM: 10 }, channels: [crossing], options: { kerr: true } }),
  'store and retrieve with Kerr': withKerr(example('store-and-retrieve-chalcogenide-rib')),
  'chip, 5 cells, CW, acoustic advection': chipConfig({ windowNs: 2, grid: cells(5), channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }], options: { acousticAdvection: true } }),
}

/** The first number that differs between two runs (by array name and index), or null when every bit agrees. */
function firstDifference(a: SimulationResult, b: SimulationResult): string | null {
  const names = Object.keys(a.arrays)
  if (names.join() !== Object.keys(b.arrays).join()) return `array names ${names} vs ${Object.keys(b.arrays)}`
  for (const name of names) {
    const x = a.arrays[name], y = b.arrays[name]
    if (x.length !== y.length) return `${name}: length ${x.length} vs ${y.length}`
    for (let i = 0; i < x.length; i++) if (!Object.is(x[i], y[i])) return `${name}[${i}]: ${x[i]} vs ${y[i]}`
  }
  return null
}

/** Figures without the wall-clock ones (which differ between any two runs). */
function figuresOf(r: SimulationResult): string {
  return JSON.stringify(r.manifest.figures, (key, value) => (/wallTime|PerS$/i.test(key) ? undefined : value))
}

describe('WebAssembly engine: bit-identical to the TypeScript kernel', () => {
  for (const [name, config] of Object.entries(CASES)) {
    it(name, () => {
      const ts = simulateSync(config, { engine: 'ts' })
      const wasm = simulateSync(config, { engine: 'wasm' })
      expect(ts.status).toBe('finished')
      expect(wasm.status).toBe('finished')
      expect(Object.keys(ts.arrays).length).toBeGreaterThan(4)
      expect(firstDifference(ts, wasm)).toBeNull()
      expect(figuresOf(wasm)).toBe(figuresOf(ts))
    })
  }

  it('with Kerr, the flat TypeScript kernel and the engine give the bits of the general kernel', () => {
    for (const name of ['chip, 41 cells, Kerr, crossing pulses, detuned', 'store and retrieve with Kerr']) {
      const general = simulateSync(CASES[name], { forceGeneralKernel: true })
      expect(general.status).toBe('finished')
      expect(firstDifference(general, simulateSync(CASES[name], { engine: 'ts' })), name).toBeNull()
      expect(firstDifference(general, simulateSync(CASES[name], { engine: 'wasm' })), name).toBeNull()
    }
  })

  it('the engine in one pass equals the TypeScript kernel stepped in uneven chunks, state included', () => {
    const config = CASES['chip, 41 cells (odd), lossy, crossing pulses, detuned']
    const whole = new SimulationRun(config, planGrid(config), { engine: 'wasm' })
    whole.advance(Number.MAX_SAFE_INTEGER)
    const chunked = new SimulationRun(config, planGrid(config), { engine: 'ts' })
    for (const step of [1, 7, 2, 100, 3]) chunked.advance(step)
    chunked.advance(Number.MAX_SAFE_INTEGER)
    for (const key of ['pumpOut', 'stokesOut'] as const) expect(Array.from(whole.traces[0][key])).toEqual(Array.from(chunked.traces[0][key]))
    expect(Array.from(whole.state.bRe)).toEqual(Array.from(chunked.state.bRe))
  })
})

describe('engine choice', () => {
  const plain = CASES['chip, 41 cells (odd), lossy, crossing pulses, detuned']
  const run = (config: SimulationConfig, options: ConstructorParameters<typeof SimulationRun>[2] = {}) => new SimulationRun(config, planGrid(config), options)
  const kerr = chipConfig({ windowNs: 3, grid: cells(41), waveguide: { kerrN2M2PerW: 1e-17 }, channels: [crossing], options: { kerr: true } })
  const noise = chipConfig({ windowNs: 3, grid: cells(41), channels: [crossing], options: { noise: { enabled: true, temperatureK: 300, seed: 5 } } })
  const higherOrder = chipConfig({ windowNs: 3, grid: cells(41), waveguide: { brillouinShiftGHz: 1 }, channels: [crossing], options: { higherOrderAcoustic: true } })
  const twoChannels = chipConfig({ windowNs: 3, grid: cells(41), channels: [crossing, { offsetGHz: 0.6, pump: { backgroundPowerW: 0.3 } }] })
  const profiled = chipConfig({ windowNs: 3, grid: cells(41), waveguide: { profile: { segments: [{ startM: 0.02, endM: 0.03, shiftOffsetMHz: 20 }] } }, channels: [crossing] })

  it('automatic: the engine where it covers the options (one channel, SVEA, no noise; Kerr on or off)', () => {
    expect(run(plain).engine).toBe('wasm')
    expect(run(plain, { engine: 'auto' }).engine).toBe('wasm')
    expect(run(kerr).engine).toBe('wasm')
    for (const c of [noise, higherOrder, twoChannels]) expect(run(c).engine).toBe('ts')
  })

  it('the resource estimate counts the engine exactly for the runs the solver gives it', () => {
    for (const c of [plain, kerr, noise, higherOrder, twoChannels, profiled, ...Object.values(CASES)]) expect(wasmEngineCovers(c), JSON.stringify(c.options)).toBe(run(c).engine === 'wasm')
    expect(estimateResources(plain, planGrid(plain)).cellUpdatesPerS).toBe(CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_WASM_ENGINE)
    // Several channels run on the TypeScript engine, at their own measured factor.
    expect(estimateResources(twoChannels, planGrid(twoChannels)).cellUpdatesPerS).toBe(CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_SEVERAL_CHANNELS)
  })

  it("'ts' forces the TypeScript kernels, and the general-kernel testing aid wins over 'wasm'", () => {
    expect(run(plain, { engine: 'ts' }).engine).toBe('ts')
    expect(run(plain, { engine: 'wasm', forceGeneralKernel: true }).engine).toBe('ts')
  })

  it("a forced 'wasm' the engine cannot run fails with a sentence naming the remedy, never silently falls back", () => {
    for (const c of [noise, higherOrder, twoChannels, profiled]) {
      const r = simulateSync(c, { engine: 'wasm' })
      expect(r.status).toBe('failed')
      expect(r.message).toMatch(c === profiled ? /^The WebAssembly engine computes a uniform waveguide only/ : /^The WebAssembly engine covers one channel/)
      expect(r.manifest.issues).toEqual([{ path: 'engine', message: expect.stringMatching(/TypeScript engine \(ts\) or the automatic choice/) }])
    }
  })
})
