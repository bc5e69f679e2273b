/** The one way a design is written as text (saved files, autosave, the dirty check). */
import type { DesignFile } from '../../core/design/types';

export function designToText(design: DesignFile): string {
  return `${JSON.stringify(design, null, 2)}\n`;
}

/** A file name for a design: its name in lower case with dashes, and the extension. */
export function suggestedFileName(design: DesignFile): string {
  const slug = design.name
    .toLowerCase()
    .replace(/\(.*?\)/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `${slug || 'design'}.tiltsheet`;
}
