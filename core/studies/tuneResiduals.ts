/**
 * The optimiser's residuals: what a tuning plan asks for, sampled at the study poses, each
 * scaled so that 1 means "at the design's tolerance" and weighted by sqrt(weight), so the sum
 * of squares weighs the objectives as the plan says:
 *
 *   self-steer, slip     per wheel and pose, value / tolerance
 *   ratio change         per pose, value / tolerance
 *   Ackermann            per upright turning pose, (percent - target) / 10 %
 *   steering ratio       per upright turning pose, (overall ratio - target) / (5 % of target)
 *
 * Constraints are hinge penalties (zero while kept, growing linearly once broken, weight
 * PENALTY): each joint's margin below the design's margin (per joint and side), the smallest
 * clearance below the design's clearance, the smallest transmission angle below the floor. A
 * pose a moved design cannot assemble puts NOT_ASSEMBLED in every residual of that pose: a
 * step into it always looks worse than any design that assembles.
 *
 * The scales 10 % and 5 % are ours: what a designer would call "one unit off" for those two
 * targets (common practice, no source). Values the analysis leaves absent at a pose (straight
 * ahead: no Ackermann percentage, no overall ratio) add nothing there.
 */

import type { JointName, PoseAnalysis } from '../analysis/analysisTypes';
import type { ResolvedDesign, Side } from '../design/types';
import { JOINT_WORDS, jointWords } from '../analysis/words';
import type { StudyPose } from './studyPoses';
import type { StudyQuantity } from './studyQuantities';
import type { TuneConstraints, TuneObjective } from './tunePlan';

/** Scale of an Ackermann-percentage residual, %. */
export const ACKERMANN_SCALE_PCT = 10;
/** Scale of a steering-ratio residual, as a share of the target. */
export const RATIO_SCALE_SHARE = 0.05;
/** Weight of a broken constraint per unit (deg or mm) past its limit. */
export const PENALTY = 10;
/** Every residual of a pose that cannot be assembled. */
export const NOT_ASSEMBLED = 100;

const SIDES: readonly Side[] = ['left', 'right'];

/** What one residual reads from a pose's analysis: the quantity's raw value (null where absent). */
export interface ResidualTerm {
  label: string;
  /** Objective ('objective') or constraint ('constraint'); which objective or constraint it belongs to. */
  group: 'objective' | 'constraint';
  of: string;
  read(a: PoseAnalysis): number | null;
  /** Raw value -> residual (0 where the value is absent). */
  scale(v: number): number;
  /** Whether this term applies at this pose (upright poses only for the targets). */
  at(p: StudyPose): boolean;
  /** The line of the report it counts in: its worst |value - target| or least value over the poses, against its limit. */
  summary: SummaryKey;
}

export interface SummaryKey {
  id: string;
  label: string;
  unit: 'deg' | '%' | 'mm' | '';
  kind: 'worst' | 'least';
  target: number;
  /** Largest allowed |value - target| (worst) or smallest allowed value (least); null when none. */
  limit: number | null;
}

const always = () => true;
const upright = (p: StudyPose) => p.leanDeg === 0 && p.travelMm === 0;
const hinge = (s: number) => (s > 0 ? PENALTY * s : 0);

/** The terms a plan's objectives and constraints give for this design. */
export function residualTerms(design: ResolvedDesign, objectives: readonly TuneObjective[], constraints: TuneConstraints): ResidualTerm[] {
  const tol = design.tolerances;
  const terms: ResidualTerm[] = [];
  for (const o of objectives) {
    const w = Math.sqrt(o.weight);
    if (o.measure === 'selfSteer') {
      for (const s of SIDES) terms.push({ label: `self-steer, ${s} wheel`, group: 'objective', of: o.measure, read: (a) => a.selfSteer[`${s}Deg`], scale: (v) => (w * v) / tol.selfSteerDeg, at: always, summary: worst('selfSteer', 'worst self-steer', 'deg', 0, tol.selfSteerDeg) });
    } else if (o.measure === 'slip') {
      for (const s of SIDES) terms.push({ label: `slip angle, ${s} wheel`, group: 'objective', of: o.measure, read: (a) => a.slip[s].slipDeg, scale: (v) => (w * v) / tol.slipDeg, at: always, summary: worst('slip', 'worst slip angle (toe mismatch)', 'deg', 0, tol.slipDeg) });
    } else if (o.measure === 'ratioChange') {
      terms.push({ label: 'steering-ratio change', group: 'objective', of: o.measure, read: (a) => a.steering.ratioChangePct, scale: (v) => (w * v) / tol.ratioChangePct, at: always, summary: worst('ratioChange', 'worst steering-ratio change', '%', 0, tol.ratioChangePct) });
    } else if (o.measure === 'ackermann') {
      const target = o.target ?? 100;
      terms.push({ label: 'Ackermann percentage', group: 'objective', of: o.measure, read: (a) => a.ackermann.percent, scale: (v) => (w * (v - target)) / ACKERMANN_SCALE_PCT, at: upright, summary: worst('ackermann', `worst Ackermann percentage off ${target} % (upright)`, '%', target, null) });
    } else {
      const target = o.target!;
      terms.push({ label: 'overall steering ratio', group: 'objective', of: o.measure, read: (a) => a.steering.overallRatio, scale: (v) => (w * (v - target)) / (RATIO_SCALE_SHARE * target), at: upright, summary: worst('steeringRatio', `worst steering ratio off ${target} (upright)`, '', target, null) });
    }
  }
  if (constraints.jointMargin) {
    for (const s of SIDES) {
      for (const name of Object.keys(design.joints) as JointName[]) {
        terms.push({
          label: `joint margin, ${jointWords(name, s)}`,
          group: 'constraint',
          of: 'jointMargin',
          read: (a) => a.joints.find((j) => j.joint === name && j.side === s)?.marginDeg ?? null,
          scale: (v) => hinge(tol.jointMarginDeg - v),
          at: always,
          summary: least(`joint.${name}`, `least margin, ${JOINT_WORDS[name]} (either side)`, 'deg', tol.jointMarginDeg),
        });
      }
    }
  }
  if (constraints.clearance) {
    terms.push({ label: 'least clearance', group: 'constraint', of: 'clearance', read: (a) => finiteOrNull(a.worst.clearanceMm), scale: (v) => hinge(tol.clearanceMm - v), at: always, summary: least('clearance', 'least clearance', 'mm', tol.clearanceMm) });
  }
  const floor = constraints.transmissionFloorDeg;
  terms.push({ label: 'least transmission angle', group: 'constraint', of: 'transmission', read: (a) => finiteOrNull(a.worst.transmissionDeg), scale: (v) => hinge(floor - v), at: always, summary: least('transmission', 'least transmission angle', 'deg', floor) });
  return terms;
}

function worst(id: string, label: string, unit: SummaryKey['unit'], target: number, limit: number | null): SummaryKey {
  return { id, label, unit, kind: 'worst', target, limit };
}

function least(id: string, label: string, unit: SummaryKey['unit'], limit: number): SummaryKey {
  return { id, label, unit, kind: 'least', target: 0, limit };
}

function finiteOrNull(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

/** The terms as study quantities, so measureAtPoses reads them in one pass per pose. */
export function termQuantities(terms: readonly ResidualTerm[]): StudyQuantity[] {
  return terms.map((t, i) => ({ id: `term.${i}`, label: t.label, unit: 'deg', read: t.read }));
}

/**
 * Residuals from the raw values (pose-major, NaN where absent) and the poses that failed.
 * Length poses x terms, fixed for a plan so the optimiser sees one vector shape throughout.
 */
export function residualVector(terms: readonly ResidualTerm[], poses: readonly StudyPose[], values: Float64Array, failedPoses: ReadonlySet<number>, out: Float64Array): Float64Array {
  const T = terms.length;
  for (let p = 0; p < poses.length; p++) {
    for (let t = 0; t < T; t++) {
      const k = p * T + t;
      if (failedPoses.has(p)) {
        out[k] = NOT_ASSEMBLED;
        continue;
      }
      const v = values[k];
      out[k] = Number.isNaN(v) || !terms[t].at(poses[p]) ? 0 : terms[t].scale(v);
    }
  }
  return out;
}
