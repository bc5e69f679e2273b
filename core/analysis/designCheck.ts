/**
 * Checking a design over its envelope: sweep design.envelope and keep, for each tolerance,
 * each joint and each clearance pair, the worst value and where it occurs, judged against
 * the design's tolerances (tolerance.ts). Made for `tiltbench check` and for CI of designs.
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { clearancePairs } from './clearance';
import { envelopeAxes, runSweep, type SweepAxes, type SweepCell, type SweepContact, type SweepSummary } from './sweep';
import { judgeClearance, judgeJoint, judgeRatioChange, judgeSelfSteer, judgeSlip, judgeTransmission, type Verdict } from './tolerance';
import { JOINT_WORDS, PART_WORDS } from './words';
import { TIE_ROD_SPIN_TREATMENT } from './jointArticulation';
import { steerLimits, type LeanLimits } from './limits';

export interface CheckWhere {
  leanDeg: number;
  handlebarDeg: number;
  travelMm: number;
}

export interface CheckItem {
  id: string;
  group: 'tolerance' | 'joint' | 'clearance' | 'linkage';
  label: string;
  unit: 'deg' | 'mm' | '%' | 'poses';
  /** The worst value met (signed where the measure has a sign); null if never measured. */
  worst: number | null;
  where: CheckWhere | null;
  /** What is allowed, in words with the number. */
  limit: string;
  verdict: Verdict;
  /** Extra words: the margin of a joint, the solver's message for a pose that failed. */
  detail?: string;
}

export interface DesignCheck {
  design: string;
  contact: SweepContact;
  axes: SweepAxes;
  items: CheckItem[];
  /** True when no item is over its limit or broken (close is allowed). */
  passed: boolean;
  /** Plain facts worth printing beside the table (turning circle at full lock, treatments). */
  info: string[];
  /**
   * Handlebar angle each way at which the first limit (joint rating, clearance, dead centre,
   * failure to close) is met, at lean -L, -L/2, 0, L/2, L (zero travel); searched up to twice
   * the envelope's lock. Information: the items above already judge the envelope itself.
   */
  limits: LeanLimits[];
  summary: SweepSummary;
}

interface Acc {
  item: CheckItem;
  /** Compare by this (larger = worse). */
  score: number;
}

export class CheckAccumulator {
  private readonly design: ResolvedDesign;
  private readonly accs = new Map<string, Acc>();
  private failedCount = 0;
  private firstFailure: { where: CheckWhere; message: string } | null = null;
  private bestTurn: Record<Side, { kerb: number; wall: number; where: CheckWhere } | null> = { left: null, right: null };

  constructor(design: ResolvedDesign) {
    this.design = design;
    const tol = design.tolerances;
    const add = (id: string, group: CheckItem['group'], label: string, unit: CheckItem['unit'], limit: string) =>
      this.accs.set(id, { item: { id, group, label, unit, worst: null, where: null, limit, verdict: 'within' }, score: -Infinity });
    for (const side of ['left', 'right'] as Side[]) add(`selfSteer.${side}`, 'tolerance', `self-steer (lean and bump steer), ${side}`, 'deg', `|x| <= ${tol.selfSteerDeg} deg`);
    add('ratioChange', 'tolerance', 'steering-ratio change from upright', '%', `|x| <= ${tol.ratioChangePct} %`);
    for (const side of ['left', 'right'] as Side[]) add(`slip.${side}`, 'tolerance', `slip angle (toe mismatch), ${side}`, 'deg', `|x| <= ${tol.slipDeg} deg`);
    for (const side of ['left', 'right'] as Side[]) {
      for (const name of ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const) {
        const j = design.joints[name];
        const kind = j.kind === 'rodEnd' ? 'rod end' : 'ball joint';
        add(`joint.${name}.${side}`, 'joint', `${JOINT_WORDS[name]}, ${side} (${kind})`, 'deg', `<= ${j.ratedDeg - tol.jointMarginDeg} deg (rated ${j.ratedDeg}, margin ${tol.jointMarginDeg})`);
      }
    }
    for (const p of clearancePairs(design)) add(`clearance.${p.id}.${p.side}`, 'clearance', `clearance ${PART_WORDS[p.a]} to ${PART_WORDS[p.b]}, ${p.side}`, 'mm', `>= ${tol.clearanceMm} mm`);
    add('deadCentre', 'linkage', 'dead-centre margin (smallest transmission angle)', 'deg', '> 0 deg');
    add('assembly', 'linkage', 'poses that cannot be assembled', 'poses', '0');
  }

  private update(id: string, value: number, score: number, where: CheckWhere): void {
    const acc = this.accs.get(id);
    if (!acc || !(score > acc.score)) return;
    acc.score = score;
    acc.item.worst = value;
    acc.item.where = where;
  }

  add(cell: SweepCell): void {
    const where = { leanDeg: cell.leanDeg, handlebarDeg: cell.handlebarDeg, travelMm: cell.travelMm };
    if (!cell.ok) {
      this.failedCount++;
      if (!this.firstFailure) this.firstFailure = { where, message: cell.failure.solver.message };
      return;
    }
    const a: PoseAnalysis = cell.analysis;
    for (const side of ['left', 'right'] as Side[]) {
      const e = a.selfSteer[`${side}Deg`];
      if (e !== null) this.update(`selfSteer.${side}`, e, Math.abs(e), where);
      const s = a.slip[side].slipDeg;
      this.update(`slip.${side}`, s, Math.abs(s), where);
    }
    const rc = a.steering.ratioChangePct;
    if (rc !== null) this.update('ratioChange', rc, Math.abs(rc), where);
    for (const j of a.joints) this.update(`joint.${j.joint}.${j.side}`, j.articulationDeg, j.articulationDeg, where);
    for (const c of a.clearances) this.update(`clearance.${c.pair}.${c.side}`, c.distanceMm, -c.distanceMm, where);
    this.update('deadCentre', a.worst.transmissionDeg, -a.worst.transmissionDeg, where);
    const tc = a.turningCircle;
    if (cell.leanDeg === 0 && cell.travelMm === 0 && tc.outerSide && tc.kerbToKerbMm !== null && tc.wallToWallMm !== null) {
      const turn: Side = tc.outerSide === 'right' ? 'left' : 'right';
      const best = this.bestTurn[turn];
      if (!best || tc.kerbToKerbMm < best.kerb) this.bestTurn[turn] = { kerb: tc.kerbToKerbMm, wall: tc.wallToWallMm, where };
    }
  }

  result(): { items: CheckItem[]; passed: boolean; info: string[] } {
    const tol = this.design.tolerances;
    const items: CheckItem[] = [];
    for (const [id, acc] of this.accs) {
      const it = acc.item;
      const w = it.worst;
      if (id === 'assembly') {
        it.worst = this.failedCount;
        it.where = this.firstFailure?.where ?? null;
        it.verdict = this.failedCount > 0 ? 'broken' : 'within';
        if (this.firstFailure) it.detail = `first: ${this.firstFailure.message}`;
      } else if (w === null) {
        it.verdict = 'within';
        it.detail = 'not measured (no pose solved, or no reference pose)';
      } else if (it.group === 'tolerance') {
        it.verdict = id.startsWith('slip') ? judgeSlip(w, tol) : id === 'ratioChange' ? judgeRatioChange(w, tol) : judgeSelfSteer(w, tol);
      } else if (it.group === 'joint') {
        const name = id.split('.')[1] as keyof ResolvedDesign['joints'];
        const rated = this.design.joints[name].ratedDeg;
        it.verdict = judgeJoint(w, rated, tol);
        it.detail = `margin ${(rated - w).toFixed(1)} deg${w > rated ? ' (over its rating)' : ''}`;
      } else if (it.group === 'clearance') {
        it.verdict = judgeClearance(w, tol);
        if (w < 0) it.detail = 'the modelled parts intersect';
      } else if (id === 'deadCentre') {
        it.verdict = judgeTransmission(w);
      }
      items.push(it);
    }
    const info: string[] = [];
    for (const turn of ['left', 'right'] as Side[]) {
      const b = this.bestTurn[turn];
      if (b) {
        info.push(
          `turning circle, ${turn} turn at lean 0 (handlebar ${b.where.handlebarDeg.toFixed(1)} deg): ` +
            `kerb to kerb ${(b.kerb / 1000).toFixed(2)} m, wall to wall ${(b.wall / 1000).toFixed(2)} m (SAE J695)`,
        );
      }
    }
    info.push(TIE_ROD_SPIN_TREATMENT);
    return { items, passed: items.every((i) => i.verdict !== 'over' && i.verdict !== 'broken'), info };
  }
}

export interface CheckOptions {
  contact?: SweepContact;
  steps?: { leanDeg?: number; handlebarDeg?: number; travelMm?: number };
  onProgress?: (done: number, total: number) => void;
}

export function checkDesign(design: ResolvedDesign, options: CheckOptions = {}): DesignCheck {
  const contact = options.contact ?? 'ground';
  const axes = envelopeAxes(design, options.steps, contact);
  const acc = new CheckAccumulator(design);
  const summary = runSweep(design, axes, { contact, onProgress: options.onProgress }, (c) => acc.add(c));
  const { items, passed, info } = acc.result();
  const L = design.vehicle.tilting ? design.envelope.leanDeg : 0;
  const leans = L > 0 ? [-L, -L / 2, 0, L / 2, L] : [0];
  const limits = steerLimits(design, leans, {
    contact,
    stepDeg: Math.max(0.5, design.envelope.handlebarDeg / 25),
    maxHandlebarDeg: Math.max(10, 2 * design.envelope.handlebarDeg),
    toleranceDeg: 0.05,
  });
  if (contact === 'ground' && design.frontEnd.kind === 'centrePivot' && (design.envelope.bumpMm > 0 || design.envelope.reboundMm > 0)) {
    info.unshift('travel not swept: a centre-pivot front end on the ground has its ride height set by the linkage');
  }
  return { design: design.name, contact, axes, items, passed, info, limits, summary };
}
