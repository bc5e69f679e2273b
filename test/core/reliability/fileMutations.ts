/**
 * Mutations of a design file's text, as fast-check arbitraries: damage at the JSON level
 * (delete, duplicate or retype a key, huge numbers, deep nesting, odd key names) and at the
 * text and byte level (flipped bytes, truncation, invalid UTF-8, byte-order marks, line
 * endings, stray characters). Bytes are decoded the way the CLI reads a file
 * (readFileSync(path, 'utf8'): invalid sequences become U+FFFD).
 */
import fc from 'fast-check';

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

export type Mutation =
  | { kind: 'flip'; at: number; byte: number }
  | { kind: 'truncate'; at: number }
  | { kind: 'deleteKey'; pick: number }
  | { kind: 'duplicateKey'; pick: number; value: Json }
  | { kind: 'retype'; pick: number; value: Json }
  | { kind: 'hugeNumber'; pick: number; text: string }
  | { kind: 'nest'; pick: number; depth: number; bracket: 'array' | 'object' }
  | { kind: 'oddKey'; pick: number; key: string }
  | { kind: 'bytes'; at: number; bytes: number[] }
  | { kind: 'bom'; which: 'utf8' | 'utf8-twice' | 'utf8-middle' | 'utf16le' | 'utf16be' }
  | { kind: 'lineEndings'; to: '\r\n' | '\r' }
  | { kind: 'insert'; at: number; text: string }
  | { kind: 'hostileText'; pick: number; text: string };

const HUGE = ['1e400', '-1e400', '1e-400', '123456789012345678901234567890', '9007199254740993', '0.00000000000000000000000000000000001', '-0', '1E+308', '2e308'];
const STRAY = ['//c\n', '/*', ',', '}', ']', '{', '[', '"', "'", 'NaN', 'Infinity', '-', '\\u0000', '\\', '\u0000', '\t', '\u2028', '\uD800', 'true', 'null', ':', '0x10', '+1', '.5', '1.', '01'];
const BYTES = [[0xff], [0xfe], [0xc3, 0x28], [0xe2, 0x82], [0xed, 0xa0, 0x80], [0xf4, 0x90, 0x80, 0x80], [0x00], [0xc0, 0xaf], [0x80], [0xe9]];
/** Text a terminal would act on (ESC and C1 sequences, bidi overrides, carriage returns) and very long text. */
export const HOSTILE_TEXT = [
  '\u001b]0;retitled\u0007',
  '\u001b[2J\u001b[Hscreen cleared',
  '\u001b[31mred\u001b[0m',
  '\u009b31mC1 red',
  'abc\u202edcba',
  'over\rwritten',
  'a\u0000b',
  '\u001b[?1049halternate screen',
  'y'.repeat(20000),
];

const ODD_KEYS = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'prototype', '', ' ', 'x'.repeat(5000), '\u0000', 'ünïcödé', 'Kind', 'KIND', 'kind ', '0'];

const jsonValue: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom<Json>(null, true, false, 0, -1, 1e308, -1e-308, '', '12', 'x', [], {}, [1, 2, 3], { x: 1, y: 2, z: 3 }, { right: 1 }, { left: {} }),
  fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json>,
);

export const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), at: fc.nat(), byte: fc.integer({ min: 0, max: 255 }) }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('deleteKey' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('duplicateKey' as const), pick: fc.nat(), value: jsonValue }),
  fc.record({ kind: fc.constant('retype' as const), pick: fc.nat(), value: jsonValue }),
  fc.record({ kind: fc.constant('hugeNumber' as const), pick: fc.nat(), text: fc.constantFrom(...HUGE) }),
  fc.record({ kind: fc.constant('nest' as const), pick: fc.nat(), depth: fc.constantFrom(2, 50, 600, 20000), bracket: fc.constantFrom('array' as const, 'object' as const) }),
  fc.record({ kind: fc.constant('oddKey' as const), pick: fc.nat(), key: fc.constantFrom(...ODD_KEYS) }),
  fc.record({ kind: fc.constant('bytes' as const), at: fc.nat(), bytes: fc.constantFrom(...BYTES) }),
  fc.record({ kind: fc.constant('bom' as const), which: fc.constantFrom('utf8' as const, 'utf8-twice' as const, 'utf8-middle' as const, 'utf16le' as const, 'utf16be' as const) }),
  fc.record({ kind: fc.constant('lineEndings' as const), to: fc.constantFrom('\r\n' as const, '\r' as const) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), text: fc.constantFrom(...STRAY) }),
  fc.record({ kind: fc.constant('hostileText' as const), pick: fc.nat(), text: fc.constantFrom(...HOSTILE_TEXT) }),
);

export interface FileCase {
  base: number;
  indent: 0 | 2 | '\t' | 'original';
  mutations: Mutation[];
}

export const fileCaseArb = (bases: number): fc.Arbitrary<FileCase> =>
  fc.record({
    base: fc.nat({ max: bases - 1 }),
    indent: fc.constantFrom(0 as const, 2 as const, '\t' as const, 'original' as const),
    mutations: fc.array(mutationArb, { minLength: 1, maxLength: 3 }),
  });

/** Every path to a value in a JSON document (objects and arrays included), root excluded. */
function paths(doc: Json, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  const children: [string | number, Json][] = Array.isArray(doc) ? doc.map((v, i) => [i, v]) : doc !== null && typeof doc === 'object' ? Object.entries(doc) : [];
  for (const [k, v] of children) {
    out.push([...prefix, k]);
    paths(v, [...prefix, k], out);
  }
  return out;
}

function parentOf(doc: Json, path: (string | number)[]): { parent: Record<string, Json> | Json[]; key: string | number } {
  let node = doc as Record<string, Json> | Json[];
  for (const k of path.slice(0, -1)) node = (node as Record<string, Json>)[k as string] as Record<string, Json>;
  return { parent: node, key: path[path.length - 1] };
}

const MARK = '\u0001MUTATION\u0001';

/** Apply the JSON-level mutations, serialise, then apply the text- and byte-level ones. Returns the text a reader would see. */
export function mutateText(originalText: string, c: FileCase): string {
  const doc = JSON.parse(originalText) as Json;
  const textOps: Mutation[] = [];
  const replacements: { mark: string; text: string; inner: string }[] = [];
  const duplicates: { key: string; value: Json }[] = [];
  for (const m of c.mutations) {
    const all = paths(doc);
    const path = all.length > 0 && 'pick' in m ? all[m.pick % all.length] : undefined;
    switch (m.kind) {
      case 'hostileText':
        // Every third one at the design's name, which every command echoes.
        if (m.pick % 3 === 0 && doc !== null && typeof doc === 'object' && !Array.isArray(doc)) {
          (doc as Record<string, Json>).name = m.text;
          break;
        }
        if (path) (parentOf(doc, path).parent as Record<string, Json>)[path[path.length - 1] as string] = m.text;
        break;
      case 'deleteKey':
      case 'retype':
      case 'hugeNumber':
      case 'nest':
      case 'oddKey': {
        if (!path) break;
        const { parent, key } = parentOf(doc, path);
        const p = parent as Record<string, Json>;
        if (m.kind === 'deleteKey') {
          if (Array.isArray(parent)) parent.splice(key as number, 1);
          else delete p[key as string];
        } else if (m.kind === 'retype') {
          p[key as string] = structuredClone(m.value);
        } else if (m.kind === 'hugeNumber' || m.kind === 'nest') {
          const mark = `${MARK}${replacements.length}${MARK}`;
          const inner = JSON.stringify(p[key as string] ?? null);
          const text =
            m.kind === 'hugeNumber'
              ? m.text
              : m.bracket === 'array'
                ? '['.repeat(m.depth) + inner + ']'.repeat(m.depth)
                : '{"a":'.repeat(m.depth) + inner + '}'.repeat(m.depth);
          replacements.push({ mark, text, inner });
          p[key as string] = mark;
        } else if (!Array.isArray(parent)) {
          // add an odd key beside this one (a copy: the two places are independent)
          p[m.key] = structuredClone(p[key as string] ?? null);
        }
        break;
      }
      case 'duplicateKey': {
        if (!path) break;
        const { parent, key } = parentOf(doc, path);
        if (!Array.isArray(parent)) duplicates.push({ key: key as string, value: m.value });
        break;
      }
      default:
        textOps.push(m);
    }
  }
  let text =
    c.indent === 'original' && replacements.length === 0 && duplicates.length === 0 && c.mutations.every((m) => textOps.includes(m))
      ? originalText
      : JSON.stringify(doc, null, c.indent === 'original' ? 2 : c.indent);
  // The bad text in the first place holding the mark; a copy made after it holds the value from before.
  for (const r of replacements) text = text.replace(JSON.stringify(r.mark), r.text).split(JSON.stringify(r.mark)).join(r.inner);
  for (const d of duplicates) {
    const needle = `${JSON.stringify(d.key)}:`;
    const at = text.indexOf(needle);
    if (at >= 0) text = `${text.slice(0, at)}${needle}${JSON.stringify(d.value)},${text.slice(at)}`;
  }

  return mutateBytes(text, textOps);
}

/** Apply only the text- and byte-level mutations to a text (JSON-level ones are ignored). */
export function mutateBytes(text: string, ops: readonly Mutation[]): string {
  let bytes = Buffer.from(text, 'utf8');
  for (const m of ops) {
    switch (m.kind) {
      case 'flip':
        if (bytes.length > 0) bytes[m.at % bytes.length] = m.byte;
        break;
      case 'truncate':
        bytes = bytes.subarray(0, m.at % (bytes.length + 1));
        break;
      case 'bytes': {
        const at = m.at % (bytes.length + 1);
        bytes = Buffer.concat([bytes.subarray(0, at), Buffer.from(m.bytes), bytes.subarray(at)]);
        break;
      }
      case 'bom': {
        const s = bytes.toString('utf8');
        if (m.which === 'utf8') bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), bytes]);
        else if (m.which === 'utf8-twice') bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf]), bytes]);
        else if (m.which === 'utf8-middle') {
          const at = Math.floor(bytes.length / 2);
          bytes = Buffer.concat([bytes.subarray(0, at), Buffer.from([0xef, 0xbb, 0xbf]), bytes.subarray(at)]);
        } else if (m.which === 'utf16le') bytes = Buffer.from(`\ufeff${s}`, 'utf16le');
        else {
          const le = Buffer.from(`\ufeff${s}`, 'utf16le');
          bytes = Buffer.from(le);
          for (let i = 0; i + 1 < bytes.length; i += 2) [bytes[i], bytes[i + 1]] = [le[i + 1], le[i]];
        }
        break;
      }
      case 'lineEndings':
        bytes = Buffer.from(bytes.toString('utf8').replace(/\n/g, m.to), 'utf8');
        break;
      case 'insert': {
        const s = bytes.toString('utf8');
        const at = m.at % (s.length + 1);
        bytes = Buffer.from(s.slice(0, at) + m.text + s.slice(at), 'utf8');
        break;
      }
      default:
        break;
    }
  }
  return bytes.toString('utf8');
}
