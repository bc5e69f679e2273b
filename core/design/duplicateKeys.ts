/**
 * Finds keys that appear twice in the same JSON object. JSON.parse keeps the last silently,
 * so a design edited by hand (a hardpoint pasted twice, the second with old numbers) would
 * load with whichever came last. The reader refuses such a file instead, naming the place.
 *
 * Runs on text that JSON.parse has already accepted, so it only has to follow the structure:
 * objects, arrays, strings (with escapes) and bare values.
 */
import { formatPath, type PathSegment } from './schemaDsl';

export interface DuplicateKey {
  /** Path of the key in the document as field messages write it, e.g. `vehicle.wheelbaseMm`. */
  path: string;
  key: string;
  /** Offset in the text of the second occurrence's opening quote. */
  offset: number;
}

interface ObjectFrame {
  kind: 'object';
  /** How this object is reached from its parent (undefined at the top). */
  seg: PathSegment | undefined;
  keys: Set<string>;
  /** The key whose value comes next, once its colon was read. */
  key: string | undefined;
  expectingKey: boolean;
}

interface ArrayFrame {
  kind: 'array';
  seg: PathSegment | undefined;
  index: number;
}

type Frame = ObjectFrame | ArrayFrame;

export function findDuplicateKeys(text: string): DuplicateKey[] {
  const found: DuplicateKey[] = [];
  const stack: Frame[] = [];
  // Each container remembers only its own segment (a copied path per level would make deep
  // nesting quadratic); a path is assembled only for a repeat found.
  const childSeg = (): PathSegment | undefined => {
    const top = stack[stack.length - 1];
    if (!top) return undefined;
    return top.kind === 'array' ? top.index : (top.key ?? '');
  };
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (ch === '{') {
      stack.push({ kind: 'object', seg: childSeg(), keys: new Set(), key: undefined, expectingKey: true });
      i++;
    } else if (ch === '[') {
      stack.push({ kind: 'array', seg: childSeg(), index: 0 });
      i++;
    } else if (ch === '}' || ch === ']') {
      stack.pop();
      i++;
    } else if (ch === ',') {
      const top = stack[stack.length - 1];
      if (top?.kind === 'array') top.index++;
      else if (top) top.expectingKey = true;
      i++;
    } else if (ch === '"') {
      const start = i;
      i++;
      while (i < text.length && text[i] !== '"') i += text[i] === '\\' ? 2 : 1;
      i++; // closing quote
      const top = stack[stack.length - 1];
      if (top?.kind === 'object' && top.expectingKey) {
        const key = JSON.parse(text.slice(start, i)) as string;
        top.expectingKey = false;
        top.key = key;
        if (top.keys.has(key)) {
          const segments: PathSegment[] = [];
          for (const frame of stack) if (frame.seg !== undefined) segments.push(frame.seg);
          segments.push(key);
          found.push({ path: formatPath(segments), key, offset: start });
        }
        top.keys.add(key);
      }
    } else {
      i++; // colon, whitespace, or part of a number, true, false, null
    }
  }
  return found;
}
