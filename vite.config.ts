// Renderer build: renderer/index.html -> dist/renderer, relative asset URLs so Electron can
// load it from file://. Tests use vitest.config.ts, not this file.
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig, type Plugin } from 'vite';

const root = fileURLToPath(new URL('./renderer/', import.meta.url));
const outDir = fileURLToPath(new URL('./dist/renderer/', import.meta.url));

/**
 * The dev server injects inline scripts (React refresh preamble) and a websocket that the
 * strict CSP meta tag would block; drop the tag when serving. Builds keep it.
 */
function devServerWithoutCsp(): Plugin {
  return {
    name: 'tiltbench:dev-without-csp',
    apply: 'serve',
    transformIndexHtml: (html) => html.replace(/<meta\s+http-equiv="Content-Security-Policy"[^>]*>/i, ''),
  };
}

export default defineConfig({
  root,
  base: './',
  plugins: [react(), devServerWithoutCsp()],
  build: {
    outDir,
    emptyOutDir: true,
    target: 'chrome120',
    sourcemap: true,
    chunkSizeWarningLimit: 2048,
  },
  server: { host: '127.0.0.1', port: 5273 },
  preview: { host: '127.0.0.1', port: 5273 },
});
