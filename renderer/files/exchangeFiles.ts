/**
 * Files that leave or enter the workbench beside the design: hardpoint tables (CSV) and 3D
 * exports (.glb). Through the page's own file APIs (a file input, a download), which work the
 * same in a browser and in the Electron shell (its renderer shows the system's open and save
 * dialogs for them), so the shell's IPC surface does not grow: nothing here writes over a
 * design, and the shell never receives these bytes.
 */

/** A hardpoint table is a few kilobytes; anything near this is not one (as the CLI's limit). */
export const MAX_TABLE_BYTES = 1024 * 1024;

export interface PickedText {
  fileName: string;
  text: string;
}

export interface ExchangeFiles {
  /** Asks the user for a CSV table; null when they cancel. Throws with a message for a file too large. */
  pickTable(): Promise<PickedText | null>;
  /** Offers data as a file to save under a suggested name. */
  offer(data: string | Uint8Array, fileName: string, mime: string): void;
}

export function pageExchangeFiles(doc: Document = document): ExchangeFiles {
  return {
    pickTable: () =>
      new Promise<PickedText | null>((resolve, reject) => {
        const input = doc.createElement('input');
        input.type = 'file';
        input.accept = '.csv,text/csv';
        input.hidden = true;
        input.dataset.testid = 'import-table-input';
        doc.body.appendChild(input);
        const done = () => input.remove();
        input.addEventListener('change', () => {
          const file = input.files?.[0] ?? null;
          done();
          if (!file) return resolve(null);
          if (file.size > MAX_TABLE_BYTES) return reject(new Error(`${file.name} is ${Math.round(file.size / 1024)} KiB; a hardpoint table is at most ${MAX_TABLE_BYTES / 1024} KiB`));
          file.text().then((text) => resolve({ fileName: file.name, text }), reject);
        });
        input.addEventListener('cancel', () => {
          done();
          resolve(null);
        });
        input.click();
      }),
    offer(data, fileName, mime) {
      const url = URL.createObjectURL(new Blob([data as BlobPart], { type: mime }));
      const a = doc.createElement('a');
      a.href = url;
      a.download = fileName;
      doc.body.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 30_000);
    },
  };
}

/** A file name for an export: the design's file name without `.tiltsheet`, then the suffix. */
export function exportName(designFileName: string, suffix: string): string {
  const base = designFileName.replace(/\.tiltsheet$/i, '').replace(/[\\/:*?"<>|]/g, '_') || 'design';
  return `${base}${suffix}`;
}
