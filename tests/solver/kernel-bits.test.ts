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
 * (4f708130…, 05c5ddcd…, 07a69ec2…). All six were re-recorded when the step-mean b̄ took the source's change over
 * the step (steppers/step-mean.ts; previous hashes 73759f08…, 1b9264a1…, a5291e2a…, 8355261d…, e021d681…,
 * d5f5bedb…), with the flat kernels shown bit-identical to the general one on the new step. The two Kerr cases
 * were re-recorded when the Kerr half steps took fewer divisions (the first half step and the exchange over one
 * reciprocal, the second half step's pump and Stokes factors over another: steppers/general-kernel.ts; previous
 * hashes 93c5b879…, 7383c442…), with the flat kernel and the WebAssembly engine shown bit-identical to it and
 * the self- and cross-phase closed forms of tests/solver/options.test.ts unchanged to seven digits. They were
 * re-recorded again when the Kerr step became one exchange in the first half step's frame and one rotation by the
 * whole step's tangent-corrected phase at the midpoint powers (steppers/kerr-phase.ts; previous hashes f00957fe…,
 * a3aea412…), with the flat kernel and the engine shown bit-identical to the general kernel, order 2 kept
 * (tests/solver/convergence.test.ts), and the self- and cross-phase errors down from 9.5e-7 and 7.2e-6 to 1.7e-11
 * and 9.9e-7 relative.
 */
const RECORDED: Record<keyof typeof CASES, string> = {
  'one channel, SVEA, general kernel forced': '9ec989525a579c69d4d43b579cde697c3611baf22de929241d86730abadd8c36',
  'thermal noise, seed 7': '90247bbf6f94b2655c69146d2104968a763fcd71050e75d1c158721698c183c3',
  'higher-order acoustics with noise, seed 3': '9af9c3e469a11f31ced660532a0fe2dd09fa9fad45dc95eb2407aab4faf60a7d',
  'Kerr': '9033791206fa5b47473e391ff5a7452acbcb3f38fcb398d34759d5fff2988e84',
  'two channels with noise, seed 11': '80f7e9bcd6a83f1c73e5c71b9a2c9eee1b4b1996a09ee2ee6964ad92f9d90332',
  'two channels, higher order and Kerr': '95d884c95460574ed00c7ec335713fe63de7ddc75f01ef72a2ce9fb9079e0b81',
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
