// The flat one-channel kernels for thermal noise (solver/steppers/svea-noise-kernel.ts), for Kerr with thermal
// noise (svea-kerr-noise-kernel.ts) and for the higher-order acoustic equation (higher-order-kernel.ts, with Kerr and
// noise each on or off), and the
// flat kernel for several channels (svea-channels-kernel.ts, with Kerr, thermal noise and the higher-order term each on
// or off), against the general kernel they are written from:
// whole runs with the same seed, every returned array compared bit for bit (Object.is on each number). The
// flat kernels claim the general kernel's IEEE operations in its order and its order of random draws, so a
// reordered sum, a draw taken out of turn or a wrong facet weight shows as a differing bit.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { SimulationRun, simulateSync, type SimulationResult } from '../../solver/index'
import { planGrid } from '../../solver/driver'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44
const cells = (n: number) => ({ timeStepPs: (0.05 / (VG * n)) * 1e12, mapRows: 32, mapCols: 32 })
const crossing = { pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)], backgroundPowerW: 1e-3 } }
const example = (name: string) => SimulationConfig.parse(JSON.parse(readFileSync(new URL(`../../solver/examples/${name}.json`, import.meta.url), 'utf8')))
const noise = (seed: number) => ({ enabled: true, temperatureK: 300, seed, zeroPoint: false })
const withNoise = (c: SimulationConfig, seed: number): SimulationConfig => ({ ...c, options: { ...c.options, noise: noise(seed) } })

const NOISE_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, lossy, crossing pulses, detuned, seed 5': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30 }, channels: [crossing], options: { noise: noise(5) } }),
  'chip, 40 cells, CW pump only (spontaneous Stokes), acoustic advection, seed 9': chipConfig({ windowNs: 3, grid: cells(40), channels: [{ pump: { backgroundPowerW: 0.3 } }], options: { acousticAdvection: true, noise: noise(9) } }),
  // The storage example forks its reference run mid-way; the fork continues the parent's stream of draws.
  'storage 150 ps with its reference run, seed 2': withNoise(example('storage-150ps-svea'), 2),
}

// n₂ of a chalcogenide glass scale (1e-17 m²/W on the 1 µm² chip: strong self-phase, every Kerr term visible).
const KERR_NOISE_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, lossy, crossing pulses, detuned, seed 6': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30, kerrN2M2PerW: 1e-17 }, channels: [crossing], options: { kerr: true, noise: noise(6) } }),
  'chip, 40 cells, CW pump only, acoustic advection, seed 8': chipConfig({ windowNs: 3, grid: cells(40), waveguide: { kerrN2M2PerW: 1e-17 }, channels: [{ pump: { backgroundPowerW: 0.3 } }], options: { kerr: true, acousticAdvection: true, noise: noise(8) } }),
  'storage 150 ps with its reference run, Kerr, seed 2': (() => {
    const c = withNoise(example('storage-150ps-svea'), 2)
    return { ...c, waveguide: { ...c.waveguide, kerrN2M2PerW: 1e-17 }, options: { ...c.options, kerr: true } }
  })(),
}

const HIGHER_ORDER_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, 1 GHz shift, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: 20, waveguide: { brillouinShiftGHz: 1, lossDbPerM: 10 }, channels: [crossing], options: { higherOrderAcoustic: true } }),
  'chip, 40 cells, 1 GHz shift, with noise, seed 3': chipConfig({ windowNs: 3, grid: cells(40), waveguide: { brillouinShiftGHz: 1 }, channels: [crossing], options: { higherOrderAcoustic: true, noise: noise(3) } }),
  'chip, 40 cells, 1 GHz shift, CW, advection, with noise, seed 4': chipConfig({ windowNs: 3, grid: cells(40), waveguide: { brillouinShiftGHz: 1 }, channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }], options: { higherOrderAcoustic: true, acousticAdvection: true, noise: noise(4) } }),
  'chip, 41 cells, 1 GHz shift, Kerr, crossing pulses, detuned, lossy': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: 20, waveguide: { brillouinShiftGHz: 1, lossDbPerM: 10, kerrN2M2PerW: 1e-17 }, channels: [crossing], options: { higherOrderAcoustic: true, kerr: true } }),
  'chip, 40 cells, 1 GHz shift, Kerr, CW, advection, with noise, seed 15': chipConfig({ windowNs: 3, grid: cells(40), waveguide: { brillouinShiftGHz: 1, kerrN2M2PerW: 1e-17 }, channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }], options: { higherOrderAcoustic: true, kerr: true, acousticAdvection: true, noise: noise(15) } }),
}

// Channel spacings of ≥ 10 linewidths (34 MHz on the chip), as the configuration's rule asks.
const CHANNELS_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, two channels 1 GHz apart, lossy, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30 }, channels: [crossing, { ...crossing, offsetGHz: 1 }] }),
  'chip, 40 cells, three channels (0, 0.7, −1.5 GHz), CW and pulses, acoustic advection': chipConfig({
    windowNs: 3,
    grid: cells(40),
    channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }, { ...crossing, offsetGHz: 0.7 }, { offsetGHz: -1.5, pump: { pulses: [gaussian(0.5, 1, 0.4)] } }],
    options: { acousticAdvection: true },
  }),
  'chip, 101 cells, four channels 0.5 GHz apart, lossless': chipConfig({ windowNs: 3, grid: cells(101), channels: [0, 0.5, 1, 1.5].map((offsetGHz) => ({ ...crossing, offsetGHz })) }),
}

// Several channels with Kerr: each channel's light turns with the other channels' power (cross-phase) too.
const CHANNELS_KERR_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, two channels 1 GHz apart, Kerr, lossy, crossing pulses, detuned': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30, kerrN2M2PerW: 1e-17 }, channels: [crossing, { ...crossing, offsetGHz: 1 }], options: { kerr: true } }),
  'chip, 40 cells, three channels (0, 0.7, −1.5 GHz), Kerr, CW and pulses, acoustic advection': chipConfig({
    windowNs: 3,
    grid: cells(40),
    waveguide: { kerrN2M2PerW: 1e-17 },
    channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }, { ...crossing, offsetGHz: 0.7 }, { offsetGHz: -1.5, pump: { pulses: [gaussian(0.5, 1, 0.4)] } }],
    options: { kerr: true, acousticAdvection: true },
  }),
}

// Several channels with thermal noise (Kerr off and on): every channel's grating draws its own kick and mean draw.
const CHANNELS_NOISE_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, two channels 1 GHz apart, noise, lossy, crossing pulses, detuned, seed 11': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: -15, waveguide: { lossDbPerM: 30 }, channels: [crossing, { ...crossing, offsetGHz: 1 }], options: { noise: noise(11) } }),
  'chip, 40 cells, three channels (0, 0.7, −1.5 GHz), noise, CW and pulses, acoustic advection, seed 12': chipConfig({
    windowNs: 3,
    grid: cells(40),
    channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }, { ...crossing, offsetGHz: 0.7 }, { offsetGHz: -1.5, pump: { pulses: [gaussian(0.5, 1, 0.4)] } }],
    options: { acousticAdvection: true, noise: noise(12) },
  }),
  'chip, 41 cells, two channels 1 GHz apart, Kerr and noise, lossy, crossing pulses, seed 13': chipConfig({ windowNs: 3, grid: cells(41), waveguide: { lossDbPerM: 30, kerrN2M2PerW: 1e-17 }, channels: [crossing, { ...crossing, offsetGHz: 1 }], options: { kerr: true, noise: noise(13) } }),
  'chip, 300 cells (two blocks of draws), two channels, CW pumps only (spontaneous Stokes), seed 14': chipConfig({ windowNs: 1, grid: cells(300), channels: [{ pump: { backgroundPowerW: 0.3 } }, { offsetGHz: 1, pump: { backgroundPowerW: 0.2 } }], options: { noise: noise(14) } }),
}

// Several channels with the higher-order acoustic term (1 GHz shift), alone, with noise, and with Kerr and noise.
const CHANNELS_HIGHER_ORDER_CASES: Record<string, SimulationConfig> = {
  'chip, 41 cells, 1 GHz shift, two channels 0.5 GHz apart, crossing pulses, detuned, lossy': chipConfig({ windowNs: 3, grid: cells(41), detuningMHz: 20, waveguide: { brillouinShiftGHz: 1, lossDbPerM: 10 }, channels: [crossing, { ...crossing, offsetGHz: 0.5 }], options: { higherOrderAcoustic: true } }),
  'chip, 40 cells, 1 GHz shift, three channels, CW and pulses, advection, noise, seed 16': chipConfig({
    windowNs: 3,
    grid: cells(40),
    waveguide: { brillouinShiftGHz: 1 },
    channels: [{ pump: { backgroundPowerW: 0.3 }, stokes: { backgroundPowerW: 1e-3 } }, { ...crossing, offsetGHz: 0.4 }, { offsetGHz: -0.6, pump: { pulses: [gaussian(0.5, 1, 0.4)] } }],
    options: { higherOrderAcoustic: true, acousticAdvection: true, noise: noise(16) },
  }),
  'chip, 300 cells, 1 GHz shift, two channels, Kerr and noise, seed 17': chipConfig({ windowNs: 3, grid: cells(300), waveguide: { brillouinShiftGHz: 1, kerrN2M2PerW: 1e-17 }, channels: [crossing, { ...crossing, offsetGHz: 0.5 }], options: { higherOrderAcoustic: true, kerr: true, noise: noise(17) } }),
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

function compare(config: SimulationConfig, flag: 'noiseFast' | 'kerrNoiseFast' | 'higherOrderFast' | 'channelsFast'): void {
  // The automatic choice takes the flat kernel (read off the run, so the comparison is not general vs general).
  expect(new SimulationRun(config, planGrid(config))[flag]).toBe(true)
  const flat = simulateSync(config, { engine: 'ts' })
  const general = simulateSync(config, { engine: 'ts', forceGeneralKernel: true })
  expect(flat.status).toBe('finished')
  expect(general.status).toBe('finished')
  expect(flat.channels[0].stokesOut.some((x) => x !== 0)).toBe(true)
  expect(firstDifference(flat, general)).toBeNull()
}

describe('flat thermal-noise kernel: bit-identical to the general kernel', () => {
  for (const [name, config] of Object.entries(NOISE_CASES)) it(name, () => compare(config, 'noiseFast'))
})

describe('flat Kerr-with-noise kernel: bit-identical to the general kernel', () => {
  for (const [name, config] of Object.entries(KERR_NOISE_CASES)) it(name, () => compare(config, 'kerrNoiseFast'))
})

describe('flat higher-order kernel: bit-identical to the general kernel', () => {
  for (const [name, config] of Object.entries(HIGHER_ORDER_CASES)) it(name, () => compare(config, 'higherOrderFast'))
})

describe('flat several-channel kernel: bit-identical to the general kernel', () => {
  for (const [name, config] of Object.entries(CHANNELS_CASES)) it(name, () => compare(config, 'channelsFast'))
  for (const [name, config] of Object.entries(CHANNELS_KERR_CASES)) it(name, () => compare(config, 'channelsFast'))
  for (const [name, config] of Object.entries(CHANNELS_NOISE_CASES)) it(name, () => compare(config, 'channelsFast'))
  for (const [name, config] of Object.entries(CHANNELS_HIGHER_ORDER_CASES)) it(name, () => compare(config, 'channelsFast'))
})
