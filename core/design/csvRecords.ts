/**
 * RFC 4180 records with the line and column of every field, for messages that point at the
 * character to fix.
 *
 * Fields are separated by commas; a field in double quotes may hold commas, line breaks and
 * `""` for a quote. Records end with CRLF, LF or a lone CR. Spaces around a quoted field are
 * allowed (spreadsheets write none; people do). Our own rather than a CSV library: csv-parse
 * and papaparse report a record's line and a field's index, not the character column each
 * message here points at, and csv-parse's typings pull Node's stream types into core.
 */

export interface CsvField {
  /** The field's text, quotes removed and `""` read as `"`. */
  text: string;
  /** 1-based line of the field's first character. */
  line: number;
  /** 1-based column of the field's first character. */
  column: number;
}

export interface CsvRecord {
  fields: CsvField[];
  /** Where the record ends (the line break or the end of the text), for "missing field" messages. */
  end: { line: number; column: number };
}

export type CsvRead =
  | { ok: true; records: CsvRecord[] }
  | { ok: false; line: number; column: number; reason: string };

/**
 * Every record of the text (a leading byte-order mark dropped). A record that is one empty
 * unquoted field (a blank line) is skipped. Stops at the first syntax error, since after an
 * unclosed quote nothing that follows can be read with confidence.
 */
export function readCsvRecords(csv: string): CsvRead {
  const text = csv.startsWith('\uFEFF') ? csv.slice(1) : csv;
  const records: CsvRecord[] = [];
  let i = 0;
  let line = 1;
  let lineStart = 0;
  const col = (k: number) => k - lineStart + 1;
  const isBreak = (k: number) => text[k] === '\n' || text[k] === '\r';
  /** Steps over a line break at k (CRLF counts once) and returns the index after it. */
  const skipBreak = (k: number) => {
    const next = text[k] === '\r' && text[k + 1] === '\n' ? k + 2 : k + 1;
    line++;
    lineStart = next;
    return next;
  };

  let fields: CsvField[] = [];
  let blank = true;
  while (i <= text.length) {
    const fieldLine = line;
    const fieldColumn = col(i);
    let j = i;
    while (text[j] === ' ' || text[j] === '\t') j++;
    let value = '';
    if (text[j] === '"') {
      const openLine = line;
      const openColumn = col(j);
      i = j + 1;
      for (;;) {
        if (i >= text.length) return { ok: false, line: openLine, column: openColumn, reason: 'a quoted field is never closed (missing ")' };
        const c = text[i];
        if (c === '"') {
          if (text[i + 1] === '"') {
            value += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        if (isBreak(i)) {
          value += c === '\r' && text[i + 1] === '\n' ? '\r\n' : c;
          i = skipBreak(i);
          continue;
        }
        value += c;
        i++;
      }
      while (text[i] === ' ' || text[i] === '\t') i++;
      if (i < text.length && text[i] !== ',' && !isBreak(i)) {
        return { ok: false, line, column: col(i), reason: `unexpected ${JSON.stringify(text[i])} after a quoted field` };
      }
      blank = false;
    } else {
      while (i < text.length && text[i] !== ',' && !isBreak(i)) {
        if (text[i] === '"') return { ok: false, line, column: col(i), reason: 'a quote inside an unquoted field (quote the whole field and write "" for a quote)' };
        value += text[i++];
      }
      if (value.trim() !== '') blank = false;
    }
    fields.push({ text: value, line: fieldLine, column: fieldColumn });
    if (i < text.length && text[i] === ',') {
      blank = false;
      i++;
      continue;
    }
    // End of a record: a line break or the end of the text.
    const end = { line, column: col(i) };
    if (!blank) records.push({ fields, end });
    fields = [];
    blank = true;
    if (i >= text.length) break;
    i = skipBreak(i);
  }
  return { ok: true, records };
}

/** A field as RFC 4180 writes it: quoted only when it holds a comma, a quote or a line break. */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) || /^\s|\s$/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** How many lines the text has, counted as readCsvRecords counts them (for "at the end" messages). */
export function csvLineCount(csv: string): number {
  const text = csv.startsWith('\uFEFF') ? csv.slice(1) : csv;
  return text.split(/\r\n|\n|\r/).length;
}
