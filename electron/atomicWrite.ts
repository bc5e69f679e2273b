/**
 * Crash-safe file replacement that cannot be redirected. The data goes to a temporary file
 * with a random name in the target's own folder, created exclusively (O_CREAT|O_EXCL, and
 * O_NOFOLLOW where the platform has it) so a link planted at that name makes the open fail
 * instead of writing through the link; it is fsynced, given the target's permissions, then
 * renamed over the target (atomic within one filesystem), and the folder is fsynced so the
 * rename survives a power cut. A crash at any point leaves either the old file or the new one
 * whole; at worst a stray hidden `.tmp` file remains beside it.
 *
 * A target that is a symbolic link is resolved first: the save replaces the file the link
 * points to and the link stays a link. A target nobody may write (no write permission bit, or
 * one this user cannot write) is refused with a `SaveRefusedError`, never replaced.
 */
import { randomBytes } from 'node:crypto';
import { constants as fsConstants } from 'node:fs';
import { access, lstat, open, realpath, rename, rm, stat, type FileHandle } from 'node:fs/promises';
import path from 'node:path';

/** A save refused for a reason the user can act on (read-only file, dangling link, not a file). */
export class SaveRefusedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SaveRefusedError';
  }
}

/** Exclusive creation that never follows a link at the final name (O_NOFOLLOW is absent on Windows). */
export const TEMP_OPEN_FLAGS =
  fsConstants.O_WRONLY | fsConstants.O_CREAT | fsConstants.O_EXCL | (fsConstants.O_NOFOLLOW ?? 0);
/** Fresh random names tried when one is taken (by a stray file or a planted link). */
const TEMP_ATTEMPTS = 8;
/** Bytes of the target's name kept in the temp name: the whole name must stay under 255 bytes. */
const NAME_BYTES_KEPT = 120;

/** `<folder>/.<name>.<token>.tmp`, the target's name cut to NAME_BYTES_KEPT bytes on a character boundary. */
export function tempPathFor(realTarget: string, token: string): string {
  let kept = '';
  for (const char of path.basename(realTarget)) {
    if (Buffer.byteLength(kept + char) > NAME_BYTES_KEPT) break;
    kept += char;
  }
  return path.join(path.dirname(realTarget), `.${kept}.${token}.tmp`);
}

/** Whether `name` (a bare file name) is one of the temp names atomicWrite uses. */
export function isTempName(name: string): boolean {
  return /^\..*\.[0-9a-f]{16}\.tmp$/.test(name);
}

function hasCode(error: unknown, code: string): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: unknown }).code === code;
}

/**
 * The file a save to `filePath` must replace: the link's target when `filePath` is a symbolic
 * link, else `filePath` in its folder's real location (so the temp file lands beside the file
 * that is renamed over). A link to a missing file is refused rather than replaced.
 */
export async function resolveWriteTarget(filePath: string): Promise<string> {
  const absolute = path.resolve(filePath);
  try {
    return await realpath(absolute);
  } catch (error) {
    if (!hasCode(error, 'ENOENT')) throw error;
  }
  const entry = await lstat(absolute).catch(() => null);
  if (entry?.isSymbolicLink()) {
    throw new SaveRefusedError(`${absolute} is a link to a file that does not exist, so it was not written.`);
  }
  return path.join(await realpath(path.dirname(absolute)), path.basename(absolute));
}

/**
 * Writes to one path run one after another, in the order they were asked for. They are queued
 * before the link is resolved (resolution is asynchronous and could finish out of order); a
 * write through a link and one to its target directly are not ordered, but each is whole.
 */
const pending = new Map<string, Promise<void>>();

export function atomicWrite(filePath: string, data: string | Uint8Array): Promise<void> {
  const key = path.resolve(filePath);
  const previous = pending.get(key) ?? Promise.resolve();
  const next = previous
    .catch(() => undefined)
    .then(async () => writeNow(await resolveWriteTarget(filePath), filePath, data));
  pending.set(key, next);
  const cleanup = (): void => {
    if (pending.get(key) === next) pending.delete(key);
  };
  next.then(cleanup, cleanup);
  return next;
}

async function writeNow(target: string, shownPath: string, data: string | Uint8Array): Promise<void> {
  const existing = await stat(target).catch((error: unknown) => {
    if (hasCode(error, 'ENOENT')) return null;
    throw error;
  });
  let mode: number | null = null;
  if (existing !== null) {
    if (!existing.isFile()) throw new SaveRefusedError(`${shownPath} is not a regular file, so it was not overwritten.`);
    mode = existing.mode & 0o777;
    await refuseReadOnly(target, shownPath, mode);
  }

  const { temp, handle } = await createTemp(target, mode ?? 0o666);
  try {
    try {
      await handle.writeFile(data, typeof data === 'string' ? 'utf8' : undefined);
      // The exact permissions of the file it replaces, whatever the umask took off at creation.
      if (mode !== null) await handle.chmod(mode);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temp, target);
  } catch (error) {
    await rm(temp, { force: true }).catch(() => undefined);
    throw error;
  }
  await syncDirectory(path.dirname(target));
}

/**
 * A file without any write permission bit was made read-only on purpose (root could still
 * write it, hence the bit test besides `access`); one this user cannot write is not ours to
 * replace, even though the folder would let the rename through.
 */
async function refuseReadOnly(target: string, shownPath: string, mode: number): Promise<void> {
  const writable = (mode & 0o222) !== 0 && (await access(target, fsConstants.W_OK).then(() => true, () => false));
  if (!writable) {
    throw new SaveRefusedError(
      `${shownPath} is read-only, so it was not overwritten. Use "Save as" to keep your design in another file.`,
    );
  }
}

async function createTemp(target: string, mode: number): Promise<{ temp: string; handle: FileHandle }> {
  for (let attempt = 1; ; attempt++) {
    const temp = tempPathFor(target, randomBytes(8).toString('hex'));
    try {
      return { temp, handle: await open(temp, TEMP_OPEN_FLAGS, mode) };
    } catch (error) {
      // EEXIST: something already has this name (a planted link included); never write through it.
      if (!hasCode(error, 'EEXIST') || attempt >= TEMP_ATTEMPTS) throw error;
    }
  }
}

/**
 * Makes the rename durable. Windows cannot open a folder for fsync (NTFS journals the rename
 * itself); a filesystem that does not support fsync on a folder says EINVAL or ENOTSUP. Any
 * other failure is reported: the new file is in place but may not survive a power cut.
 */
async function syncDirectory(dir: string): Promise<void> {
  if (process.platform === 'win32') return;
  const handle = await open(dir, fsConstants.O_RDONLY | (fsConstants.O_DIRECTORY ?? 0));
  try {
    await handle.sync();
  } catch (error) {
    if (!hasCode(error, 'EINVAL') && !hasCode(error, 'ENOTSUP')) throw error;
  } finally {
    await handle.close();
  }
}
