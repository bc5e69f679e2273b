/**
 * Collecting the issues of the checks across fields: points that must be apart, points that
 * must lie off a line, each named by the path a user would fix.
 */
import { dist, distanceToLine, norm, sub, tuple } from '../math/vec3';
import type { DesignIssue } from './designIssue';
import { isTwoSided } from './resolveDesign';
import { roundForMessage } from './schemaDsl';
import type { PerSide, Side, Sided, Vec3Mm } from './types';

/** Below this, two points that must define a line or a length count as coincident. */
export const MIN_DISTINCT_MM = 1;

/** A point (as resolved) together with the path a user would fix; `side` for per-side points. */
export interface Located {
  path: string;
  at: Vec3Mm;
  side?: Side;
}

/** The path of one side of a sided field: the field itself when written as one mirrored value. */
export function sidePath(raw: Sided<unknown>, base: string, side: Side): string {
  return isTwoSided(raw) ? `${base}.${side}` : base;
}

export function locate(raw: Sided<Vec3Mm>, resolved: PerSide<Vec3Mm>, base: string, side: Side): Located {
  return { path: sidePath(raw, base, side), at: resolved[side], side };
}

export function fixed(at: Vec3Mm, path: string): Located {
  return { path, at };
}

/**
 * Issues from checks that run once per side. A value written once (mirrored) usually fails
 * on both sides alike: it is reported once. An issue found on one side only says which side,
 * unless its path already does (`....left`).
 */
export class IssueList {
  private readonly entries: { issue: DesignIssue; side?: Side }[] = [];

  add(issue: DesignIssue, side?: Side): void {
    this.entries.push({ issue, side });
  }

  /** An issue whose message is `path: expected ..., found ...`. */
  expected(path: string, expected: string, found: string, side?: Side): void {
    this.add({ path, message: `${path}: expected ${expected}, found ${found}`, expected, found }, side);
  }

  get issues(): DesignIssue[] {
    const result: DesignIssue[] = [];
    const emitted = new Set<string>();
    for (const { issue, side } of this.entries) {
      if (emitted.has(issue.message)) continue;
      emitted.add(issue.message);
      const onBothSides = this.entries.some((e) => e.issue.message === issue.message && e.side !== side);
      const pathNamesSide = side !== undefined && `${issue.path}.`.includes(`.${side}.`);
      if (side === undefined || onBothSides || pathNamesSide) {
        result.push(issue);
      } else {
        const prefix = `${issue.path}: `;
        result.push({ ...issue, message: `${prefix}on the ${side} side, ${issue.message.slice(prefix.length)}` });
      }
    }
    return result;
  }

  distinct(a: Located, b: Located, why: string): void {
    const d = dist(tuple(a.at), tuple(b.at));
    if (d >= MIN_DISTINCT_MM) return;
    const found = `${roundForMessage(d)} mm`;
    this.add(
      {
        path: b.path,
        message: `${b.path}: is ${found} from ${a.path}; ${why}, so they must be at least ${MIN_DISTINCT_MM} mm apart`,
        expected: `at least ${MIN_DISTINCT_MM} mm from ${a.path}`,
        found,
      },
      a.side ?? b.side,
    );
  }

  offLine(p: Located, through: Located, towards: Located | { direction: Vec3Mm; path: string }, why: string): void {
    const direction = 'direction' in towards ? tuple(towards.direction) : sub(tuple(towards.at), tuple(through.at));
    if (norm(direction) === 0) return; // reported by distinct() or the schema already
    const d = distanceToLine(tuple(p.at), tuple(through.at), direction);
    if (d >= MIN_DISTINCT_MM) return;
    const line = `the line through ${through.path} and ${towards.path}`;
    const found = `${roundForMessage(d)} mm`;
    this.add(
      {
        path: p.path,
        message: `${p.path}: is ${found} from ${line}; ${why}, so it must be at least ${MIN_DISTINCT_MM} mm off that line`,
        expected: `at least ${MIN_DISTINCT_MM} mm from ${line}`,
        found,
      },
      p.side ?? through.side,
    );
  }
}
