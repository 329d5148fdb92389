import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import { ClosingLine } from './tests/closing-line'

// Browser tests: a separate config, because merging with vitest.config.ts would concatenate the include
// lists and run the unit suite again (docs/stack.md §8).
export default defineConfig({
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@solver': fileURLToPath(new URL('./solver', import.meta.url)),
    },
  },
  test: {
    include: ['tests/e2e/**/*.test.ts'],
    reporters: ['default', new ClosingLine()],
    // One server, one browser, one worker thread: files run one after another.
    fileParallelism: false,
    globalSetup: ['tests/e2e/global-setup.ts'],
    testTimeout: 90_000,
    hookTimeout: 180_000,
  },
})
