// Global set-up of the end-to-end project: build the renderer once (vite) into test-artifacts/,
// serve it on 127.0.0.1 and a free port, and hand the address to the tests.
import type { TestProject } from 'vitest/node';
import { buildRenderer, DESIGNS_DIR } from './buildRenderer';
import { serveStatic } from './staticServer';

declare module 'vitest' {
  export interface ProvidedContext {
    tiltbenchUrl: string;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const dir = await buildRenderer();
  const server = await serveStatic(dir, DESIGNS_DIR);
  project.provide('tiltbenchUrl', server.url);
  return () => server.close();
}
