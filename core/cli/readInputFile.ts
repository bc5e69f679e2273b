/**
 * Reading an input file (a design, a bands file, a plan, a table) with a hard byte cap.
 *
 * The size a file reports is not enough: /dev/zero and /proc files report 0 bytes and a named
 * pipe blocks the reader until someone writes to it. So anything that is not a regular file
 * is refused before it is opened, the file is opened non-blocking (a pipe swapped in after the
 * check cannot hang the open) and checked again on the open descriptor, and the read stops at
 * the cap whatever the file claims.
 */
import { closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from 'node:fs';

export type InputRead = { ok: true; text: string } | { ok: false; message: string };

function kindOf(st: Stats): string {
  if (st.isDirectory()) return 'is a folder, not a file';
  if (st.isFIFO()) return 'is a named pipe, not a regular file';
  if (st.isCharacterDevice() || st.isBlockDevice()) return 'is a device, not a regular file';
  if (st.isSocket()) return 'is a socket, not a regular file';
  return 'is not a regular file';
}

function cannotRead(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'ELOOP') return 'too many symbolic links (a loop?)';
  if (code === 'ENAMETOOLONG') return 'the name is too long';
  if (code === 'ENOTDIR') return 'a part of the path is not a folder';
  if (code === 'EISDIR') return 'is a folder, not a file';
  return (e as Error).message;
}

/**
 * The file's text (UTF-8), or why not: `path: cannot read: ...`, `path: is a named pipe, ...`,
 * `path: ... more than N bytes; a WHAT is at most N bytes`.
 */
export function readInputFile(path: string, maxBytes: number, what: string): InputRead {
  const refuse = (why: string): InputRead => ({ ok: false, message: `${path}: ${why}` });
  let fd: number;
  try {
    const st = statSync(path);
    if (!st.isFile()) return refuse(kindOf(st));
    if (st.size > maxBytes) return refuse(`the file is ${st.size} bytes; a ${what} is at most ${maxBytes} bytes`);
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (e) {
    return refuse(`cannot read: ${cannotRead(e)}`);
  }
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) return refuse(kindOf(st));
    // One byte more than the cap tells a file at the cap from one past it.
    const buffer = Buffer.alloc(Math.min(maxBytes + 1, Math.max(st.size + 1, 64 * 1024)));
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const n = readSync(fd, buffer, 0, buffer.length, null);
      if (n === 0) break;
      total += n;
      if (total > maxBytes) return refuse(`the file holds more than ${maxBytes} bytes; a ${what} is at most ${maxBytes} bytes`);
      chunks.push(Buffer.from(buffer.subarray(0, n)));
    }
    return { ok: true, text: Buffer.concat(chunks, total).toString('utf8') };
  } catch (e) {
    return refuse(`cannot read: ${cannotRead(e)}`);
  } finally {
    closeSync(fd);
  }
}
