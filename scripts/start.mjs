#!/usr/bin/env node
// `npm start`: builds the renderer and the Electron bundle, then runs the desktop app on a
// demo design when the Electron binary is installed. Without it, serves dist/renderer on
// 127.0.0.1 and opens it in Chromium when a display is available.
//
// Usage: node scripts/start.mjs [--design FILE] [--port N] [--open | --no-open]
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import http from 'node:http';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildElectron } from './build-electron.mjs';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const RENDERER_DIR = path.join(ROOT, 'dist', 'renderer');
const DESIGNS_DIR = path.join(ROOT, 'assets', 'designs');
const CHROMIUM = '/usr/bin/chromium';
const DEFAULT_PORT = 5273;

function parseArgs(argv) {
  const options = { design: null, port: DEFAULT_PORT, open: null };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const value = () => {
      if (i + 1 >= argv.length) fail(`${arg} needs a value`);
      return argv[++i];
    };
    if (arg === '--design') options.design = path.resolve(value());
    else if (arg === '--port') {
      options.port = Number(value());
      if (!Number.isInteger(options.port) || options.port < 0 || options.port > 65535) fail('--port must be 0-65535');
    } else if (arg === '--open') options.open = true;
    else if (arg === '--no-open') options.open = false;
    else if (arg === '--help' || arg === '-h') {
      console.log('Usage: node scripts/start.mjs [--design FILE] [--port N] [--open | --no-open]');
      process.exit(0);
    } else fail(`unknown argument: ${arg}`);
  }
  return options;
}

function fail(message) {
  console.error(`start: ${message}`);
  process.exit(2);
}

/** The Electron binary's path, or null when only the npm package (or nothing) is installed. */
function electronBinary() {
  try {
    const binary = createRequire(import.meta.url)('electron');
    return typeof binary === 'string' && existsSync(binary) ? binary : null;
  } catch {
    return null;
  }
}

function firstDemoDesign() {
  try {
    const files = readdirSync(DESIGNS_DIR).filter((f) => f.toLowerCase().endsWith('.tiltsheet')).sort();
    return files.length > 0 ? path.join(DESIGNS_DIR, files[0]) : null;
  } catch {
    return null;
  }
}

async function buildAll() {
  const { build } = await import('vite');
  console.log('start: building renderer (vite) ...');
  await build({ configFile: path.join(ROOT, 'vite.config.ts'), logLevel: 'warn' });
  console.log('start: building electron bundle (esbuild) ...');
  await buildElectron();
}

function runElectron(binary, design) {
  const args = [ROOT];
  // Chromium refuses to start as root with its OS sandbox on; the webPreferences sandbox stays on.
  if (typeof process.getuid === 'function' && process.getuid() === 0) {
    console.warn('start: running as root, passing --no-sandbox to Electron');
    args.push('--no-sandbox');
  }
  if (design) args.push('--design', design);
  console.log(`start: launching Electron${design ? ` on ${path.relative(ROOT, design)}` : ''}`);
  const child = spawn(binary, args, { cwd: ROOT, stdio: 'inherit' });
  const forward = (signal) => child.kill(signal);
  process.on('SIGINT', forward);
  process.on('SIGTERM', forward);
  child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
}

const CONTENT_TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.woff2': 'font/woff2',
  '.wasm': 'application/wasm',
  '.tiltsheet': 'application/json; charset=utf-8',
};

/**
 * Serves files under `dir`, and the demo designs under /designs/ (GET/HEAD only, no
 * directory listing, no path escape).
 */
function createStaticServer(dir) {
  return http.createServer(async (req, res) => {
    const send = (status, body) => {
      res.writeHead(status, { 'Content-Type': 'text/plain; charset=utf-8' });
      res.end(body);
    };
    if (req.method !== 'GET' && req.method !== 'HEAD') return send(405, 'method not allowed');
    let pathname;
    try {
      pathname = decodeURIComponent(new URL(req.url ?? '/', 'http://localhost').pathname);
    } catch {
      return send(400, 'bad request');
    }
    if (pathname.includes('\0')) return send(400, 'bad request');
    if (pathname.endsWith('/')) pathname += 'index.html';
    const base = pathname.startsWith('/designs/') ? DESIGNS_DIR : dir;
    const file = path.resolve(base, `.${base === dir ? pathname : pathname.slice('/designs'.length)}`);
    if (!file.startsWith(base + path.sep)) return send(403, 'forbidden');
    try {
      if (!(await stat(file)).isFile()) return send(404, 'not found');
      const body = await readFile(file);
      res.writeHead(200, {
        'Content-Type': CONTENT_TYPES[path.extname(file).toLowerCase()] ?? 'application/octet-stream',
        'Content-Length': body.length,
        'Cache-Control': 'no-cache',
        'X-Content-Type-Options': 'nosniff',
      });
      res.end(req.method === 'HEAD' ? undefined : body);
    } catch {
      send(404, 'not found');
    }
  });
}

/** Listens on 127.0.0.1, on `port` or the next free one (any free port after 20 tries). */
async function listen(server, port) {
  for (let attempt = 0; attempt <= 20; attempt++) {
    const candidate = attempt === 20 || port === 0 ? 0 : port + attempt;
    try {
      await new Promise((resolve, reject) => {
        server.once('error', reject);
        server.listen(candidate, '127.0.0.1', () => {
          server.off('error', reject);
          resolve();
        });
      });
      return server.address().port;
    } catch (error) {
      if (error.code !== 'EADDRINUSE' || candidate === 0) throw error;
    }
  }
  throw new Error('no free port');
}

/** Opens `url` in Chromium with a throwaway profile; never fails the script. */
function openInChromium(url) {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'tiltbench-chromium-'));
  const args = [
    `--user-data-dir=${profile}`,
    '--no-first-run',
    '--no-default-browser-check',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    `--app=${url}`,
  ];
  if (typeof process.getuid === 'function' && process.getuid() === 0) args.unshift('--no-sandbox');
  try {
    const child = spawn(CHROMIUM, args, { stdio: 'ignore' });
    child.on('error', (error) => console.warn(`start: could not open Chromium (${error.message}); open ${url} yourself`));
    child.on('exit', (code) => {
      if (code) console.warn(`start: Chromium exited with code ${code}; open ${url} yourself`);
      rmSync(profile, { recursive: true, force: true });
    });
    return child;
  } catch (error) {
    console.warn(`start: could not open Chromium (${error.message}); open ${url} yourself`);
    return null;
  }
}

async function serveInBrowser(options) {
  const server = createStaticServer(RENDERER_DIR);
  const port = await listen(server, options.port);
  const design = options.design ?? firstDemoDesign();
  // The browser build cannot read files itself: the demo design is served under /designs/
  // and named in the query (?design=designs/NAME.tiltsheet) for the renderer to fetch.
  const inDemoDir = design && path.dirname(design) === DESIGNS_DIR;
  if (design && !inDemoDir) console.warn('start: --design outside assets/designs is only opened by Electron');
  const query = inDemoDir ? `?design=${encodeURIComponent(`designs/${path.basename(design)}`)}` : '';
  const url = `http://127.0.0.1:${port}/${query}`;
  console.log('start: Electron binary not installed; serving the renderer in a browser instead');
  console.log(`start: Tiltbench at ${url}  (Ctrl-C to stop)`);

  const wantOpen = options.open ?? Boolean(process.env.DISPLAY || process.env.WAYLAND_DISPLAY);
  let browser = null;
  if (wantOpen && existsSync(CHROMIUM)) browser = openInChromium(url);
  else if (wantOpen) console.log(`start: ${CHROMIUM} not found; open the URL yourself`);

  let stopping = false;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    console.log('\nstart: stopping');
    if (browser && browser.exitCode === null) browser.kill('SIGTERM');
    server.close(() => process.exit(0));
    server.closeAllConnections();
    setTimeout(() => process.exit(0), 2000).unref();
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

async function main() {
  const options = parseArgs(process.argv.slice(2));
  if (options.design && !existsSync(options.design)) fail(`no such design: ${options.design}`);
  await buildAll();
  const binary = electronBinary();
  if (binary) {
    const design = options.design ?? firstDemoDesign();
    if (!design) console.warn(`start: no .tiltsheet in ${path.relative(ROOT, DESIGNS_DIR)}; starting empty`);
    runElectron(binary, design);
  } else {
    await serveInBrowser(options);
  }
}

main().catch((error) => {
  console.error(`start: ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
