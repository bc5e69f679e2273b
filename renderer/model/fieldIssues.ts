/** Which validation issues belong to which field of the screen. */
import type { DesignIssue } from '../../core/design/validateDesign';
import type { Side } from '../../core/design/types';
import type { Axis } from './hardpoints';

/** Issues whose path is `path` itself or lies inside it. */
export function issuesAt(issues: readonly DesignIssue[], path: string): DesignIssue[] {
  return issues.filter((i) => i.path === path || i.path.startsWith(`${path}.`) || i.path.startsWith(`${path}[`));
}

/** Issues exactly at one of the paths. */
export function issuesExactly(issues: readonly DesignIssue[], paths: readonly string[]): DesignIssue[] {
  return issues.filter((i) => paths.includes(i.path));
}

/**
 * Issues of one hardpoint coordinate cell: the coordinate itself, the side's point, or the
 * whole (mirrored) point.
 */
export function issuesOfCell(issues: readonly DesignIssue[], key: string, side: Side | null, axis: Axis): DesignIssue[] {
  const paths = side === null ? [key, `${key}.${axis}`] : [key, `${key}.${axis}`, `${key}.${side}`, `${key}.${side}.${axis}`];
  return issuesExactly(issues, paths);
}

/** Issues of a hardpoint row as a whole (not one coordinate). */
export function issuesOfPoint(issues: readonly DesignIssue[], key: string, side: Side | null): DesignIssue[] {
  const paths = side === null ? [key] : [key, `${key}.${side}`];
  return issuesExactly(issues, paths);
}
