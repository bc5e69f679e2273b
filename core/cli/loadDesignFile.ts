/** Reading a design file from disk for the CLI (the only place core touches the file system). */
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseDesignText, type DesignIssue } from '../design/validateDesign';
import { resolveDesign } from '../design/resolveDesign';
import type { DesignFile, ResolvedDesign } from '../design/types';
import { readInputFile } from './readInputFile';

export const MAX_DESIGN_BYTES = 5 * 1024 * 1024;

const here = dirname(fileURLToPath(import.meta.url));
/** The bundled demo used when no design is named. */
export const DEMO_DESIGN_PATH = resolve(join(here, '..', '..', 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet'));

export type LoadedDesign =
  | { ok: true; path: string; file: DesignFile; design: ResolvedDesign }
  | { ok: false; path: string; issues: DesignIssue[] };

/** Read (regular files only, at most MAX_DESIGN_BYTES), parse, validate and resolve a design. */
export function loadDesignFile(path: string | undefined): LoadedDesign {
  const p = path ?? DEMO_DESIGN_PATH;
  const read = readInputFile(p, MAX_DESIGN_BYTES, 'design');
  if (!read.ok) return { ok: false, path: p, issues: [{ path: '', message: read.message }] };
  const parsed = parseDesignText(read.text, p);
  if (!parsed.ok) return { ok: false, path: p, issues: parsed.issues };
  return { ok: true, path: p, file: parsed.design, design: resolveDesign(parsed.design) };
}
