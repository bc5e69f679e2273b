/**
 * Every file the CLI writes goes through here: whole or absent, never half.
 *
 * - The path is checked before any work: not one of the command's inputs (the same file by
 *   device and inode, so a link or a second name for the design is caught too), a regular file
 *   if it exists (never a device, pipe or folder), writable, in a folder that exists.
 * - The text goes to a fresh temporary file in the same folder (created exclusively, links not
 *   followed, so nothing planted at that name is written through), flushed, then renamed over
 *   the target, and the folder flushed: a reader sees the old file or the new one.
 * - On a failure (disk full, I/O error) or an interruption the temporary file is removed and
 *   the old file is left as it was. Only SIGKILL can leave a temporary file behind; it is
 *   named `.NAME.PID-RANDOM.partial`, never mistaken for a result, and removed by the next
 *   write to the same target once its process is gone.
 * A link at the target is followed: the file it points to is replaced, the link kept.
 */
import * as nodeFs from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';
import { ArgError } from './args';
import { OutputError, systemErrorWords } from './io';

/** The file-system calls used, so a test can make a write fail (a full disk) without a full disk. */
export type OutputFs = Pick<
  typeof nodeFs,
  'openSync' | 'writeSync' | 'fsyncSync' | 'closeSync' | 'renameSync' | 'unlinkSync' | 'fchmodSync' | 'readdirSync'
>;

const PARTIAL = /^\.(.+)\.(\d+)-[0-9a-f]{12}\.partial$/;

/** Where an output path really leads (its folder's links and its own link resolved), checked. */
export interface OutputTarget {
  /** As the user wrote it, for messages. */
  given: string;
  /** The file that will be replaced or created. */
  real: string;
  /** Permission bits of the existing file, kept on the new one; undefined for a new file. */
  mode?: number;
}

function sameFile(a: nodeFs.Stats, b: nodeFs.Stats): boolean {
  return a.dev === b.dev && a.ino === b.ino;
}

/**
 * Check an output path up front. Throws ArgError (exit 2) naming the option and the reason:
 * the output is an input, not a regular file, read-only, or its folder does not exist.
 */
export function checkOutputPath(given: string, option: string, inputs: readonly { path: string; what: string }[]): OutputTarget {
  const refuse = (why: string) => new ArgError(`${option} ${given}: ${why}`);
  let existing: nodeFs.Stats | undefined;
  try {
    existing = nodeFs.statSync(given);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code !== 'ENOENT') throw refuse(`cannot use it: ${systemErrorWords(e)}`);
    try {
      if (nodeFs.lstatSync(given).isSymbolicLink()) throw refuse('is a symbolic link to nothing; name the file itself');
    } catch (le) {
      if (le instanceof ArgError) throw le;
    }
  }
  if (existing) {
    if (!existing.isFile()) throw refuse(existing.isDirectory() ? 'is a folder; name a file' : 'exists and is not a regular file (a device or pipe); name a regular file');
    for (const input of inputs) {
      try {
        if (sameFile(existing, nodeFs.statSync(input.path))) throw refuse(`is the ${input.what} given as input; write the result to another file`);
      } catch (e) {
        if (e instanceof ArgError) throw e; // an input that cannot be read is reported by its reader
      }
    }
    const real = nodeFs.realpathSync(given);
    try {
      nodeFs.accessSync(real, nodeFs.constants.W_OK);
    } catch {
      throw refuse('is read-only; nothing was written (make it writable or write elsewhere)');
    }
    return { given, real, mode: existing.mode & 0o7777 };
  }
  const folder = dirname(given);
  let realFolder: string;
  try {
    realFolder = nodeFs.realpathSync(folder);
    if (!nodeFs.statSync(realFolder).isDirectory()) throw refuse(`${folder} is not a folder`);
  } catch (e) {
    if (e instanceof ArgError) throw e;
    throw refuse(`the folder ${folder} cannot be used: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'it does not exist' : systemErrorWords(e)}`);
  }
  return { given, real: join(realFolder, basename(given)) };
}

/** An output being written: `write` as often as needed, then `commit`, or `abort` on any failure. */
export class AtomicOutput {
  private fd: number | null;
  private readonly temp: string;
  private pending: (string | Uint8Array)[] = [];
  private pendingChars = 0;
  private done = false;

  private constructor(
    private readonly target: OutputTarget,
    private readonly fs: OutputFs,
  ) {
    const folder = dirname(target.real);
    const stem = partialStem(basename(target.real));
    removeStalePartials(folder, stem, fs);
    this.temp = join(folder, `.${stem}.${process.pid}-${randomBytes(6).toString('hex')}.partial`);
    const c = nodeFs.constants;
    try {
      this.fd = fs.openSync(this.temp, c.O_WRONLY | c.O_CREAT | c.O_EXCL | (c.O_NOFOLLOW ?? 0), 0o666);
    } catch (e) {
      throw new OutputError(target.given, (e as NodeJS.ErrnoException).code, systemErrorWords(e));
    }
  }

  /** Start writing a checked target. Throws OutputError when the temporary file cannot be made. */
  static open(target: OutputTarget, fs: OutputFs = nodeFs): AtomicOutput {
    return new AtomicOutput(target, fs);
  }

  /** Queue text (UTF-8) or bytes; written in blocks of about 64 kB. Throws OutputError (the caller aborts). */
  write(text: string | Uint8Array): void {
    this.pending.push(text);
    this.pendingChars += text.length;
    if (this.pendingChars >= 65536) this.flush();
  }

  private flush(): void {
    if (this.fd === null || this.pendingChars === 0) return;
    const bytes = Buffer.concat(this.pending.map((p) => (typeof p === 'string' ? Buffer.from(p, 'utf8') : p)));
    this.pending = [];
    this.pendingChars = 0;
    let at = 0;
    try {
      while (at < bytes.length) at += this.fs.writeSync(this.fd, bytes, at, bytes.length - at);
    } catch (e) {
      throw new OutputError(this.target.given, (e as NodeJS.ErrnoException).code, systemErrorWords(e));
    }
  }

  /** Flush, keep the old file's permissions, and rename over the target. Throws OutputError. */
  commit(): void {
    try {
      this.flush();
      const fd = this.fd!;
      if (this.target.mode !== undefined) this.fs.fchmodSync(fd, this.target.mode);
      this.fs.fsyncSync(fd);
      this.fs.closeSync(fd);
      this.fd = null;
      this.fs.renameSync(this.temp, this.target.real);
      this.done = true;
    } catch (e) {
      this.abort();
      if (e instanceof OutputError) throw e;
      throw new OutputError(this.target.given, (e as NodeJS.ErrnoException).code, systemErrorWords(e));
    }
    syncFolder(dirname(this.target.real));
  }

  /** Remove the temporary file; the target is as it was. Safe to call more than once. */
  abort(): void {
    if (this.done) return;
    this.done = true;
    if (this.fd !== null) {
      try {
        this.fs.closeSync(this.fd);
      } catch {
        /* closing a file being thrown away */
      }
      this.fd = null;
    }
    try {
      this.fs.unlinkSync(this.temp);
    } catch {
      /* already gone */
    }
  }

  /** The temporary file's path (tests look for it). */
  get temporaryPath(): string {
    return this.temp;
  }
}

/** Flush the folder so the rename itself survives a power cut; some file systems refuse, which is harmless. */
function syncFolder(folder: string): void {
  try {
    const fd = nodeFs.openSync(folder, nodeFs.constants.O_RDONLY);
    try {
      nodeFs.fsyncSync(fd);
    } finally {
      nodeFs.closeSync(fd);
    }
  } catch {
    /* not every file system lets a folder be flushed */
  }
}

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Write a whole output at once through AtomicOutput (temporary file, flushed, renamed); on any
 * failure the temporary file is removed and the target left as it was. */
export function writeWholeOutput(target: OutputTarget, text: string | Uint8Array): void {
  const out = AtomicOutput.open(target);
  try {
    out.write(text);
    out.commit();
  } catch (e) {
    out.abort();
    throw e;
  }
}

/** Longest share of the target's name in a temporary name, in bytes: with the dot, process id,
 * random part and suffix it stays under the 255-byte name limit of common file systems, so a
 * target whose own name is near that limit can still be written. */
const STEM_BYTES = 200;

/** The target's name as its temporary files carry it (cut to STEM_BYTES at a character edge). */
export function partialStem(name: string): string {
  let stem = name;
  while (Buffer.byteLength(stem) > STEM_BYTES) stem = stem.slice(0, -1);
  return stem;
}

/** Temporary files of earlier writes to the same target whose process was killed (SIGKILL). */
function removeStalePartials(folder: string, name: string, fs: OutputFs): void {
  let entries: string[];
  try {
    entries = fs.readdirSync(folder);
  } catch {
    return;
  }
  for (const entry of entries) {
    const m = PARTIAL.exec(entry);
    if (!m || m[1] !== name || processAlive(Number(m[2]))) continue;
    try {
      fs.unlinkSync(join(folder, entry));
    } catch {
      /* someone else removed it */
    }
  }
}
