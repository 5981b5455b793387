import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const SOURCES = ['src', 'shared', 'index.html', 'vite.config.ts'];

function newestModification(path: string): number {
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  let newest = stats.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestModification(join(path, entry)));
  return newest;
}

/** Builds the client with Vite when `dist/` is missing or older than its sources. */
export async function ensureClientBuilt(root: string): Promise<string> {
  const clientDir = join(root, 'dist');
  const builtIndex = join(clientDir, 'index.html');
  const sourcesChanged =
    existsSync(builtIndex) &&
    SOURCES.some(
      (source) =>
        existsSync(join(root, source)) && newestModification(join(root, source)) > statSync(builtIndex).mtimeMs,
    );
  if (!existsSync(builtIndex) || sourcesChanged) {
    console.log(existsSync(builtIndex) ? 'Client sources changed; rebuilding…' : 'Building the client (first start)…');
    const { build } = await import('vite');
    await build({ root, logLevel: 'warn' });
  }
  return clientDir;
}
