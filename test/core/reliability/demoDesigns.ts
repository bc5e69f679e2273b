/**
 * The bundled demo designs and the minimal fixture, read through the real loader, as the
 * seeds every fuzz test starts from.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseDesignText } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));

export const DEMO_FILES = [
  'assets/designs/heron-tilting-velomobile.tiltsheet',
  'assets/designs/swift-parallelogram-trike.tiltsheet',
  'assets/designs/wren-rack-trike.tiltsheet',
  'assets/designs/linnet-track-rod-trike.tiltsheet',
  'assets/designs/finch-knuckle-steered-trike.tiltsheet',
  'assets/designs/plover-tilting-quad.tiltsheet',
  'assets/designs/pipit-balance-beam-trike.tiltsheet',
  'test/fixtures/minimal.tiltsheet',
] as const;

export interface DemoDesign {
  file: string;
  text: string;
  design: DesignFile;
}

export function loadDemos(): DemoDesign[] {
  return DEMO_FILES.map((file) => {
    const text = readFileSync(join(ROOT, file), 'utf8');
    const parsed = parseDesignText(text, file);
    if (!parsed.ok) throw new Error(`demo ${file} does not load: ${parsed.issues.map((i) => i.message).join('; ')}`);
    return { file, text, design: parsed.design };
  });
}

export function demo(nameContains: string): DemoDesign {
  const found = loadDemos().find((d) => d.file.includes(nameContains));
  if (!found) throw new Error(`no demo named like ${nameContains}`);
  return found;
}

/** A deep copy through JSON (designs are plain JSON data). */
export function clone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}
