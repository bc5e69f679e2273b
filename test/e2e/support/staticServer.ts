/** A tiny static file server on 127.0.0.1 and a free port, for the built renderer. */
import { readFile, stat } from 'node:fs/promises';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.tiltsheet': 'application/json; charset=utf-8',
};

export interface StaticServer {
  url: string;
  close(): Promise<void>;
}

/** Serves `dir` at `/`, and optionally `designsDir` at `/designs/`. */
export async function serveStatic(dir: string, designsDir?: string): Promise<StaticServer> {
  const root = path.resolve(dir);
  const designs = designsDir ? path.resolve(designsDir) : null;
  const server = http.createServer(async (req, res) => {
    try {
      let pathname = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
      if (pathname.endsWith('/')) pathname += 'index.html';
      const base = designs && pathname.startsWith('/designs/') ? designs : root;
      const rel = base === root ? pathname : pathname.slice('/designs'.length);
      const file = path.resolve(base, `.${rel}`);
      if (!file.startsWith(base + path.sep) || !(await stat(file)).isFile()) throw new Error('not found');
      const body = await readFile(file);
      res.writeHead(200, { 'Content-Type': TYPES[path.extname(file)] ?? 'application/octet-stream', 'Cache-Control': 'no-store' });
      res.end(body);
    } catch {
      res.writeHead(404, { 'Content-Type': 'text/plain' });
      res.end('not found');
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
