/** Shared steps of every command: reporting a bad argument, loading the design or saying why not. */
import { ArgError } from './args';
import { EXIT_BAD_INPUT, type CliIo } from './io';
import { loadDesignFile, type LoadedDesign } from './loadDesignFile';
import { formatIssue } from './formatIssue';

/** Print an argument error with the command's usage and return exit 2; rethrow anything else. */
export function reportArgError(e: unknown, io: CliIo, command: string, help: string): number {
  if (e instanceof ArgError) {
    io.err(`tiltbench ${command}: ${e.message}\nusage:\n${help}\n`);
    return EXIT_BAD_INPUT;
  }
  throw e;
}

/** Load and validate a design (the bundled demo when no path); print every issue when it fails. */
export function loadDesignOrReport(path: string | undefined, io: CliIo): Extract<LoadedDesign, { ok: true }> | undefined {
  const loaded = loadDesignFile(path);
  if (loaded.ok) return loaded;
  for (const issue of loaded.issues) io.err(formatIssue(issue) + '\n');
  return undefined;
}
