/** Reading a design file from disk for the CLI (the only place core touches the file system). */
import { readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseDesignText, type DesignIssue } from '../design/validateDesign';
import { resolveDesign } from '../design/resolveDesign';
import type { DesignFile, ResolvedDesign } from '../design/types';

export const MAX_DESIGN_BYTES = 5 * 1024 * 1024;

const here = dirname(fileURLToPath(import.meta.url));
/** The bundled demo used when no design is named. */
export const DEMO_DESIGN_PATH = resolve(join(here, '..', '..', 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet'));

export type LoadedDesign =
  | { ok: true; path: string; file: DesignFile; design: ResolvedDesign }
  | { ok: false; path: string; issues: DesignIssue[] };

export function loadDesignFile(path: string | undefined): LoadedDesign {
  const p = path ?? DEMO_DESIGN_PATH;
  let text: string;
  try {
    const size = statSync(p).size;
    if (size > MAX_DESIGN_BYTES) {
      return { ok: false, path: p, issues: [{ path: '', message: `${p}: the file is ${size} bytes; a design is at most ${MAX_DESIGN_BYTES} bytes` }] };
    }
    text = readFileSync(p, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a design file' : (e as Error).message;
    return { ok: false, path: p, issues: [{ path: '', message: `${p}: cannot read: ${why}` }] };
  }
  const parsed = parseDesignText(text, p);
  if (!parsed.ok) return { ok: false, path: p, issues: parsed.issues };
  return { ok: true, path: p, file: parsed.design, design: resolveDesign(parsed.design) };
}
