import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import vuetify from 'vite-plugin-vuetify'
import { ClosingLine } from './tests/closing-line'

export default defineConfig({
  plugins: [vue(), vuetify({ autoImport: true })],
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@solver': fileURLToPath(new URL('./solver', import.meta.url)),
      '@': fileURLToPath(new URL('./src', import.meta.url)),
    },
  },
  test: {
    include: ['{server,solver,shared,tests,src}/**/*.test.ts', 'src/**/*.spec.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    reporters: ['default', new ClosingLine()],
    // A throwaway migrated database for the run (tests/setup/global-db.ts).
    globalSetup: ['tests/setup/global-db.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    server: { deps: { inline: ['vuetify'] } },
  },
})
