/// <reference types="vitest/config" />
import { randomBytes } from 'node:crypto';
import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import Components from 'unplugin-vue-components/vite';
import { ElementPlusResolver } from 'unplugin-vue-components/resolvers';

const serverPort = Number(process.env.PORT ?? 3000);

/*
 * The server suite runs a second time on PostgreSQL when TEST_DATABASE_URL names a server the tests
 * may create and drop databases on (`.ci/run` starts a throw-away one). Without it that run is
 * skipped, and said so loudly, so a green run on a laptop is not mistaken for both engines.
 */
const postgresTestServer = process.env.TEST_DATABASE_URL;
if (process.env.VITEST && !postgresTestServer && !process.env.CARDLOOP_POSTGRES_SKIP_TOLD) {
  process.env.CARDLOOP_POSTGRES_SKIP_TOLD = '1';
  console.warn(
    [
      '',
      '!!! The server tests on PostgreSQL are SKIPPED: TEST_DATABASE_URL is not set.',
      '!!! Set it to a PostgreSQL 15 server the tests may create databases on, e.g.',
      '!!!   TEST_DATABASE_URL=postgres://postgres@127.0.0.1:5432/postgres npm run test:unit',
      '!!! (.ci/run starts a throw-away cluster and always runs them.)',
      '',
    ].join('\n'),
  );
}
// Names this run's throw-away PostgreSQL databases, so that the run drops them when it ends.
if (postgresTestServer) process.env.SCRATCH_RUN_ID ??= randomBytes(4).toString('hex');
const serverTest = {
  include: ['tests/server/**/*.test.ts'],
  environment: 'node' as const,
  // Password hashing at 1 MiB instead of 64 MiB: the tests sign in hundreds of times.
  env: { ARGON2_MEMORY_KIB: '1024' },
  testTimeout: 20000,
  hookTimeout: 30000,
};

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
      { extends: true, test: { name: 'server', ...serverTest } },
      ...(postgresTestServer
        ? [
            {
              extends: true as const,
              test: {
                name: 'server-postgres',
                ...serverTest,
                // Every throw-away database (`openDatabase(':memory:')`) is made on this server.
                env: { ...serverTest.env, SCRATCH_DATABASE_URL: postgresTestServer },
                globalSetup: ['tests/server/postgres-run.ts'],
              },
            },
          ]
        : []),
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
