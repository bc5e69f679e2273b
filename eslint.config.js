// ESLint flat config: typescript-eslint's recommended rules (not type-aware, to stay fast)
// and import boundaries: core/ is pure TypeScript, the renderer never touches Node or Electron.
import { defineConfig, globalIgnores } from 'eslint/config';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

const NODE_BUILTINS = ['fs', 'fs/promises', 'path', 'child_process', 'os', 'worker_threads'];

const CORE_MESSAGE =
  'core/ is pure TypeScript: no React, three.js, Electron or Node I/O (only core/cli may use Node).';
const CORE_BANNED_PATHS = ['react', 'react-dom', 'three', 'electron', ...NODE_BUILTINS].map((name) => ({ name, message: CORE_MESSAGE }));
const CORE_BANNED_PATTERNS = [
  {
    group: ['react/*', 'react-dom/*', 'three/*', '@react-three/*', 'electron/*', 'node:*', 'fs/*', 'path/*'],
    message: CORE_MESSAGE,
  },
];

// core's folders, lowest first: a folder may import its own and lower ones, never a higher one
// (the design format knows nothing of mechanisms, the solver nothing of measures, ...).
const CORE_LAYERS = ['math', 'design', 'mechanism', 'solver', 'analysis', 'studies', 'report', 'cli'];

/** An import of a folder above layer k, by relative path (core's files import each other only that way). */
function higherLayers(k) {
  const above = CORE_LAYERS.slice(k + 1);
  if (above.length === 0) return [];
  return [
    {
      regex: `^(\\.\\.?/)+(${above.join('|')})(/|$)`,
      message: `core's layers are ${CORE_LAYERS.join(' < ')}: core/${CORE_LAYERS[k]} may not import from ${above.map((l) => `core/${l}`).join(', ')}.`,
    },
  ];
}

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
  // One block per layer of core: the purity bans plus the layer order (a block replaces, not
  // merges, an earlier setting of the same rule, so each carries both).
  ...CORE_LAYERS.map((layer, k) => ({
    files: [`core/${layer}/**/*.{ts,tsx}`],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: layer === 'cli' ? [] : CORE_BANNED_PATHS,
          patterns: [...(layer === 'cli' ? [] : CORE_BANNED_PATTERNS), ...higherLayers(k)],
        },
      ],
    },
  })),
  {
    // A file directly in core/ (none today) belongs to no layer; it still keeps core pure.
    files: ['core/*.{ts,tsx}'],
    rules: { 'no-restricted-imports': ['error', { paths: CORE_BANNED_PATHS, patterns: CORE_BANNED_PATTERNS }] },
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
