/**
 * A sweep's table as it is written: a CSV header then one row per pose, or a JSON document
 * whose "rows" array is written a row at a time, so no sweep holds more than a slice of its
 * rows in memory. Used by the grid sweep and the ride sweep; the text goes to an AtomicOutput.
 */
import type { CellValue } from '../../analysis/poseColumns';
import type { AtomicOutput } from '../outputFile';

export type TableFormat = 'csv' | 'json';

export function csvValue(v: CellValue): string {
  if (v === null) return '';
  if (typeof v === 'number') return String(Math.round(v * 1e6) / 1e6);
  return /[",\n\r]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

export function jsonValue(v: CellValue): CellValue {
  return typeof v === 'number' ? Math.round(v * 1e6) / 1e6 : v;
}

export class SweepTable {
  private firstRow = true;

  /**
   * `head` is the JSON document's fields before "rows" (ignored for CSV); `columns` name the
   * CSV header.
   */
  constructor(
    private readonly out: AtomicOutput,
    private readonly format: TableFormat,
    columns: readonly { name: string }[],
    head: Record<string, unknown>,
  ) {
    if (format === 'csv') {
      out.write(columns.map((c) => csvValue(c.name)).join(',') + '\n');
    } else {
      const text = JSON.stringify(head, null, 2);
      out.write(text.slice(0, text.lastIndexOf('}')).trimEnd() + ',\n  "rows": [');
    }
  }

  row(values: readonly CellValue[]): void {
    if (this.format === 'csv') {
      this.out.write(values.map(csvValue).join(',') + '\n');
    } else {
      this.out.write((this.firstRow ? '\n    ' : ',\n    ') + JSON.stringify(values.map(jsonValue)));
      this.firstRow = false;
    }
  }

  /** Close the document (JSON: the rows array and the summary). */
  finish(summary: unknown): void {
    if (this.format === 'json') this.out.write(`\n  ],\n  "summary": ${JSON.stringify(summary)}\n}\n`);
  }
}

/** The format an output name asks for, or undefined. */
export function formatOf(out: string): TableFormat | undefined {
  if (/\.csv$/i.test(out)) return 'csv';
  if (/\.json$/i.test(out)) return 'json';
  return undefined;
}
