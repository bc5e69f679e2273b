/** Shared steps of every command: reporting a bad argument, loading the design or saying why not. */
import { existsSync } from 'node:fs';
import { ArgError } from './args';
import { EXIT_BAD_INPUT, type CliIo } from './io';
import { loadDesignFile, type LoadedDesign } from './loadDesignFile';
import { formatIssues } from './formatIssue';
import { clip, MAX_ECHOED_NAME, MAX_PROBLEM_CHARS } from './safeText';

/** Print an argument error with the command's usage and return exit 2; rethrow anything else. */
export function reportArgError(e: unknown, io: CliIo, command: string, help: string): number {
  if (e instanceof ArgError) {
    io.err(`tiltbench ${command}: ${clip(e.message, MAX_PROBLEM_CHARS)}\nusage:\n${help}\n`);
    return EXIT_BAD_INPUT;
  }
  throw e;
}

/**
 * Load and validate a design (the bundled demo when no path); print its problems when it fails.
 * The resolved design's name, which reports print, is cut to MAX_ECHOED_NAME characters; the
 * design file read (`file`) keeps the whole name.
 */
export function loadDesignOrReport(path: string | undefined, io: CliIo): Extract<LoadedDesign, { ok: true }> | undefined {
  const loaded = loadDesignFile(path);
  if (loaded.ok) {
    const name = clip(loaded.design.name, MAX_ECHOED_NAME);
    return name === loaded.design.name ? loaded : { ...loaded, design: { ...loaded.design, name } };
  }
  for (const line of formatIssues(loaded.issues)) io.err(line + '\n');
  return undefined;
}

/**
 * For a command whose arguments were refused: load the design files among them (arguments that
 * name an existing file ending in .tiltsheet) and print their issues; true when one could not be
 * read, so the caller reports the file (and place) rather than only the usage.
 */
export function unreadableDesign(argv: readonly string[], io: CliIo): boolean {
  for (const a of argv) {
    if (!a.endsWith('.tiltsheet') || !existsSync(a)) continue;
    if (!loadDesignOrReport(a, io)) return true;
  }
  return false;
}
