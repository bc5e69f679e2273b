/**
 * Argument validators for every IPC message main handles. Each takes the raw argument list
 * that arrived from the renderer (after the event) and returns typed values, or throws an
 * `IpcValidationError` for anything else: wrong types, extra arguments, unknown keys,
 * oversized text, paths without the `.tiltsheet` extension.
 */
import path from 'node:path';

/** Largest design or recovery text accepted, in UTF-8 bytes. */
export const MAX_TEXT_BYTES = 5 * 1024 * 1024;
/** Largest file `design:open` reads, in bytes. */
export const MAX_FILE_BYTES = MAX_TEXT_BYTES;
export const DESIGN_EXTENSION = '.tiltsheet';
export const MAX_PATH_LENGTH = 4096;
export const MAX_NAME_LENGTH = 255;

export class IpcValidationError extends Error {
  constructor(channel: string, message: string) {
    super(`${channel}: ${message}`);
    this.name = 'IpcValidationError';
  }
}

/** UTF-8 length of a string without allocating an encoded copy. */
export function utf8ByteLength(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const unit = text.charCodeAt(i);
    if (unit < 0x80) bytes += 1;
    else if (unit < 0x800) bytes += 2;
    else if (unit >= 0xd800 && unit <= 0xdbff && i + 1 < text.length) {
      const next = text.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        bytes += 4;
        i++;
      } else bytes += 3; // lone high surrogate: encoded as U+FFFD
    } else bytes += 3;
  }
  return bytes;
}

function expectArgCount(channel: string, args: readonly unknown[], count: number): void {
  if (args.length !== count) {
    throw new IpcValidationError(channel, `expected ${count} argument(s), got ${args.length}`);
  }
}

/** A plain object (not an array, not a class instance) with exactly the allowed keys. */
function expectPlainObject(
  channel: string,
  value: unknown,
  required: readonly string[],
  optional: readonly string[] = [],
): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new IpcValidationError(channel, 'expected an object');
  }
  const proto: unknown = Object.getPrototypeOf(value);
  if (proto !== Object.prototype && proto !== null) {
    throw new IpcValidationError(channel, 'expected a plain object');
  }
  const record = value as Record<string, unknown>;
  for (const key of Object.keys(record)) {
    if (!required.includes(key) && !optional.includes(key)) {
      throw new IpcValidationError(channel, `unexpected key "${key}"`);
    }
  }
  for (const key of required) {
    if (!(key in record)) throw new IpcValidationError(channel, `missing key "${key}"`);
  }
  return record;
}

/** A string of at most MAX_TEXT_BYTES UTF-8 bytes. */
export function validateText(channel: string, value: unknown): string {
  if (typeof value !== 'string') throw new IpcValidationError(channel, 'text must be a string');
  // UTF-8 never takes fewer bytes than UTF-16 code units, so this rejects huge input cheaply.
  if (value.length > MAX_TEXT_BYTES || utf8ByteLength(value) > MAX_TEXT_BYTES) {
    throw new IpcValidationError(channel, `text exceeds ${MAX_TEXT_BYTES} bytes`);
  }
  return value;
}

/** An absolute path to a `.tiltsheet` file, normalized. */
export function validateDesignPath(channel: string, value: unknown): string {
  if (typeof value !== 'string') throw new IpcValidationError(channel, 'path must be a string');
  if (value.length === 0 || value.length > MAX_PATH_LENGTH) {
    throw new IpcValidationError(channel, 'path is empty or too long');
  }
  if (value.includes('\0')) throw new IpcValidationError(channel, 'path contains a NUL character');
  if (!path.isAbsolute(value)) throw new IpcValidationError(channel, 'path must be absolute');
  const normalized = path.normalize(value);
  const base = path.basename(normalized);
  if (!base.toLowerCase().endsWith(DESIGN_EXTENSION) || base.length <= DESIGN_EXTENSION.length) {
    throw new IpcValidationError(channel, `path must name a ${DESIGN_EXTENSION} file`);
  }
  return normalized;
}

/** A bare file name for the save dialog; the extension is added when missing. */
export function validateSuggestedName(channel: string, value: unknown): string {
  if (typeof value !== 'string') throw new IpcValidationError(channel, 'suggestedName must be a string');
  if (value.length === 0 || value.length > MAX_NAME_LENGTH) {
    throw new IpcValidationError(channel, 'suggestedName is empty or too long');
  }
  if (/[/\\\0]/.test(value) || value === '.' || value === '..') {
    throw new IpcValidationError(channel, 'suggestedName must be a bare file name');
  }
  return value.toLowerCase().endsWith(DESIGN_EXTENSION) ? value : value + DESIGN_EXTENSION;
}

/** For messages that take no arguments. */
export function parseNoArgs(channel: string, args: readonly unknown[]): void {
  expectArgCount(channel, args, 0);
}

/** `design:save` takes `{ path, text }`. */
export function parseSaveArgs(channel: string, args: readonly unknown[]): { path: string; text: string } {
  expectArgCount(channel, args, 1);
  const record = expectPlainObject(channel, args[0], ['path', 'text']);
  return { path: validateDesignPath(channel, record.path), text: validateText(channel, record.text) };
}

/** `design:saveAs` takes `{ text, suggestedName? }`. */
export function parseSaveAsArgs(
  channel: string,
  args: readonly unknown[],
): { text: string; suggestedName: string | null } {
  expectArgCount(channel, args, 1);
  const record = expectPlainObject(channel, args[0], ['text'], ['suggestedName']);
  const text = validateText(channel, record.text);
  const suggestedName =
    record.suggestedName === undefined ? null : validateSuggestedName(channel, record.suggestedName);
  return { text, suggestedName };
}

/** `recovery:write` takes the text alone. */
export function parseRecoveryWriteArgs(channel: string, args: readonly unknown[]): string {
  expectArgCount(channel, args, 1);
  return validateText(channel, args[0]);
}

/** `design:openRecent` takes one design path. */
export function parseOpenRecentArgs(channel: string, args: readonly unknown[]): string {
  expectArgCount(channel, args, 1);
  return validateDesignPath(channel, args[0]);
}

export const PDF_EXTENSION = '.pdf';

/**
 * `report:pdf` takes `{ html, suggestedName? }`: the report as the renderer made it (a whole
 * HTML document, at most MAX_TEXT_BYTES) and a bare file name, given the `.pdf` extension.
 */
export function parseReportPdfArgs(channel: string, args: readonly unknown[]): { html: string; suggestedName: string } {
  expectArgCount(channel, args, 1);
  const record = expectPlainObject(channel, args[0], ['html'], ['suggestedName']);
  const html = validateText(channel, record.html);
  if (!/^\s*<!doctype html>/i.test(html)) throw new IpcValidationError(channel, 'html must be a whole HTML document');
  let suggestedName = 'report.pdf';
  if (record.suggestedName !== undefined) {
    const bare = validateSuggestedName(channel, record.suggestedName).slice(0, -DESIGN_EXTENSION.length);
    suggestedName = bare.toLowerCase().endsWith(PDF_EXTENSION) ? bare : bare + PDF_EXTENSION;
  }
  return { html, suggestedName };
}
