/**
 * The outline of a set of grid cells: closed loops along the cell edges that separate cells
 * inside from cells outside (or from the grid's border), so the map can draw the operating
 * region as a dashed line that does not depend on colour. Pure geometry on cell indices; the
 * chart turns corner indices into axis values.
 */

/** A corner of the grid: corner (i, j) is the lower-left corner of cell (i, j). */
export type Corner = [number, number];

/**
 * Loops around the cells for which `inside(i, j)` holds, on an nx x ny grid, each as its
 * corners in order (counter-clockwise, the region on the left; the first corner not repeated),
 * with the corners in the middle of straight runs left out.
 */
export function regionOutline(nx: number, ny: number, inside: (i: number, j: number) => boolean): Corner[][] {
  const isIn = (i: number, j: number) => i >= 0 && j >= 0 && i < nx && j < ny && inside(i, j);
  // Directed boundary edges, region on the left, keyed by their start corner.
  const outgoing = new Map<string, Corner[]>();
  const key = (c: Corner) => `${c[0]},${c[1]}`;
  let count = 0;
  const add = (from: Corner, to: Corner) => {
    const k = key(from);
    const list = outgoing.get(k);
    if (list) list.push(to);
    else outgoing.set(k, [to]);
    count++;
  };
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      if (!isIn(i, j)) continue;
      if (!isIn(i, j - 1)) add([i, j], [i + 1, j]);
      if (!isIn(i + 1, j)) add([i + 1, j], [i + 1, j + 1]);
      if (!isIn(i, j + 1)) add([i + 1, j + 1], [i, j + 1]);
      if (!isIn(i - 1, j)) add([i, j + 1], [i, j]);
    }
  }
  const loops: Corner[][] = [];
  while (count > 0) {
    const [startKey, firstTargets] = [...outgoing.entries()].find(([, v]) => v.length > 0)!;
    const start = startKey.split(',').map(Number) as Corner;
    const loop: Corner[] = [start];
    let at = start;
    let next = firstTargets.shift()!;
    count--;
    while (key(next) !== startKey) {
      const heading: Corner = [next[0] - at[0], next[1] - at[1]];
      at = next;
      loop.push(at);
      const choices = outgoing.get(key(at))!;
      // Where two loops touch at a corner, turn left: each loop then stays simple.
      const left = choices.findIndex((c) => c[0] - at[0] === -heading[1] && c[1] - at[1] === heading[0]);
      next = choices.splice(left >= 0 ? left : 0, 1)[0];
      count--;
    }
    loops.push(withoutStraightRuns(loop));
  }
  return loops;
}

/** Drops each corner that lies on the straight line between its neighbours. */
function withoutStraightRuns(loop: Corner[]): Corner[] {
  const n = loop.length;
  return loop.filter((c, k) => {
    const a = loop[(k + n - 1) % n];
    const b = loop[(k + 1) % n];
    return (c[0] - a[0]) * (b[1] - c[1]) - (c[1] - a[1]) * (b[0] - c[0]) !== 0;
  });
}

/**
 * Axis value of each corner index along a category axis of evenly spaced values: the
 * boundaries between the bands (half a step beyond the first and last value).
 */
export function bandEdges(values: number[]): number[] {
  const n = values.length;
  const step = n > 1 ? (values[n - 1] - values[0]) / (n - 1) : 1;
  return Array.from({ length: n + 1 }, (_, i) => values[0] - step / 2 + i * step);
}
