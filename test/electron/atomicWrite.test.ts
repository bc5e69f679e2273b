// Crash-safe saving that cannot be redirected (electron/atomicWrite.ts), on the real file
// system in a temporary folder. The file-system calls go through a pass-through spy, so the
// tests see every open, flush and rename in order, can fail a flush, and can plant a link at
// the temporary name at the last moment before it is opened (a real attack, not a simulation:
// the link exists on disk and points at a victim file).
import { spawn, spawnSync } from 'node:child_process';
import { constants as fsConstants, existsSync, readdirSync } from 'node:fs';
import { chmod, lstat, mkdir, mkdtemp, readFile, readlink, realpath, rm, stat, symlink, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';

type FsEvent =
  | { call: 'open'; path: string; flags: unknown }
  | { call: 'flush'; path: string }
  | { call: 'rename'; from: string; to: string };

const spy = vi.hoisted(() => ({
  events: [] as FsEvent[],
  /** Runs just before each open, with its path (the attacker's moment). */
  beforeOpen: null as ((filePath: string) => Promise<void>) | null,
  /** Makes the flush of a matching path fail with EIO. */
  failFlush: null as ((filePath: string) => boolean) | null,
  /** Delay (ms) before the nth realpath call answers, e.g. [30] holds up the first one. */
  realpathDelays: [] as number[],
}));

vi.mock('node:fs/promises', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:fs/promises')>();
  const watched = <T extends object>(handle: T & { sync(): Promise<void>; datasync(): Promise<void> }, p: string): T => {
    for (const name of ['sync', 'datasync'] as const) {
      const original = handle[name].bind(handle);
      handle[name] = async () => {
        if (spy.failFlush?.(p)) throw Object.assign(new Error(`EIO: flush of ${p}`), { code: 'EIO' });
        await original();
        spy.events.push({ call: 'flush', path: p });
      };
    }
    return handle;
  };
  const open: typeof real.open = async (file, flags, mode) => {
    const p = String(file);
    if (spy.beforeOpen) await spy.beforeOpen(p);
    spy.events.push({ call: 'open', path: p, flags });
    return watched(await real.open(file, flags, mode), p);
  };
  const rename: typeof real.rename = async (from, to) => {
    await real.rename(from, to);
    spy.events.push({ call: 'rename', from: String(from), to: String(to) });
  };
  const realpath = (async (p: Parameters<typeof real.realpath>[0]) => {
    const delay = spy.realpathDelays.shift() ?? 0;
    if (delay > 0) await new Promise((resolve) => setTimeout(resolve, delay));
    return real.realpath(p);
  }) as typeof real.realpath;
  return { ...real, open, rename, realpath, default: { ...real, open, rename, realpath } };
});

const { atomicWrite, isTempName, SaveRefusedError, tempPathFor } = await import('../../electron/atomicWrite');

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
let dir = '';
let savedUmask = 0;

beforeAll(() => {
  // A umask that would change a kept mode, so the test sees the mode set on purpose.
  savedUmask = process.umask(0o022);
});
afterAll(() => {
  process.umask(savedUmask);
});
beforeEach(async () => {
  dir = await realpath(await mkdtemp(path.join(os.tmpdir(), 'tiltbench-aw-')));
  spy.events = [];
  spy.beforeOpen = null;
  spy.failFlush = null;
  spy.realpathDelays = [];
});
afterEach(async () => {
  spy.beforeOpen = null;
  spy.failFlush = null;
  spy.realpathDelays = [];
  await rm(dir, { recursive: true, force: true });
});

const tempsIn = (folder: string): string[] => readdirSync(folder).filter(isTempName);
const opensCreating = (): Extract<FsEvent, { call: 'open' }>[] =>
  spy.events.filter((e): e is Extract<FsEvent, { call: 'open' }> => e.call === 'open' && createsFile(e.flags));

function createsFile(flags: unknown): boolean {
  if (typeof flags === 'string') return /^[wa]/.test(flags);
  return typeof flags === 'number' && (flags & fsConstants.O_CREAT) !== 0;
}

describe('atomicWrite: order and durability', () => {
  it('flushes the temp file before the rename and the folder after it, all in the target folder', async () => {
    const target = path.join(dir, 'trike.tiltsheet');
    await writeFile(target, 'old');
    await atomicWrite(target, 'new');
    expect(await readFile(target, 'utf8')).toBe('new');

    const created = opensCreating();
    expect(created).toHaveLength(1);
    const temp = created[0].path;
    // Same folder as the target: the rename stays within one filesystem and one folder's fsync covers it.
    expect(path.dirname(temp)).toBe(dir);
    expect(isTempName(path.basename(temp))).toBe(true);

    const at = (match: (e: FsEvent) => boolean): number => spy.events.findIndex(match);
    const tempFlush = at((e) => e.call === 'flush' && e.path === temp);
    const renamed = at((e) => e.call === 'rename' && e.from === temp && e.to === target);
    const folderFlush = spy.events.findIndex((e, i) => i > renamed && e.call === 'flush' && e.path === dir);
    expect(tempFlush, JSON.stringify(spy.events)).toBeGreaterThanOrEqual(0);
    expect(renamed).toBeGreaterThan(tempFlush);
    expect(folderFlush, JSON.stringify(spy.events)).toBeGreaterThan(renamed);
    expect(tempsIn(dir)).toEqual([]);
  });

  it('opens the temp file exclusively, never through a link', async () => {
    await atomicWrite(path.join(dir, 'a.tiltsheet'), 'x');
    const { flags } = opensCreating()[0];
    if (typeof flags === 'string') {
      expect(flags).toMatch(/x/); // 'wx': fails on any existing name, links included
    } else {
      expect(typeof flags).toBe('number');
      const bits = flags as number;
      expect(bits & fsConstants.O_EXCL).toBe(fsConstants.O_EXCL);
      if (fsConstants.O_NOFOLLOW !== undefined) expect(bits & fsConstants.O_NOFOLLOW).toBe(fsConstants.O_NOFOLLOW);
    }
  });

  it('a failed flush leaves the old file and no temp file, and says so', async () => {
    const target = path.join(dir, 'a.tiltsheet');
    await writeFile(target, 'old');
    spy.failFlush = (p) => isTempName(path.basename(p));
    await expect(atomicWrite(target, 'new')).rejects.toThrow(/EIO/);
    expect(await readFile(target, 'utf8')).toBe('old');
    expect(tempsIn(dir)).toEqual([]);
  });

  it('a failed folder flush is reported, not swallowed', async () => {
    const target = path.join(dir, 'a.tiltsheet');
    spy.failFlush = (p) => p === dir;
    await expect(atomicWrite(target, 'new')).rejects.toThrow(/EIO/);
  });

  it('keeps temp names within 255 bytes for the longest file names', async () => {
    const longName = `${'é'.repeat(120)}.tiltsheet`; // 250 bytes
    expect(Buffer.byteLength(longName)).toBeLessThanOrEqual(255);
    expect(Buffer.byteLength(path.basename(tempPathFor(path.join(dir, longName), 'ab'.repeat(8))))).toBeLessThanOrEqual(255);
    await atomicWrite(path.join(dir, longName), 'x');
    expect(await readFile(path.join(dir, longName), 'utf8')).toBe('x');
  });
});

describe('atomicWrite: a save that cannot be redirected', () => {
  it('a link planted at the temp name just before the open leaves its victim untouched', async () => {
    const target = path.join(dir, 'design.tiltsheet');
    const victim = path.join(dir, 'victim.txt');
    await writeFile(target, 'old design');
    await writeFile(victim, 'precious');
    const planted: string[] = [];
    spy.beforeOpen = async (p) => {
      if (planted.length === 0 && path.dirname(p) === dir && path.basename(p) !== 'design.tiltsheet') {
        await symlink(victim, p);
        planted.push(p);
      }
    };
    await atomicWrite(target, 'new design');
    expect(planted).toHaveLength(1); // the attack really happened, at the name the writer chose
    expect(await readFile(victim, 'utf8')).toBe('precious');
    expect((await lstat(target)).isSymbolicLink()).toBe(false);
    expect(await readFile(target, 'utf8')).toBe('new design');
    expect((await lstat(planted[0])).isSymbolicLink()).toBe(true); // left alone, not written through
  });

  it('through a symlinked design, writes the file the link points to and keeps the link', async () => {
    const realDir = path.join(dir, 'real');
    const linkDir = path.join(dir, 'links');
    await mkdir(realDir);
    await mkdir(linkDir);
    const realFile = path.join(realDir, 'trike.tiltsheet');
    const link = path.join(linkDir, 'trike.tiltsheet');
    await writeFile(realFile, 'old');
    await symlink(realFile, link);
    await atomicWrite(link, 'new');
    expect((await lstat(link)).isSymbolicLink()).toBe(true);
    expect(await readlink(link)).toBe(realFile);
    expect(await readFile(realFile, 'utf8')).toBe('new');
    // The temp file lives beside the real file, whose folder the rename changes.
    expect(path.dirname(opensCreating()[0].path)).toBe(realDir);
    expect(tempsIn(linkDir)).toEqual([]);
  });

  it('refuses a link to a missing file and creates nothing', async () => {
    const link = path.join(dir, 'gone.tiltsheet');
    await symlink(path.join(dir, 'elsewhere.tiltsheet'), link);
    await expect(atomicWrite(link, 'x')).rejects.toThrow(SaveRefusedError);
    expect(existsSync(path.join(dir, 'elsewhere.tiltsheet'))).toBe(false);
    expect((await lstat(link)).isSymbolicLink()).toBe(true);
  });

  it('keeps the exact permissions of the file it replaces, whatever the umask', async () => {
    const target = path.join(dir, 'shared.tiltsheet');
    await writeFile(target, 'old');
    await chmod(target, 0o662); // group- and other-writable bits the umask 022 would drop
    await atomicWrite(target, 'new');
    expect((await stat(target)).mode & 0o777).toBe(0o662);
  });

  it('refuses a read-only design with a clear message and leaves it as it was', async () => {
    const target = path.join(dir, 'frozen.tiltsheet');
    await writeFile(target, 'keep me');
    await chmod(target, 0o444);
    const saving = atomicWrite(target, 'overwrite');
    await expect(saving).rejects.toThrow(SaveRefusedError);
    await expect(saving).rejects.toThrow(/frozen\.tiltsheet is read-only.*not overwritten.*Save as/);
    expect(await readFile(target, 'utf8')).toBe('keep me');
    expect((await stat(target)).mode & 0o777).toBe(0o444);
    expect(tempsIn(dir)).toEqual([]);
  });

  it('refuses a folder or a named pipe at the target without blocking', async () => {
    const folder = path.join(dir, 'folder.tiltsheet');
    await mkdir(folder);
    await expect(atomicWrite(folder, 'x')).rejects.toThrow(/not a regular file/);
    const fifo = path.join(dir, 'pipe.tiltsheet');
    if (spawnSync('mkfifo', [fifo]).status === 0) {
      await expect(atomicWrite(fifo, 'x')).rejects.toThrow(/not a regular file/);
      expect((await lstat(fifo)).isFIFO()).toBe(true);
    }
  });
});

describe('atomicWrite: whole or absent', () => {
  it('replaces a file, writes in the order asked and leaves no temp file', async () => {
    const target = path.join(dir, 'a.tiltsheet');
    await writeFile(target, 'old');
    // The first save's link resolution answers last: the saves must still land in order.
    spy.realpathDelays = [40];
    await Promise.all([atomicWrite(target, 'one'), atomicWrite(target, 'two')]);
    expect(await readFile(target, 'utf8')).toBe('two');
    expect(tempsIn(dir)).toEqual([]);
    await expect(atomicWrite(path.join(dir, 'missing', 'b.tiltsheet'), 'x')).rejects.toThrow();
  });

  /** Starts a node child that atomically writes `target` in a loop, printing "writing <i>" before each. */
  async function startWriter(target: string, payloadBytes: number, loops: number) {
    const child = path.join(dir, 'writer.mjs');
    await writeFile(
      child,
      `const { atomicWrite } = await import(${JSON.stringify(pathToFileURL(path.join(ROOT, 'electron/atomicWrite.ts')).href)});
const [target, bytes, loops] = [process.argv[2], Number(process.argv[3]), Number(process.argv[4])];
for (let i = 0; i < loops; i++) {
  const head = Buffer.from(JSON.stringify({ version: i + 1, bytes }).padEnd(64, ' ') + '\\n');
  const body = Buffer.alloc(bytes - head.length, 0x61 + (i % 26));
  process.stdout.write('writing ' + (i + 1) + '\\n');
  await atomicWrite(target, Buffer.concat([head, body]));
}
process.stdout.write('done\\n');
`,
    );
    const proc = spawn(process.execPath, ['--import', 'tsx', child, target, String(payloadBytes), String(loops)], {
      cwd: ROOT,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    proc.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
    proc.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    const exited = new Promise<NodeJS.Signals | number | null>((resolve) =>
      proc.on('exit', (code, signal) => resolve(signal ?? code)),
    );
    return { proc, exited, output: () => ({ stdout, stderr }) };
  }

  /** A file written by the child: its header names its size, its body is one repeated letter. */
  function expectWholeVersion(content: Buffer, payloadBytes: number): number {
    expect(content.length).toBe(payloadBytes);
    const header = JSON.parse(content.subarray(0, 64).toString()) as { version: number; bytes: number };
    const letter = 0x61 + ((header.version - 1) % 26);
    expect(content.subarray(65).every((b) => b === letter)).toBe(true);
    return header.version;
  }

  // A 64 MiB write and a child start-up take seconds on a busy machine: its own deadline, not the 5 s default.
  it('leaves the original whole when the writer is SIGKILLed mid-write', { timeout: 90_000 }, async () => {
    const target = path.join(dir, 'design.tiltsheet');
    const original = `{"format":1,"name":"original"}\n${'o'.repeat(100_000)}\n`;
    await writeFile(target, original);
    const payload = 64 * 1024 * 1024;
    const writer = await startWriter(target, payload, 1);

    // Kill as soon as a temp file exists, i.e. while the new content is being written.
    const deadline = Date.now() + 60_000;
    while (tempsIn(dir).length === 0 && writer.proc.exitCode === null && Date.now() < deadline) {
      await new Promise((resolve) => setImmediate(resolve));
    }
    writer.proc.kill('SIGKILL');
    expect(await writer.exited, JSON.stringify(writer.output())).toBe('SIGKILL');

    const after = await readFile(target);
    if (tempsIn(dir).length > 0) {
      expect(after.toString()).toBe(original); // killed before the rename: untouched
    } else {
      expectWholeVersion(after, payload); // the rename won the race: the new file is whole
    }
  });

  it('always leaves a whole version when killed at random moments of repeated saves', async () => {
    const target = path.join(dir, 'design.tiltsheet');
    const payload = 4 * 1024 * 1024;
    for (let round = 0; round < 4; round++) {
      const writer = await startWriter(target, payload, 1_000);
      const deadline = Date.now() + 30_000;
      while (!/writing 2\n/.test(writer.output().stdout) && Date.now() < deadline && writer.proc.exitCode === null) {
        await new Promise((resolve) => setTimeout(resolve, 5));
      }
      await new Promise((resolve) => setTimeout(resolve, 10 + Math.random() * 120));
      writer.proc.kill('SIGKILL');
      expect(await writer.exited, JSON.stringify(writer.output())).toBe('SIGKILL');
      expectWholeVersion(await readFile(target), payload);
    }
  }, 120_000);
});
