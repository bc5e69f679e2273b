// Test projects. `npx vitest run` runs them all; `npx vitest run --project core` runs one.
// Independent of vite.config.ts (whose root is renderer/).
import { defineConfig } from 'vitest/config';

const BENCH = ['test/bench/**', '**/node_modules/**', '**/dist/**', '**/dist-electron/**'];

export default defineConfig({
  test: {
    reporters: ['default'],
    exclude: BENCH,
    projects: [
      {
        extends: true,
        test: {
          name: 'core',
          environment: 'node',
          include: ['test/core/**/*.test.ts', 'test/cli/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'renderer',
          environment: 'jsdom',
          include: ['test/renderer/**/*.test.ts', 'test/renderer/**/*.test.tsx'],
        },
      },
      {
        extends: true,
        test: {
          name: 'electron',
          environment: 'node',
          include: ['test/electron/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['test/e2e/**/*.test.ts'],
          // Builds the renderer once into test-artifacts/ and serves it on 127.0.0.1.
          globalSetup: ['test/e2e/support/globalSetup.ts'],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // expect.poll gives up after 1 s by default; under the full suite's load a click that
          // re-solves a pose in the worker can take longer to reach the page's state.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
