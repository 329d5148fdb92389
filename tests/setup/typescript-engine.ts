// The validation suite's second pass (vitest.ts-engine.config.ts): every automatic engine choice resolves to the
// TypeScript reference kernels, so each closed-form and published-value check also runs on them, not only on
// the WebAssembly engine the solver picks by default. An explicit choice ('wasm' in the engine tests) stands.
import { vi } from 'vitest'

vi.mock('../../solver/engine/wasm-engine', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../solver/engine/wasm-engine')>()
  return {
    ...original,
    resolveEngine: (...[choice, m, forceGeneral]: Parameters<typeof original.resolveEngine>) => original.resolveEngine(choice === 'auto' ? 'ts' : choice, m, forceGeneral),
  }
})
