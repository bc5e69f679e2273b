/**
 * Reads a design or recovery file with a hard byte cap. The checks are made on the opened
 * handle, not the path, so a file swapped between a check and the read cannot slip through;
 * a named pipe is opened without waiting for a writer (O_NONBLOCK) and then refused, and a
 * device such as /dev/zero is refused before a byte is read.
 */
import { constants as fsConstants } from 'node:fs';
import { open } from 'node:fs/promises';

export async function readRegularFile(filePath: string, maxBytes: number): Promise<string> {
  const handle = await open(filePath, fsConstants.O_RDONLY | (fsConstants.O_NONBLOCK ?? 0));
  try {
    const info = await handle.stat();
    if (!info.isFile()) throw new Error(`${filePath} is not a regular file`);
    if (info.size > maxBytes) throw new Error(`${filePath} is larger than ${maxBytes} bytes`);
    // Read to the end rather than to the size stat gave: a file that grew since is caught too.
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const chunk = Buffer.allocUnsafe(64 * 1024);
      const { bytesRead } = await handle.read(chunk, 0, chunk.length, null);
      if (bytesRead === 0) break;
      total += bytesRead;
      if (total > maxBytes) throw new Error(`${filePath} is larger than ${maxBytes} bytes`);
      chunks.push(chunk.subarray(0, bytesRead));
    }
    return Buffer.concat(chunks, total).toString('utf8');
  } finally {
    await handle.close();
  }
}
