/**
 * Reading a design file's text: one pass over it finds the first JSON syntax error (with a
 * plain-words reason and its line:column) or, in text that parses, every key given twice in
 * one object. JSON.parse alone is not enough for either: engines word their errors
 * differently and some give no position (V8 in Node 20: "Unexpected token '}', ... is not
 * valid JSON"), and it keeps the last of two equal keys without a word, so a hardpoint pasted
 * twice (the second with old numbers) would load with whichever came last.
 *
 * The scanner keeps an explicit stack rather than recursing, so nesting of any depth is
 * followed to the real error (a recursive scanner needs a depth limit to spare the call stack).
 */
import { refuse, type DesignIssue } from './designIssue';
import { formatPath, type PathSegment } from './schemaDsl';

export interface DuplicateKey {
  /** Path of the key in the document as field messages write it, e.g. `vehicle.wheelbaseMm`. */
  path: string;
  key: string;
  /** Offset in the text of the second occurrence's opening quote. */
  offset: number;
}

export interface JsonScan {
  /** The first syntax error (RFC 8259), undefined when the text is valid JSON. */
  syntaxError?: { offset: number; reason: string };
  /** Keys repeated within one object, in text order (only complete when there is no syntax error). */
  duplicates: DuplicateKey[];
}

export type JsonTextResult = { ok: true; json: unknown } | { ok: false; issues: DesignIssue[] };

/**
 * JSON text -> value, refusing an empty file, a syntax error (line:column) and repeated keys.
 * A leading byte-order mark is dropped: editors on some systems write one, JSON.parse refuses
 * it, and people cannot see it.
 */
export function readJsonText(text: string, fileName: string): JsonTextResult {
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  if (body.trim() === '') return refuse([{ path: '', message: 'the file is empty; expected a JSON design' }], fileName);

  const scan = scanJson(body);
  if (scan.syntaxError) {
    const { offset, reason } = scan.syntaxError;
    return { ok: false, issues: [positioned(body, offset, '', `invalid JSON: ${reason}`, fileName)] };
  }
  let json: unknown;
  try {
    json = JSON.parse(body);
  } catch (error) {
    // Only if the scanner and the engine disagree about RFC 8259: trust the engine.
    const message = error instanceof Error ? error.message : String(error);
    const at = /position (\d+)/.exec(message);
    if (!at) return { ok: false, issues: [{ path: '', message: `${fileName}: invalid JSON: ${message}` }] };
    return { ok: false, issues: [positioned(body, Number(at[1]), '', `invalid JSON: ${message}`, fileName)] };
  }
  if (scan.duplicates.length > 0) {
    const issues = scan.duplicates.map((d) =>
      positioned(body, d.offset, d.path, `${d.path}: ${JSON.stringify(d.key)} is given twice in the same object; keep one and delete the other`, fileName),
    );
    return { ok: false, issues };
  }
  return { ok: true, json };
}

function positioned(text: string, offset: number, path: string, message: string, fileName: string): DesignIssue {
  const { line, column } = lineAndColumn(text, offset);
  return { path, message: `${fileName}:${line}:${column}: ${message}`, line, column };
}

/** 1-based line and column of a character offset; \r\n, \n and \r each end a line. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    const c = text[i];
    if (c === '\n' || (c === '\r' && text[i + 1] !== '\n')) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

/** The offset and a plain-words reason of the first syntax error in `text`, or undefined if it is valid JSON. */
export function findJsonSyntaxError(text: string): { offset: number; reason: string } | undefined {
  return scanJson(text).syntaxError;
}

/** Keys given twice in one object, for text that JSON.parse accepts. */
export function findDuplicateKeys(text: string): DuplicateKey[] {
  return scanJson(text).duplicates;
}

class JsonSyntaxError {
  constructor(
    readonly offset: number,
    readonly reason: string,
  ) {}
}

/**
 * An open object or array. Each remembers only how its parent reaches it (`seg`): a path
 * copied per level would make deep nesting quadratic; a path is assembled only for a repeat.
 */
type Frame =
  | { kind: 'object'; seg: PathSegment | undefined; keys: Set<string>; key: string }
  | { kind: 'array'; seg: PathSegment | undefined; index: number };

/** One pass over `text`: the first syntax error, and the repeated keys met before it. */
export function scanJson(text: string): JsonScan {
  const s = new Scanner(text);
  try {
    s.scanDocument();
    return { duplicates: s.duplicates };
  } catch (error) {
    if (error instanceof JsonSyntaxError) return { syntaxError: { offset: error.offset, reason: error.reason }, duplicates: s.duplicates };
    throw error;
  }
}

const COMMENT_HINT = ' (comments are not allowed in JSON)';

class Scanner {
  readonly duplicates: DuplicateKey[] = [];
  private i = 0;
  private readonly stack: Frame[] = [];

  constructor(private readonly text: string) {}

  scanDocument(): void {
    for (;;) {
      if (this.openOrScanValue()) continue;
      // A value is complete: close every container that ends here, then go on after a comma.
      for (;;) {
        const top = this.stack[this.stack.length - 1];
        this.skipWhitespace();
        if (!top) {
          if (this.i < this.text.length) this.fail(`unexpected ${this.describeAt(this.i)} after the end of the JSON document`);
          return;
        }
        if (this.text[this.i] === ',') {
          this.i++;
          if (top.kind === 'object') this.scanKey(top);
          else this.nextItem(top);
          break;
        }
        if (top.kind === 'object') this.expect('}', "',' or '}' after a property value");
        else this.expect(']', "',' or ']' after a list item");
        this.stack.pop();
      }
    }
  }

  /** Reads the value at the cursor. True when it opened a non-empty container (its first value comes next). */
  private openOrScanValue(): boolean {
    const text = this.text;
    this.skipWhitespace();
    const c = text[this.i];
    if (c === '{' || c === '[') {
      const seg = this.childSegment();
      this.i++;
      this.skipWhitespace();
      const close = c === '{' ? '}' : ']';
      if (text[this.i] === close) {
        this.i++;
        return false;
      }
      if (c === '[') {
        this.stack.push({ kind: 'array', seg, index: 0 });
        return true;
      }
      const frame: Frame = { kind: 'object', seg, keys: new Set(), key: '' };
      this.stack.push(frame);
      this.scanKey(frame);
      return true;
    }
    if (c === '"') {
      this.scanString();
      return false;
    }
    if (c === '-' || (c >= '0' && c <= '9')) {
      this.scanNumber();
      return false;
    }
    for (const word of ['true', 'false', 'null']) {
      if (text.startsWith(word, this.i)) {
        this.i += word.length;
        return false;
      }
    }
    const hint = c === "'" ? ' (strings need double quotes)' : c === '/' ? COMMENT_HINT : '';
    return this.fail(`expected a value, found ${this.describeAt(this.i)}${hint}`);
  }

  private childSegment(): PathSegment | undefined {
    const top = this.stack[this.stack.length - 1];
    if (!top) return undefined;
    return top.kind === 'array' ? top.index : top.key;
  }

  /** After a comma in a list: the next item's value follows. */
  private nextItem(frame: Extract<Frame, { kind: 'array' }>): void {
    frame.index++;
    this.skipWhitespace();
    if (this.text[this.i] === ']') this.fail('expected a value, found "]" (a comma before "]" is not allowed in JSON)');
  }

  /** A property name and its colon; notes a name the object already has. */
  private scanKey(frame: Extract<Frame, { kind: 'object' }>): void {
    const text = this.text;
    this.skipWhitespace();
    if (text[this.i] !== '"') {
      const c = text[this.i];
      const hint =
        c === '}' ? ' (a comma before "}" is not allowed in JSON)' : c === "'" ? ' (names need double quotes)' : c === '/' ? COMMENT_HINT : '';
      this.fail(`expected a property name in double quotes, found ${this.describeAt(this.i)}${hint}`);
    }
    const start = this.i;
    this.scanString();
    const key = JSON.parse(text.slice(start, this.i)) as string;
    if (frame.keys.has(key)) {
      const segments: PathSegment[] = [];
      for (const f of this.stack) if (f.seg !== undefined) segments.push(f.seg);
      segments.push(key);
      this.duplicates.push({ path: formatPath(segments), key, offset: start });
    }
    frame.keys.add(key);
    frame.key = key;
    this.skipWhitespace();
    this.expect(':', "':' after the property name");
  }

  private scanString(): void {
    const text = this.text;
    const start = this.i;
    this.i++; // opening quote
    for (;;) {
      if (this.i >= text.length) this.fail('a string is never closed (missing ")', start);
      const c = text.charCodeAt(this.i);
      if (c === 0x22) {
        this.i++;
        return;
      }
      if (c < 0x20) this.fail('a line break or control character inside a string (strings must be closed on the same line; write \\n for a line break)');
      if (c !== 0x5c) {
        this.i++;
        continue;
      }
      const escape = text[this.i + 1];
      if (escape === 'u') {
        if (!/^[0-9A-Fa-f]{4}$/.test(text.slice(this.i + 2, this.i + 6))) this.fail('\\u must be followed by four hex digits');
        this.i += 6;
      } else if (escape !== undefined && '"\\/bfnrt'.includes(escape)) {
        this.i += 2;
      } else {
        this.fail(`unknown escape \\${escape ?? ''} in a string`);
      }
    }
  }

  private scanNumber(): void {
    const text = this.text;
    if (text[this.i] === '-') this.i++;
    if (text[this.i] === '0') this.i++;
    else this.digits('a digit');
    if (text[this.i] === '.') {
      this.i++;
      this.digits('a digit after the decimal point');
    }
    if (text[this.i] === 'e' || text[this.i] === 'E') {
      this.i++;
      if (text[this.i] === '+' || text[this.i] === '-') this.i++;
      this.digits('a digit in the exponent');
    }
  }

  private digits(what: string): void {
    const text = this.text;
    if (!(text[this.i] >= '0' && text[this.i] <= '9')) this.fail(`expected ${what}, found ${this.describeAt(this.i)}`);
    while (text[this.i] >= '0' && text[this.i] <= '9') this.i++;
  }

  private skipWhitespace(): void {
    const text = this.text;
    while (this.i < text.length) {
      const c = text[this.i];
      if (c !== ' ' && c !== '\t' && c !== '\n' && c !== '\r') return;
      this.i++;
    }
  }

  private expect(char: string, what: string): void {
    if (this.text[this.i] !== char) {
      const hint = this.text[this.i] === '/' ? COMMENT_HINT : '';
      this.fail(`expected ${what}, found ${this.describeAt(this.i)}${hint}`);
    }
    this.i++;
  }

  private describeAt(at: number): string {
    if (at >= this.text.length) return 'the end of the file';
    const word = /^[A-Za-z0-9_.+-]+/.exec(this.text.slice(at, at + 20));
    return JSON.stringify(word ? word[0] : this.text[at]);
  }

  private fail(reason: string, at = this.i): never {
    throw new JsonSyntaxError(at, reason);
  }
}
