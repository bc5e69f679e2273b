/**
 * Running `tiltbench` in tests: in process through main() with a captured io, or as the
 * installed command in a child process with a time limit (for what could hang or must be
 * killed by a signal).
 */
import { spawn, spawnSync, type SpawnSyncOptions } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../core/cli/main';
import { safeIo, type CliIo } from '../../core/cli/io';
import type { DesignFile } from '../../core/design/types';

export const ROOT = join(__dirname, '..', '..');
export const BIN = join(ROOT, 'bin', 'tiltbench.mjs');
export const DESIGNS = join(ROOT, 'assets', 'designs');
export const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');
export const SWIFT = join(DESIGNS, 'swift-parallelogram-trike.tiltsheet');
export const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');

export interface RunResult {
  code: number | null;
  out: string;
  err: string;
  ms: number;
}

/** main() in this process, stdout and stderr captured. */
export async function run(argv: string[], isTty = false): Promise<RunResult> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => void (out += t), err: (t) => void (err += t), isTty };
  const t0 = performance.now();
  const code = await main(argv, io);
  return { code, out, err, ms: performance.now() - t0 };
}

/**
 * A command not (yet) in main's list, run as main runs its commands (through safeIo); main's
 * catch is not there, so an exception fails the test.
 */
export async function runCommand(command: (argv: string[], io: CliIo) => Promise<number>, argv: string[]): Promise<RunResult> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => void (out += t), err: (t) => void (err += t), isTty: false };
  const t0 = performance.now();
  const code = await command(argv, safeIo(io));
  return { code, out, err, ms: performance.now() - t0 };
}

/** The installed command in a child process, killed after `timeoutMs` (then code is null). */
export function spawnCli(args: string[], timeoutMs = 20_000, options: SpawnSyncOptions = {}): RunResult & { signal: NodeJS.Signals | null } {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: timeoutMs, killSignal: 'SIGKILL', ...options });
  return { code: r.status, out: String(r.stdout ?? ''), err: String(r.stderr ?? ''), ms: performance.now() - t0, signal: r.signal };
}

/** Start the installed command without waiting; resolves with its end. */
export function startCli(args: string[]): { child: ReturnType<typeof spawn>; done: Promise<{ code: number | null; signal: NodeJS.Signals | null; err: string }> } {
  const child = spawn(process.execPath, [BIN, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
  let err = '';
  child.stderr!.on('data', (d) => (err += String(d)));
  const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null; err: string }>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal, err })));
  return { child, done };
}

export const tempDir = (prefix = 'tb-cli-'): string => mkdtempSync(join(tmpdir(), prefix));

export const readDesign = (path: string): DesignFile => JSON.parse(readFileSync(path, 'utf8')) as DesignFile;

/** A demo changed by `edit`, written to `dir/name`; returns the path. */
export function writeDesign(dir: string, name: string, from: string, edit: (d: DesignFile) => void = () => {}): string {
  const d = readDesign(from);
  edit(d);
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(d, null, 2));
  return path;
}

/** Characters a terminal acts on: C0 but newline, DEL, C1, bidi overrides and isolates. */
export const RAW_CONTROL = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;
