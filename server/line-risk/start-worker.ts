import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker, type WorkerOptions } from 'node:worker_threads';

/**
 * Starts a worker thread on `file`. Run from TypeScript sources (tsx, vitest), a worker does not
 * inherit the TypeScript loader: a small bootstrap registers tsx's ESM hooks in the worker, then
 * loads the worker file.
 */
export function startWorker(file: URL, options: WorkerOptions = {}): Worker {
  if (!file.pathname.endsWith('.ts')) return new Worker(file, options);
  // The ESM entry of tsx's API (require.resolve finds its CommonJS twin beside it).
  const tsxApi = pathToFileURL(
    createRequire(import.meta.url)
      .resolve('tsx/esm/api')
      .replace(/\.cjs$/, '.mjs'),
  );
  const bootstrap = `import(${JSON.stringify(tsxApi.href)}).then(({ register }) => { register(); return import(${JSON.stringify(file.href)}); });`;
  return new Worker(bootstrap, { ...options, eval: true });
}
