#!/usr/bin/env node
// Bundles the Electron main process and preload to dist-electron/{main,preload}.cjs with esbuild.
// Usage: node scripts/build-electron.mjs [--watch]
import { build, context } from 'esbuild';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** @type {import('esbuild').BuildOptions} */
const common = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  external: ['electron'],
  sourcemap: true,
  logLevel: 'warning',
  absWorkingDir: root,
};

const entries = [
  { entryPoints: ['electron/main.ts'], outfile: 'dist-electron/main.cjs' },
  // The sandboxed preload may only require('electron'): everything else is bundled in.
  { entryPoints: ['electron/preload.ts'], outfile: 'dist-electron/preload.cjs' },
];

export async function buildElectron({ watch = false } = {}) {
  if (watch) {
    for (const entry of entries) await (await context({ ...common, ...entry })).watch();
    console.log('build-electron: watching electron/');
    return;
  }
  await Promise.all(entries.map((entry) => build({ ...common, ...entry })));
  console.log(`build-electron: wrote ${entries.map((e) => e.outfile).join(', ')}`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  buildElectron({ watch: process.argv.includes('--watch') }).catch((error) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
}
