import { fileURLToPath, URL } from 'node:url'
import { brotliCompressSync, gzipSync, constants as zlib } from 'node:zlib'
import { readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { defineConfig, type Plugin } from 'vite'
import vue from '@vitejs/plugin-vue'
import vuetify, { transformAssetUrls } from 'vite-plugin-vuetify'
import { trimCss, usedWords } from './scripts/css-trim.mjs'

/**
 * Precompressed copies of every text file of the build (name.br at brotli quality 11, name.gz at
 * gzip level 9), served by server/middleware/static-client.ts with the matching Content-Encoding.
 */
function precompress(): Plugin {
  return {
    name: 'scrubwright-precompress',
    apply: 'build',
    // after the files are written: the code is final then (module preload markers replaced)
    writeBundle(options, bundle) {
      const dir = options.dir ?? 'dist'
      for (const fileName of Object.keys(bundle)) {
        if (!/\.(js|css|html|svg|json|txt)$/.test(fileName)) continue
        const data = readFileSync(join(dir, fileName))
        if (data.length < 1024) continue
        writeFileSync(join(dir, fileName + '.br'), brotliCompressSync(data, { params: { [zlib.BROTLI_PARAM_QUALITY]: 11, [zlib.BROTLI_PARAM_SIZE_HINT]: data.length } }))
        writeFileSync(join(dir, fileName + '.gz'), gzipSync(data, { level: 9 }))
      }
    },
  }
}

/**
 * Vuetify's stylesheet without the utility and colour classes the client never uses (about 30 kB
 * gzip of the first load); see scripts/css-trim.mjs for what is kept. Build only.
 */
function trimVuetifyStyles(): Plugin {
  let used: ReturnType<typeof usedWords> | null = null
  return {
    name: 'scrubwright-trim-vuetify-styles',
    apply: 'build',
    enforce: 'pre',
    transform(code, id) {
      if (!/[\\/]vuetify[\\/]lib[\\/]styles[\\/]main\.css$/.test(id.split('?')[0]!)) return null
      used ??= usedWords(fileURLToPath(new URL('.', import.meta.url)))
      return { code: trimCss(code, used), map: null }
    },
  }
}

const apiPort = process.env.PORT ?? '8640'

export default defineConfig({
  plugins: [vue({ template: { transformAssetUrls } }), vuetify({ autoImport: true }), trimVuetifyStyles(), precompress()],
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
