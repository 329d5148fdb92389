// Which engine the validation tests ran on in this pass: the default pass runs the solver's automatic choice (the
// WebAssembly engine for a plain one-channel SVEA run), the second pass (vitest.ts-engine.config.ts sets
// VALIDATION_ENGINE=ts) the TypeScript kernels. Without this check a pass whose engine switch silently failed
// would repeat the first pass and prove nothing.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { SimulationRun } from '../../solver/index'
import { planGrid } from '../../solver/driver'

const example = SimulationConfig.parse(JSON.parse(readFileSync(new URL('../../solver/examples/storage-150ps-svea.json', import.meta.url), 'utf8')))

describe('engine of this validation pass', () => {
  it('is the one the pass names', () => {
    const run = new SimulationRun(example, planGrid(example))
    expect(run.engine).toBe(process.env.VALIDATION_ENGINE === 'ts' ? 'ts' : 'wasm')
    run.close()
  })
})
