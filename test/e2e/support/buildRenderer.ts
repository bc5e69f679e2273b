/** Builds the renderer once into test-artifacts/ (never touching dist/), for e2e tests and the benchmark. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
export const BUILD_DIR = path.join(ROOT, 'test-artifacts', 'renderer-build');
export const DESIGNS_DIR = path.join(ROOT, 'assets', 'designs');
export const ARTIFACTS_DIR = path.join(ROOT, 'test-artifacts');

export async function buildRenderer(outDir = BUILD_DIR): Promise<string> {
  const { build } = await import('vite');
  // What users get, whoever builds: under vitest NODE_ENV is 'test', which made this React's
  // development build (StrictMode's double mount, slower renders, the dev JSX transform). Vite
  // and the React plugin read NODE_ENV, so it is 'production' for the build and put back after.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      configFile: path.join(ROOT, 'vite.config.ts'),
      logLevel: 'warn',
      mode: 'production',
      build: { outDir, emptyOutDir: true, sourcemap: false },
    });
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
  }
  return outDir;
}
