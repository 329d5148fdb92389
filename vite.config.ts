import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'
import vuetify from 'vite-plugin-vuetify'

const apiPort = Number(process.env.PORT ?? 3001)

export default defineConfig({
  plugins: [vue(), vuetify({ autoImport: true })],
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@': fileURLToPath(new URL('./src', import.meta.url)),
    },
  },
  server: {
    // Plain proxying streams server-sent events event by event; ws for any socket route. xfwd sends the address
    // the browser used (X-Forwarded-Host/-Proto; the API trusts them from loopback), so the same-origin write
    // check also passes when the dev server is opened by a LAN address.
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: true, ws: true, xfwd: true } },
  },
  build: { outDir: 'dist', chunkSizeWarningLimit: 1200 },
})
