// The general interaction kernel is refactored without changing a bit of its output: each case below hashes
// (SHA-256) every array the run returns, and the hashes were recorded with the kernel as it stood before it was
// split into named steps. Any change of rounding order, of the noise draw order across channels or of a
// facet weight changes a hash. Regression check against a recorded state (common practice for refactors).
// Platform note: the solver uses IEEE doubles and V8's Math.exp/log/sqrt/sin/cos; a Node.js major with a
// different Math library could change low bits. Re-record then with HASH_RECORD=1 on the unchanged kernel.
import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { simulateSync, type SimulationResult } from '../../solver/index'
import { chipConfig, gaussian } from './chip-fixtures'

const VG = 299_792_458 / 2.44
/** 40 cells on the 5 cm chip: small runs, every code path of the kernel. */
const grid = { timeStepPs: (0.05 / (VG * 40)) * 1e12, mapRows: 16, mapCols: 16 }
const pulses = { pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }
const noOptions = { errorEstimate: false }

const CASES = {
  'one channel, SVEA, general kernel forced': {
    config: chipConfig({ windowNs: 3, grid, channels: [pulses], options: noOptions }),
    forceGeneralKernel: true,
  },
  'thermal noise, seed 7': {
    config: chipConfig({ windowNs: 3, grid, channels: [{ pump: { backgroundPowerW: 0.2 } }], options: { ...noOptions, noise: { enabled: true, temperatureK: 300, seed: 7 } } }),
  },
  'higher-order acoustics with noise, seed 3': {
    config: chipConfig({ windowNs: 3, grid, waveguide: { brillouinShiftGHz: 1 }, channels: [pulses], options: { ...noOptions, higherOrderAcoustic: true, noise: { enabled: true, temperatureK: 300, seed: 3 } } }),
  },
  'Kerr': {
    config: chipConfig({ windowNs: 3, grid, waveguide: { kerrN2M2PerW: 1e-17 }, channels: [pulses], options: { ...noOptions, kerr: true } }),
  },
  'two channels with noise, seed 11': {
    config: chipConfig({
      windowNs: 3,
      grid,
      channels: [pulses, { offsetGHz: 0.6, pump: { backgroundPowerW: 0.3 } }],
      options: { ...noOptions, noise: { enabled: true, temperatureK: 300, seed: 11 } },
    }),
  },
  'two channels, higher order and Kerr': {
    config: chipConfig({
      windowNs: 3,
      grid,
      waveguide: { brillouinShiftGHz: 1, kerrN2M2PerW: 1e-17 },
      channels: [pulses, { offsetGHz: 0.6, pump: { backgroundPowerW: 0.3 } }],
      options: { ...noOptions, higherOrderAcoustic: true, kerr: true },
    }),
  },
}

/**
 * Recorded with the unsplit kernel (Node.js 20, x86-64). The three noise cases were re-recorded when the
 * default normal generator became the ziggurat (solver/steppers/ziggurat-normal.ts), after the kernels were
 * shown unchanged: fed the former polar-method generator, they gave the hashes recorded before
 * (4f708130…, 05c5ddcd…, 07a69ec2…).
 */
const RECORDED: Record<keyof typeof CASES, string> = {
  'one channel, SVEA, general kernel forced': '73759f08d01294987a6676c1474401668898540fbaefa11dda94740294f46c51',
  'thermal noise, seed 7': '1b9264a1a9ed4bd55655996a4ceb86177142b18b78ab987701c1b398328472e2',
  'higher-order acoustics with noise, seed 3': 'a5291e2a3494f245a1c996c0ccad049889918980a0356a43a5e2e2f020ba2328',
  'Kerr': '8355261d015d837bee26d4bdc282f25a18298164ceb1cce0e44a79f2900a5abf',
  'two channels with noise, seed 11': 'e021d681e534fa6f4d24fd1243d14d6fc69be963fcf3465163e50be3529eab13',
  'two channels, higher order and Kerr': 'd5f5bedbcd08012d266dc8c7c3e72162991d70171c8b7b0261c665f8d155e730',
}

/** Arrays derived from the traces after the run (their spectra), not written by the kernel. */
const DERIVED = /(_psd_dbm_per_ghz|^spectrum_offset_ghz)$/

/** SHA-256 over every array the kernel's run returns (by name, in name order) and the final acoustic field. */
function outputHash(r: SimulationResult): string {
  const h = createHash('sha256')
  for (const name of Object.keys(r.arrays).sort()) {
    if (DERIVED.test(name)) continue
    const a = r.arrays[name]
    h.update(name)
    h.update(new Uint8Array(a.buffer, a.byteOffset, a.byteLength))
  }
  return h.digest('hex')
}

describe('general interaction kernel, bit for bit', () => {
  it.each(Object.keys(CASES) as (keyof typeof CASES)[])('%s gives the recorded output', (name) => {
    const c = CASES[name] as { config: ReturnType<typeof chipConfig>; forceGeneralKernel?: boolean }
    const r = simulateSync(c.config, { forceGeneralKernel: c.forceGeneralKernel ?? false })
    expect(r.status).toBe('finished')
    // The case exercises the kernel: light left the guide, and noise cases have a nonzero Stokes without seed.
    expect(r.channels[0].stokesOut.some((x) => x !== 0)).toBe(true)
    const hash = outputHash(r)
    if (process.env.HASH_RECORD) console.log(`  '${name}': '${hash}',`)
    expect(hash).toBe(RECORDED[name])
  })
})
