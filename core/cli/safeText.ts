/**
 * Text the CLI echoes from files and arguments, made safe for a terminal: control characters
 * escaped (a design name holding ESC sequences could otherwise recolour, move or retitle the
 * user's terminal, or hide lines), and echoed keys, values and names cut to a stated length.
 */

/** Longest design name printed in text output (the file keeps the whole name). */
export const MAX_ECHOED_NAME = 120;
/** Longest value or option text quoted back in an argument error. */
export const MAX_ECHOED_VALUE = 80;
/** Longest single problem message printed (the middle of a longer one is left out). */
export const MAX_PROBLEM_CHARS = 400;
/** Problems printed for one file; the rest are counted ("and N more"). */
export const MAX_PROBLEMS_PRINTED = 40;

/**
 * C0 controls but newline, DEL, C1 controls (U+009B is a one-byte CSI on some terminals),
 * and the bidirectional overrides and isolates, which reorder what a reader sees.
 */
const UNSAFE = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

const escapeOne = (c: string): string => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`;

/**
 * Every unsafe character written as `\uXXXX`. Inside a JSON string that is the same string
 * (JSON.stringify already escapes C0; C1 and the bidi marks it leaves raw), and outside JSON
 * strings the CLI writes none of them, so JSON output stays valid and equal.
 */
export function escapeControls(text: string): string {
  return text.replace(UNSAFE, escapeOne);
}

/** True when the text holds a character `escapeControls` would escape. */
export function hasUnsafe(text: string): boolean {
  UNSAFE.lastIndex = 0;
  const found = UNSAFE.test(text);
  UNSAFE.lastIndex = 0;
  return found;
}

/** At most `max` characters: the head and the tail kept, the middle replaced by a count. */
export function clip(text: string, max: number): string {
  if (text.length <= max) return text;
  const keep = Math.max(2, max - 40);
  const head = Math.ceil(keep / 2);
  const tail = keep - head;
  return `${text.slice(0, head)} [... ${text.length - keep} characters left out ...] ${text.slice(text.length - tail)}`;
}

/** A value as an argument error quotes it: escaped, cut to MAX_ECHOED_VALUE, in double quotes. */
export function quoted(value: string): string {
  return `"${clip(escapeControls(value), MAX_ECHOED_VALUE)}"`;
}

/** Lines for a list of problems: at most MAX_PROBLEMS_PRINTED, each cut, then "and N more". */
export function problemLines(messages: readonly string[]): string[] {
  const shown = messages.slice(0, MAX_PROBLEMS_PRINTED).map((m) => clip(m, MAX_PROBLEM_CHARS));
  const more = messages.length - shown.length;
  if (more > 0) shown.push(`... and ${more} more problem${more === 1 ? '' : 's'} (the first ${shown.length} are shown)`);
  return shown;
}
