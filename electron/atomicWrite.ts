/**
 * Crash-safe file replacement: the data goes to `<name>.<pid>.tmp` in the same folder, is
 * fsynced, then renamed over the target (atomic on one filesystem), and the folder is
 * fsynced best-effort. A crash at any point leaves either the old file or the new one whole;
 * at worst a stray `.tmp` file remains beside it.
 */
import { open, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';

/** Writes to one target path run one after another, so they never share a temp file. */
const pending = new Map<string, Promise<void>>();

export function tempPathFor(filePath: string, pid: number = process.pid): string {
  return path.join(path.dirname(filePath), `${path.basename(filePath)}.${pid}.tmp`);
}

export function atomicWrite(filePath: string, data: string | Uint8Array): Promise<void> {
  const target = path.resolve(filePath);
  const previous = pending.get(target) ?? Promise.resolve();
  const next = previous.catch(() => undefined).then(() => writeNow(target, data));
  pending.set(target, next);
  const cleanup = (): void => {
    if (pending.get(target) === next) pending.delete(target);
  };
  next.then(cleanup, cleanup);
  return next;
}

async function writeNow(target: string, data: string | Uint8Array): Promise<void> {
  const dir = path.dirname(target);
  const temp = tempPathFor(target);
  let mode = 0o666; // before umask
  try {
    mode = (await stat(target)).mode & 0o777; // keep an existing file's permissions
  } catch {
    // no existing file: default mode
  }
  try {
    const handle = await open(temp, 'w', mode);
    try {
      await handle.writeFile(data, typeof data === 'string' ? 'utf8' : undefined);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temp, target);
  } catch (error) {
    await rm(temp, { force: true }).catch(() => undefined);
    throw error;
  }
  await syncDirectory(dir);
}

/** Makes the rename durable where the platform allows fsync on a directory (not Windows). */
async function syncDirectory(dir: string): Promise<void> {
  try {
    const handle = await open(dir, 'r');
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // best-effort
  }
}
