/// <reference types="vitest/config" />
import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import Components from 'unplugin-vue-components/vite';
import { ElementPlusResolver } from 'unplugin-vue-components/resolvers';

const serverPort = Number(process.env.PORT ?? 3000);

export default defineConfig({
  plugins: [vue(), Components({ resolvers: [ElementPlusResolver()], dts: false })],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  server: {
    proxy: { '/api': `http://localhost:${serverPort}` },
  },
  build: {
    outDir: 'dist',
    chunkSizeWarningLimit: 1200,
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          // Password hashing at 1 MiB instead of 64 MiB: the tests sign in hundreds of times.
          env: { ARGON2_MEMORY_KIB: '1024' },
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          include: ['tests/client/**/*.test.ts'],
          environment: 'happy-dom',
          // A busy two-core machine can take seconds to mount a view with a large table.
          testTimeout: 20000,
          // Element Plus must go through Vite: Node cannot import the CSS its resolver adds.
          server: { deps: { inline: ['element-plus'] } },
          // ...and bundled once into one module, not evaluated file by file for every test file.
          deps: { optimizer: { client: { enabled: true, include: ['element-plus', 'element-plus/es'] } } },
        },
      },
    ],
  },
});
