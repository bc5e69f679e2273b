// ESLint flat config: typescript-eslint's recommended rules (not type-aware, to stay fast)
// and import boundaries: core/ is pure TypeScript, the renderer never touches Node or Electron.
import { defineConfig, globalIgnores } from 'eslint/config';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

const NODE_BUILTINS = ['fs', 'fs/promises', 'path', 'child_process', 'os', 'worker_threads'];

const CORE_MESSAGE =
  'core/ is pure TypeScript: no React, three.js, Electron or Node I/O (only core/cli may use Node).';
const RENDERER_MESSAGE = 'The renderer reaches Electron and Node only through window.tiltbench (electron/preload.ts).';

export default defineConfig(
  globalIgnores(['dist/', 'dist-electron/', 'release/', 'node_modules/', 'assets/', 'coverage/', 'test-artifacts/']),
  {
    files: ['**/*.{ts,tsx,mts,cts,js,mjs,cjs}'],
    extends: [tseslint.configs.recommended],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['core/**/*.{ts,tsx}'],
    ignores: ['core/cli/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: ['react', 'react-dom', 'three', 'electron', ...NODE_BUILTINS].map((name) => ({
            name,
            message: CORE_MESSAGE,
          })),
          patterns: [
            {
              group: ['react/*', 'react-dom/*', 'three/*', '@react-three/*', 'electron/*', 'node:*', 'fs/*', 'path/*'],
              message: CORE_MESSAGE,
            },
          ],
        },
      ],
    },
  },
  {
    files: ['renderer/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: ['electron', ...NODE_BUILTINS].map((name) => ({ name, message: RENDERER_MESSAGE })),
          patterns: [{ group: ['electron/*', 'node:*'], message: RENDERER_MESSAGE }],
        },
      ],
    },
  },
  // React's rules of hooks (and the compiler-backed checks of its recommended set) on the
  // renderer's components and hooks.
  {
    files: ['renderer/**/*.{ts,tsx}'],
    extends: [reactHooks.configs.flat.recommended],
  },
);
