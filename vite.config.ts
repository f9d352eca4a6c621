import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'
import vuetify, { transformAssetUrls } from 'vite-plugin-vuetify'

const apiPort = process.env.PORT ?? '8640'

export default defineConfig({
  plugins: [vue({ template: { transformAssetUrls } }), vuetify({ autoImport: true })],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  optimizeDeps: { include: ['vuetify/components/**', 'vuetify/directives/**'] },
  server: { proxy: { '/api': `http://127.0.0.1:${apiPort}` } },
  build: { chunkSizeWarningLimit: 1500 },
})
