/** The Pipit demo (balance-beam lean linkage) read through the real loader, for the lean-linkage tests. */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseDesignText } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';

const FILE = 'assets/designs/pipit-balance-beam-trike.tiltsheet';

export function pipitDoc(): DesignFile {
  // A path, not a file URL: under jsdom (the renderer tests) URL is jsdom's own.
  const text = readFileSync(join(__dirname, '..', '..', '..', FILE), 'utf8');
  const parsed = parseDesignText(text, FILE);
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
  return parsed.design;
}
