import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import { ClosingLine } from './tests/closing-line'

// The solver's validation tests a second time, with the automatic engine choice on the TypeScript kernels
// (tests/setup/typescript-engine.ts). A separate config, not a merge with vitest.config.ts, whose include list
// would be concatenated. Left out: the tests of the engine choice itself, which assert what 'auto' picks.
export default defineConfig({
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@solver': fileURLToPath(new URL('./solver', import.meta.url)),
    },
  },
  test: {
    include: ['tests/solver/**/*.test.ts'],
    exclude: ['tests/solver/wasm-engine.test.ts', 'tests/solver/wasm-engine-build.test.ts', 'tests/solver/threaded-engine.test.ts', 'tests/solver/thread-choice.test.ts', 'tests/solver/kernel-class.test.ts', 'node_modules/**'],
    setupFiles: ['tests/setup/typescript-engine.ts'],
    // tests/solver/validation-engine.test.ts checks that this pass really runs on the TypeScript kernels.
    env: { VALIDATION_ENGINE: 'ts' },
    reporters: ['default', new ClosingLine()],
    globalSetup: ['tests/setup/global-db.ts'],
    testTimeout: 120_000,
    hookTimeout: 240_000,
  },
})
