/**
 * Every edit of the design is a small action: `perform(design, payload)` returns the new
 * document and the delta that enters the undo history (null: the edit changes nothing).
 * Actions only reshape the document; they never compute kinematics.
 */
import { isTwoSided, mirrorY } from '../../core/design/resolveDesign';
import type { DesignFile, Sided, Vec3Mm } from '../../core/design/types';
import { formatPath, getAt, parsePath, setAt, type DesignPath } from './designPath';
import { changeAt, differingPaths, type Delta } from './history';
import { coordinateTarget, hardpointRows, pointTarget, rowName, splitRowId, type Axis } from './hardpoints';

export interface ActionResult {
  design: DesignFile;
  delta: Delta | null;
}

export interface DesignAction<P> {
  name: string;
  perform(design: DesignFile, payload: P): ActionResult;
}

/**
 * The path a change is recorded at: the first ancestor that did not exist before the edit, so
 * that undo removes what the edit created (an optional section) instead of leaving it empty.
 */
function recordedPath(before: DesignFile, path: DesignPath): DesignPath {
  for (let n = 1; n < path.length; n++) if (getAt(before, path.slice(0, n)) === undefined) return path.slice(0, n);
  return path;
}

function commit(before: DesignFile, after: DesignFile, paths: DesignPath[], label: string): ActionResult {
  const changes = paths.map((p) => changeAt(before, after, recordedPath(before, p))).filter((c) => c !== null);
  if (changes.length === 0) return { design: before, delta: null };
  return { design: after, delta: { label, changes } };
}

export function describeRow(design: DesignFile, rowId: string): string {
  const row = hardpointRows(design).find((r) => r.id === rowId);
  return row ? rowName(row) : rowId;
}

/** One coordinate of one hardpoint row, in mm; a mirrored point moves on both sides. */
export const setCoordinate: DesignAction<{ rowId: string; axis: Axis; value: number }> = {
  name: 'setCoordinate',
  perform(design, { rowId, axis, value }) {
    const { key, side } = splitRowId(rowId);
    const target = coordinateTarget(design, key, side, axis, value);
    const next = setAt(design, target.path, target.value);
    return commit(design, next, [target.path], `edit ${axis} of ${describeRow(design, rowId)}`);
  },
};

/** A whole hardpoint (the gizmo's drag); a mirrored point moves on both sides. */
export const movePoint: DesignAction<{ rowId: string; value: Vec3Mm }> = {
  name: 'movePoint',
  perform(design, { rowId, value }) {
    const { key, side } = splitRowId(rowId);
    const target = pointTarget(design, key, side, value);
    const next = setAt(design, target.path, target.value);
    return commit(design, next, [target.path], `move ${describeRow(design, rowId)}`);
  },
};

/** A mirrored point becomes two independent points (equal to the mirror at first). */
export const unlinkPoint: DesignAction<{ key: string }> = {
  name: 'unlinkPoint',
  perform(design, { key }) {
    const path = key.split('.');
    const raw = getAt(design, path) as Sided<Vec3Mm>;
    if (isTwoSided(raw)) return { design, delta: null };
    const next = setAt(design, path, { right: { ...raw }, left: mirrorY(raw) });
    return commit(design, next, [path], `unlink left and right ${describeRow(design, `${key}.right`).replace(/^right /, '')}`);
  },
};

/** Two points become one mirrored point: the kept side wins. */
export const linkPoint: DesignAction<{ key: string; keep: 'right' | 'left' }> = {
  name: 'linkPoint',
  perform(design, { key, keep }) {
    const path = key.split('.');
    const raw = getAt(design, path) as Sided<Vec3Mm>;
    if (!isTwoSided(raw)) return { design, delta: null };
    const single = keep === 'right' ? { ...raw.right } : mirrorY(raw.left);
    const next = setAt(design, path, single);
    return commit(design, next, [path], `mirror ${describeRow(design, `${key}.${keep}`)} to the other side`);
  },
};

/** Any field of the design sheet by its path; `undefined` removes an optional key. */
export const setField: DesignAction<{ path: string; value: unknown; label?: string }> = {
  name: 'setField',
  perform(design, { path, value, label }) {
    const p = parsePath(path);
    const next = setAt(design, p, value);
    return commit(design, next, [p], label ?? `edit ${formatPath(p)}`);
  },
};

/** Several fields at once, as one undo step (switching the layout or steering kind). */
export const setFields: DesignAction<{ values: { path: string; value: unknown }[]; label: string }> = {
  name: 'setFields',
  perform(design, { values, label }) {
    let next = design;
    const paths: DesignPath[] = [];
    for (const { path, value } of values) {
      const p = parsePath(path);
      next = setAt(next, p, value);
      paths.push(p);
    }
    return commit(design, next, paths, label);
  },
};

/**
 * A whole new design made elsewhere (an applied tune, an accepted proposal, an imported
 * table), as one undo step holding only the values that differ.
 */
export const adoptDesign: DesignAction<{ design: DesignFile; label: string }> = {
  name: 'adoptDesign',
  perform(before, { design, label }) {
    const changes = differingPaths(before, design).map((p) => changeAt(before, design, p)).filter((c) => c !== null);
    if (changes.length === 0) return { design: before, delta: null };
    return { design, delta: { label, changes } };
  },
};
