// SOLVER_ENGINE: the solver threads' step engine, 'auto' (default) or 'ts'; anything else stops the start with
// one line naming the variable, like every other setting.
import { afterEach, describe, expect, it } from 'vitest'
import { parseEnv, solverEngine } from './env'

const saved = process.env.SOLVER_ENGINE
afterEach(() => {
  if (saved === undefined) delete process.env.SOLVER_ENGINE
  else process.env.SOLVER_ENGINE = saved
})

describe('SOLVER_ENGINE', () => {
  const parse = (raw: Record<string, string>) => parseEnv(raw, { devSecret: () => 'd'.repeat(64), clusterPasswordFile: '/nonexistent' })

  it('accepts auto and ts, and refuses anything else naming the variable and the choices', () => {
    expect(parse({ SOLVER_ENGINE: 'auto' }).ok).toBe(true)
    expect(parse({ SOLVER_ENGINE: 'ts' }).ok).toBe(true)
    for (const bad of ['wasm', 'TS', 'gpu']) {
      const r = parse({ SOLVER_ENGINE: bad })
      expect(r.ok).toBe(false)
      expect(!r.ok && r.errors).toEqual(['SOLVER_ENGINE: must be auto or ts'])
    }
  })

  it('is read by the solver threads, automatic when unset or empty', () => {
    delete process.env.SOLVER_ENGINE
    expect(solverEngine()).toBe('auto')
    process.env.SOLVER_ENGINE = ''
    expect(solverEngine()).toBe('auto')
    process.env.SOLVER_ENGINE = 'ts'
    expect(solverEngine()).toBe('ts')
  })
})
