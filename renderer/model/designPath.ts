/**
 * Reading and writing one value of a design document by its path, without changing the
 * document: every write returns a new document that shares the untouched branches.
 * Paths are the ones core's validator reports (`frontEnd.upper.outerJoint.right.z`).
 */

export type PathSegment = string | number;
export type DesignPath = readonly PathSegment[];

/** `'a.b[2].c'` -> `['a', 'b', 2, 'c']`. */
export function parsePath(text: string): PathSegment[] {
  if (text === '') return [];
  const out: PathSegment[] = [];
  for (const part of text.split('.')) {
    const m = /^([^[\]]*)((?:\[\d+\])*)$/.exec(part);
    if (!m) {
      out.push(part);
      continue;
    }
    if (m[1] !== '') out.push(m[1]);
    for (const idx of m[2].matchAll(/\[(\d+)\]/g)) out.push(Number(idx[1]));
  }
  return out;
}

export function formatPath(path: DesignPath): string {
  let s = '';
  for (const seg of path) s += typeof seg === 'number' ? `[${seg}]` : s === '' ? seg : `.${seg}`;
  return s;
}

export function getAt(root: unknown, path: DesignPath): unknown {
  let node: unknown = root;
  for (const seg of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<PathSegment, unknown>)[seg];
  }
  return node;
}

/** A copy of `root` with the value at `path` replaced; `undefined` removes the key. */
export function setAt<T>(root: T, path: DesignPath, value: unknown): T {
  if (path.length === 0) return value as T;
  const [head, ...rest] = path;
  const node = (root ?? (typeof head === 'number' ? [] : {})) as Record<PathSegment, unknown>;
  const child = setAt(node[head], rest, value);
  if (Array.isArray(node)) {
    const copy = node.slice();
    copy[head as number] = child;
    return copy as T;
  }
  const copy: Record<PathSegment, unknown> = { ...node };
  if (child === undefined) delete copy[head];
  else copy[head] = child;
  return copy as T;
}

/** Deep copy of plain JSON data. */
export function cloneJson<T>(value: T): T {
  return value === undefined ? value : (JSON.parse(JSON.stringify(value)) as T);
}

export function jsonEqual(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}
