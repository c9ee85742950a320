import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import Components from 'unplugin-vue-components/vite'
import { PrimeVueResolver } from '@primevue/auto-import-resolver'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
}

export default defineConfig({
  plugins: [vue(), Components({ dts: 'src/components.d.ts', dirs: [], resolvers: [PrimeVueResolver()] })],
  resolve: { alias },
  // the API beside `npm run dev` listens on PORT, like the server itself
  server: { proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 5180}` } },
  build: {
    outDir: 'dist',
    chunkSizeWarningLimit: 800,
    // the studio app, and the public episode page as an entry of its own (no PrimeVue, router or stores in it)
    rolldownOptions: { input: { main: fileURLToPath(new URL('./index.html', import.meta.url)), episode: fileURLToPath(new URL('./episode.html', import.meta.url)) } },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        // API tests share one PostgreSQL database, so files run one after another
        test: { name: 'server', include: ['tests/server/**/*.test.ts'], environment: 'node', execArgv: ['--import', 'tsx'], fileParallelism: false, testTimeout: 20_000, hookTimeout: 60_000 },
      },
      {
        extends: true,
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'happy-dom' },
      },
      {
        extends: true,
        test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], environment: 'node', execArgv: ['--import', 'tsx'], fileParallelism: false, testTimeout: 90_000, hookTimeout: 120_000 },
      },
    ],
  },
})
