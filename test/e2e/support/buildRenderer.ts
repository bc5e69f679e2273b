/** Builds the renderer once into test-artifacts/ (never touching dist/), for e2e tests and the benchmark. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
export const BUILD_DIR = path.join(ROOT, 'test-artifacts', 'renderer-build');
export const DESIGNS_DIR = path.join(ROOT, 'assets', 'designs');
export const ARTIFACTS_DIR = path.join(ROOT, 'test-artifacts');

export async function buildRenderer(outDir = BUILD_DIR): Promise<string> {
  const { build } = await import('vite');
  await build({
    configFile: path.join(ROOT, 'vite.config.ts'),
    logLevel: 'warn',
    build: { outDir, emptyOutDir: true, sourcemap: false },
  });
  return outDir;
}
