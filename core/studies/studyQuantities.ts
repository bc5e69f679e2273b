/**
 * What the studies measure at each pose (quantities) and over all the poses together
 * (objectives), in the terms of the design's tolerances:
 *
 *   per pose    self-steer of each wheel, slip angle of each wheel (toe mismatch), Ackermann
 *               error, steering-ratio change, the margin of every joint, the least of them
 *   objectives  worst |self-steer|, worst |slip|, worst |Ackermann error|, worst |ratio
 *               change| over the poses and wheels; least joint margin over the poses and
 *               joints, and each joint's least margin over the poses
 *
 * An objective's value is found at one pose and quantity (its "active" entry). To first order
 * its rate of change with a hardpoint is that entry's rate times the sign of the entry for a
 * worst |value| (the worst grows when the entry moves away from zero); over a finite move the
 * worst may pass to another entry, which is why the sensitivity differences the objective
 * itself. When two entries tie (a symmetric design leaning either way), the first in pose
 * order is taken.
 */

import type { ResolvedDesign, Side, Tolerances } from '../design/types';
import type { JointName, PoseAnalysis } from '../analysis/analysisTypes';
import { jointWords } from '../analysis/words';

export interface StudyQuantity {
  id: string;
  label: string;
  unit: 'deg' | '%';
  read(a: PoseAnalysis): number | null;
}

export interface StudyObjective {
  id: string;
  label: string;
  unit: 'deg' | '%';
  /** 'worst': the largest |value| of its quantities (smaller is better); 'least': the smallest value (larger is better). */
  kind: 'worst' | 'least';
  /** Indices of its quantities. */
  quantities: number[];
  /** The design's limit for it (a bound on |worst| or a floor on least); null when the design sets none. */
  tolerance: number | null;
}

const SIDES: readonly Side[] = ['left', 'right'];

/** The quantities of a design: every joint it has on each side (the analysis measures all of them). */
export function studyQuantities(design: ResolvedDesign): StudyQuantity[] {
  const qs: StudyQuantity[] = [];
  for (const side of SIDES) qs.push({ id: `selfSteer.${side}`, label: `self-steer, ${side} wheel`, unit: 'deg', read: (a) => a.selfSteer[`${side}Deg`] });
  for (const side of SIDES) qs.push({ id: `slip.${side}`, label: `slip angle (toe mismatch), ${side} wheel`, unit: 'deg', read: (a) => a.slip[side].slipDeg });
  qs.push({ id: 'ackermannError', label: 'Ackermann error (outer wheel against the ideal)', unit: 'deg', read: (a) => a.ackermann.errorDeg });
  qs.push({ id: 'ratioChange', label: 'steering-ratio change from upright', unit: '%', read: (a) => a.steering.ratioChangePct });
  for (const side of SIDES) {
    for (const name of Object.keys(design.joints) as JointName[]) {
      qs.push({ id: `joint.${name}.${side}`, label: `joint margin, ${jointWords(name, side)}`, unit: 'deg', read: (a) => a.joints.find((x) => x.joint === name && x.side === side)?.marginDeg ?? null });
    }
  }
  qs.push({ id: 'leastJointMargin', label: 'least joint margin', unit: 'deg', read: (a) => a.worst.jointMarginDeg });
  return qs;
}

/** The objectives over the poses, from the quantities and the design's tolerances. */
export function studyObjectives(quantities: readonly StudyQuantity[], tol: Tolerances): StudyObjective[] {
  const idx = (pred: (id: string) => boolean) => quantities.flatMap((q, i) => (pred(q.id) ? [i] : []));
  const joints = quantities.flatMap((q, i) => (q.id.startsWith('joint.') ? [{ q, i }] : []));
  return [
    { id: 'selfSteer', label: 'worst self-steer', unit: 'deg', kind: 'worst', quantities: idx((id) => id.startsWith('selfSteer.')), tolerance: tol.selfSteerDeg },
    { id: 'slip', label: 'worst slip angle (toe mismatch)', unit: 'deg', kind: 'worst', quantities: idx((id) => id.startsWith('slip.')), tolerance: tol.slipDeg },
    { id: 'ackermannError', label: 'worst Ackermann error', unit: 'deg', kind: 'worst', quantities: idx((id) => id === 'ackermannError'), tolerance: null },
    { id: 'ratioChange', label: 'worst steering-ratio change', unit: '%', kind: 'worst', quantities: idx((id) => id === 'ratioChange'), tolerance: tol.ratioChangePct },
    { id: 'jointMargin', label: 'least joint margin', unit: 'deg', kind: 'least', quantities: joints.map((j) => j.i), tolerance: tol.jointMarginDeg },
    ...joints.map(({ q, i }) => ({
      id: q.id,
      label: `least ${q.label}`,
      unit: 'deg' as const,
      kind: 'least' as const,
      quantities: [i],
      tolerance: tol.jointMarginDeg,
    })),
  ];
}

/** Where an objective's value is found: the pose, the quantity and the entry's value. */
export interface ActiveEntry {
  value: number;
  pose: number;
  quantity: number;
  /** d(objective) / d(entry): the entry's sign for a worst |value|, 1 for a least value. */
  sign: number;
}

/** The objective's active entry over pose-major values (NaN = not available); null when none is available. */
export function activeEntry(o: StudyObjective, values: ArrayLike<number>, poses: number, nQuantities: number): ActiveEntry | null {
  let best: ActiveEntry | null = null;
  let bestScore = -Infinity;
  for (let p = 0; p < poses; p++) {
    for (const q of o.quantities) {
      const v = values[p * nQuantities + q];
      if (Number.isNaN(v)) continue;
      const score = o.kind === 'worst' ? Math.abs(v) : -v;
      if (score > bestScore) {
        bestScore = score;
        best = { value: v, pose: p, quantity: q, sign: o.kind === 'worst' ? (v < 0 ? -1 : 1) : 1 };
      }
    }
  }
  return best;
}

/** The objective's value: worst |value| or least value; NaN when nothing is available. */
export function objectiveValue(o: StudyObjective, values: ArrayLike<number>, poses: number, nQuantities: number): number {
  const a = activeEntry(o, values, poses, nQuantities);
  return a === null ? NaN : o.kind === 'worst' ? Math.abs(a.value) : a.value;
}

/** Whether a value of the objective is inside the design's tolerance (true when it sets none). */
export function withinTolerance(o: StudyObjective, value: number): boolean {
  if (o.tolerance === null) return true;
  return o.kind === 'worst' ? value <= o.tolerance : value >= o.tolerance;
}

/** The design's tolerances in words, for the objectives that have one. */
export function toleranceWords(o: StudyObjective): string {
  if (o.tolerance === null) return 'no tolerance set';
  return o.kind === 'worst' ? `at most ${o.tolerance} ${o.unit}` : `at least ${o.tolerance} ${o.unit}`;
}
