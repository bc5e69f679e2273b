/**
 * Checking a design over its envelope: sweep design.envelope and keep, for each tolerance,
 * each joint and each clearance pair, the worst value and where it occurs, judged against
 * the design's tolerances (tolerance.ts); besides each side's pairs, the two front tyres are kept
 * apart across the vehicle. Two sections from one sweep: the operating region
 * (the poses balanced turns within the riding block reach, ridingRegion.ts), which decides by
 * default, and the full grid, which `--region full` makes decide. Made for `tiltbench check`
 * and for CI of designs.
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { clearancePairs, crownCircleOf, tyreToTyreDistance } from './clearance';
import { envelopeAxes, runSweep, type SweepAxes, type SweepCell, type SweepContact, type SweepSummary } from './sweep';
import { judgeClearance, judgeJoint, judgeLeanStop, judgeRatioChange, judgeSelfSteer, judgeSlip, judgeTransmission, type Verdict } from './tolerance';

export { judgeLeanStop } from './tolerance';
import { JOINT_WORDS, PART_WORDS } from './words';
import type { FindingSubject } from './poseVerdict';
import { TIE_ROD_SPIN_TREATMENT } from './jointArticulation';
import { steerLimits, type LeanLimits } from './limits';
import { PoseEngine } from './PoseEngine';

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
  /**
   * Where it is first exceeded (over its limit, or a pose that cannot be assembled): of the
   * poses where it is, the one nearest the design pose (upright, straight ahead, no travel),
   * nearness measured as the largest of |lean|, |handlebar| and |travel| each over its envelope
   * (the pose a rider reaches first leaning, steering or hitting a bump from straight ahead);
   * null when it never is.
   */
  firstOver: CheckWhere | null;
  /** What the item is about, to point at it (null for the count of poses that cannot be assembled). */
  subject: FindingSubject | null;
}

/** One judged set of poses: the operating region, or the whole lean x handlebar x travel grid. */
export interface CheckSection {
  region: CheckRegion;
  /** Poses of the grid in this section. */
  poses: number;
  items: CheckItem[];
  /** True when no item is over its limit or broken (close is allowed). */
  passed: boolean;
}

/** 'operating': the poses balanced turns reach (ridingRegion.ts); 'full': the whole grid. */
export type CheckRegion = 'operating' | 'full';

/**
 * What the grid's travel axis is. Wheel-centre travel relative to the frame (bump +) on most
 * designs; on a design with a lean linkage and the tyres on the ground it is the spring's
 * travel instead (the heave input drives the carrier there: a grid value t sets heave -t, the
 * spring compressed t mm), which is not the wheels' travel (the motion ratio lies between), so
 * every place that prints a travel value names it as spring travel.
 */
export interface TravelAxis {
  kind: 'wheel' | 'spring';
  /** The axis's name in a where-column or "first exceeded at" text: "travel" or "spring travel". */
  name: string;
  /** One sentence for notes and headers; null for plain wheel travel. */
  note: string | null;
}

export function travelAxisOf(design: ResolvedDesign, contact: SweepContact): TravelAxis {
  if (contact === 'ground' && design.leanLinkage) {
    return {
      kind: 'spring',
      name: 'spring travel',
      note:
        'the travel axis is the lean linkage\'s spring travel (compression +, mm of spring, not of wheel travel: the motion ratio lies between; `tiltbench pose` prints it), because on the ground the heave input drives the carrier',
    };
  }
  return { kind: 'wheel', name: 'travel', note: null };
}

export interface DesignCheck {
  design: string;
  contact: SweepContact;
  axes: SweepAxes;
  /** What the axes' travel values are (wheel-centre or, with a lean linkage, spring travel). */
  travelAxis: TravelAxis;
  /** Which section decides `passed` (and whose items `items` are). */
  judged: CheckRegion;
  operating: CheckSection;
  full: CheckSection;
  /** The judged section's items. */
  items: CheckItem[];
  /** The judged section passed. */
  passed: boolean;
  /** The riding assumptions that define the operating region. */
  riding: ResolvedDesign['riding'];
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

/** The check item of a lean linkage's rocker against its stops. */
export const LEAN_STOP_ID = 'linkage.leanStop';

/** The check item that keeps the two front tyres apart (left to right). */
export const ACROSS_ID = 'clearance.tyre-tyre.across';

/** Surface distance from the left front tyre to the right one in a solved pose, mm. */
export function acrossClearance(a: PoseAnalysis, design: ResolvedDesign): number {
  const tyre = design.wheels.front;
  return tyreToTyreDistance(crownCircleOf(a.wheels.left, tyre), crownCircleOf(a.wheels.right, tyre), tyre.crownRadiusMm);
}

interface Acc {
  item: CheckItem;
  /** Compare by this (larger = worse). */
  score: number;
  /** Nearness of firstOver to the design pose (smaller = nearer). */
  firstDistance: number;
}

export class CheckAccumulator {
  private readonly design: ResolvedDesign;
  private readonly accs = new Map<string, Acc>();
  private failedCount = 0;
  private firstFailure: { where: CheckWhere; message: string } | null = null;
  private poses = 0;
  /** Turning circles at lean 0 and travel 0, per turn direction, for the info lines. */
  private turns: Record<Side, { kerb: number; wall: number; where: CheckWhere }[]> = { left: [], right: [] };

  constructor(design: ResolvedDesign) {
    this.design = design;
    const tol = design.tolerances;
    const add = (id: string, group: CheckItem['group'], label: string, unit: CheckItem['unit'], limit: string, subject: FindingSubject | null) =>
      this.accs.set(id, { item: { id, group, label, unit, worst: null, where: null, limit, verdict: 'within', firstOver: null, subject }, score: -Infinity, firstDistance: Infinity });
    for (const side of ['left', 'right'] as Side[]) add(`selfSteer.${side}`, 'tolerance', `self-steer (lean and bump steer), ${side}`, 'deg', `|x| <= ${tol.selfSteerDeg} deg`, { kind: 'wheel', side });
    add('ratioChange', 'tolerance', 'steering-ratio change from upright', '%', `|x| <= ${tol.ratioChangePct} %`, { kind: 'steering' });
    for (const side of ['left', 'right'] as Side[]) add(`slip.${side}`, 'tolerance', `slip angle (toe mismatch), ${side}`, 'deg', `|x| <= ${tol.slipDeg} deg`, { kind: 'wheel', side });
    for (const side of ['left', 'right'] as Side[]) {
      for (const name of ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const) {
        const j = design.joints[name];
        const kind = j.kind === 'rodEnd' ? 'rod end' : 'ball joint';
        add(`joint.${name}.${side}`, 'joint', `${JOINT_WORDS[name]}, ${side} (${kind})`, 'deg', `<= ${j.ratedDeg - tol.jointMarginDeg} deg (rated ${j.ratedDeg}, margin ${tol.jointMarginDeg})`, { kind: 'joint', joint: name, side });
      }
    }
    for (const p of clearancePairs(design)) add(`clearance.${p.id}.${p.side}`, 'clearance', `clearance ${PART_WORDS[p.a]} to ${PART_WORDS[p.b]}, ${p.side}`, 'mm', `>= ${tol.clearanceMm} mm`, { kind: 'clearance', pair: p.id, side: p.side });
    add(ACROSS_ID, 'clearance', 'clearance left tyre to right tyre (across the vehicle)', 'mm', `>= ${tol.clearanceMm} mm`, { kind: 'wheel', side: 'left' });
    add('deadCentre', 'linkage', 'dead-centre margin (smallest transmission angle)', 'deg', '> 0 deg', { kind: 'deadCentre' });
    const lean = design.leanLinkage;
    if (lean) add(LEAN_STOP_ID, 'linkage', 'lean stops (rocker angle relative to its carrier, either way)', 'deg', `<= ${lean.rocker.stopDeg} deg (the rocker's stops)`, null);
    add('assembly', 'linkage', 'poses that cannot be assembled', 'poses', '0', null);
  }

  private update(id: string, value: number, score: number, where: CheckWhere, verdict?: Verdict): void {
    const acc = this.accs.get(id);
    if (!acc) return;
    if (verdict === 'over' || verdict === 'broken') this.exceeded(acc, where);
    if (!(score > acc.score)) return;
    acc.score = score;
    acc.item.worst = value;
    acc.item.where = where;
  }

  /** Nearness of a pose to the design pose, each input over its envelope (see CheckItem.firstOver). */
  private distance(w: CheckWhere): number {
    const e = this.design.envelope;
    const over = (x: number, range: number) => (x === 0 ? 0 : range > 0 ? Math.abs(x) / range : Infinity);
    const travelRange = w.travelMm >= 0 ? e.bumpMm : e.reboundMm;
    // Ties (the same largest share) go to the smaller sum, then to the first met.
    const parts = [over(w.leanDeg, e.leanDeg), over(w.handlebarDeg, e.handlebarDeg), over(w.travelMm, travelRange)];
    return Math.max(...parts) + 1e-6 * (parts[0] + parts[1] + parts[2]);
  }

  private exceeded(acc: Acc, where: CheckWhere): void {
    const d = this.distance(where);
    if (d < acc.firstDistance) {
      acc.firstDistance = d;
      acc.item.firstOver = where;
    }
  }

  add(cell: SweepCell): void {
    this.poses++;
    const where = { leanDeg: cell.leanDeg, handlebarDeg: cell.handlebarDeg, travelMm: cell.travelMm };
    if (!cell.ok) {
      this.failedCount++;
      if (!this.firstFailure) this.firstFailure = { where, message: cell.failure.solver.message };
      const assembly = this.accs.get('assembly');
      if (assembly) this.exceeded(assembly, where);
      return;
    }
    const a: PoseAnalysis = cell.analysis;
    const tol = this.design.tolerances;
    for (const side of ['left', 'right'] as Side[]) {
      const e = a.selfSteer[`${side}Deg`];
      if (e !== null) this.update(`selfSteer.${side}`, e, Math.abs(e), where, judgeSelfSteer(e, tol));
      const s = a.slip[side].slipDeg;
      this.update(`slip.${side}`, s, Math.abs(s), where, judgeSlip(s, tol));
    }
    const rc = a.steering.ratioChangePct;
    if (rc !== null) this.update('ratioChange', rc, Math.abs(rc), where, judgeRatioChange(rc, tol));
    for (const j of a.joints) this.update(`joint.${j.joint}.${j.side}`, j.articulationDeg, j.articulationDeg, where, judgeJoint(j.articulationDeg, this.design.joints[j.joint].ratedDeg, tol));
    for (const c of a.clearances) this.update(`clearance.${c.pair}.${c.side}`, c.distanceMm, -c.distanceMm, where, judgeClearance(c.distanceMm, tol));
    const across = acrossClearance(a, this.design);
    this.update(ACROSS_ID, across, -across, where, judgeClearance(across, tol));
    this.update('deadCentre', a.worst.transmissionDeg, -a.worst.transmissionDeg, where, judgeTransmission(a.worst.transmissionDeg));
    if (a.leanLinkage && this.design.leanLinkage) {
      const r = Math.abs(a.leanLinkage.rockerDeg);
      this.update(LEAN_STOP_ID, r, r, where, judgeLeanStop(r, this.design.leanLinkage.rocker.stopDeg));
    }
    const tc = a.turningCircle;
    if (cell.leanDeg === 0 && cell.travelMm === 0 && tc.outerSide && tc.kerbToKerbMm !== null && tc.wallToWallMm !== null) {
      const turn: Side = tc.outerSide === 'right' ? 'left' : 'right';
      this.turns[turn].push({ kerb: tc.kerbToKerbMm, wall: tc.wallToWallMm, where });
    }
  }

  /**
   * The tightest turning circle each way at lean 0, only at handlebar angles inside the
   * steering limit found for that way (`limitDeg`, signed; null: no limit met).
   */
  turningCircleInfo(limitDeg: Record<Side, number | null>): string[] {
    const info: string[] = [];
    for (const turn of ['left', 'right'] as Side[]) {
      const lim = limitDeg[turn];
      const allowed = this.turns[turn].filter((t) => lim === null || Math.abs(t.where.handlebarDeg) <= Math.abs(lim) + 1e-9);
      const b = allowed.reduce<(typeof allowed)[number] | null>((best, t) => (!best || t.kerb < best.kerb ? t : best), null);
      if (b) {
        info.push(
          `turning circle, ${turn} turn at lean 0 (handlebar ${b.where.handlebarDeg.toFixed(1)} deg${lim === null ? '' : `, inside the steering limit ${lim.toFixed(1)} deg`}): ` +
            `kerb to kerb ${(b.kerb / 1000).toFixed(2)} m, wall to wall ${(b.wall / 1000).toFixed(2)} m (SAE J695)`,
        );
      } else if (this.turns[turn].length) {
        info.push(`turning circle, ${turn} turn: none inside the steering limit`);
      }
    }
    return info;
  }

  section(region: CheckRegion): CheckSection {
    const { items, passed } = this.result();
    return { region, poses: this.poses, items, passed };
  }

  result(): { items: CheckItem[]; passed: boolean } {
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
      } else if (id === LEAN_STOP_ID && this.design.leanLinkage) {
        const stop = this.design.leanLinkage.rocker.stopDeg;
        it.verdict = judgeLeanStop(w, stop);
        it.detail = `margin ${(stop - w).toFixed(1)} deg${w > stop ? ' (past its stop: the linkage cannot reach this pose)' : ''}`;
      }
      items.push(it);
    }
    return { items, passed: items.every((i) => i.verdict !== 'over' && i.verdict !== 'broken') };
  }
}

export interface CheckOptions {
  contact?: SweepContact;
  steps?: { leanDeg?: number; handlebarDeg?: number; travelMm?: number };
  /** Which section decides the verdict (default 'operating'). */
  judged?: CheckRegion;
  onProgress?: (done: number, total: number) => void;
}

/**
 * Poses in the grid `checkDesign` sweeps (envelopeAxes's values per axis, multiplied), counted
 * without building the axes: a caller can refuse a grid too large before allocating it.
 */
export function checkGridPoses(design: ResolvedDesign, steps: CheckOptions['steps'] = {}, contact: SweepContact = 'ground'): number {
  const each = (half: number, step: number) => (half > 0 ? Math.ceil(half / step - 1e-9) : 0);
  const e = design.envelope;
  const lean = design.vehicle.tilting ? 2 * each(e.leanDeg, steps.leanDeg ?? 1) + 1 : 1;
  const handlebar = 2 * each(e.handlebarDeg, steps.handlebarDeg ?? 1) + 1;
  const travelStep = steps.travelMm ?? 10;
  const travel = contact === 'ground' && design.frontEnd.kind === 'centrePivot' ? 1 : each(e.reboundMm, travelStep) + each(e.bumpMm, travelStep) + 1;
  return lean * handlebar * travel;
}

export function checkDesign(design: ResolvedDesign, options: CheckOptions = {}): DesignCheck {
  const contact = options.contact ?? 'ground';
  const judged = options.judged ?? 'operating';
  const axes = envelopeAxes(design, options.steps, contact);
  const engine = new PoseEngine(design, { contact, steerBy: 'handlebar' }, { findings: false });
  const operatingAcc = new CheckAccumulator(design);
  const fullAcc = new CheckAccumulator(design);
  const summary = runSweep(design, axes, { contact, engine, onProgress: options.onProgress }, (c) => {
    fullAcc.add(c);
    if (c.region.inside) operatingAcc.add(c);
  });
  const operating = operatingAcc.section('operating');
  const full = fullAcc.section('full');
  const L = design.vehicle.tilting ? design.envelope.leanDeg : 0;
  const leans = L > 0 ? [-L, -L / 2, 0, L / 2, L] : [0];
  const limits = steerLimits(design, leans, {
    contact,
    engine,
    stepDeg: Math.max(0.5, design.envelope.handlebarDeg / 25),
    maxHandlebarDeg: Math.max(10, 2 * design.envelope.handlebarDeg),
    toleranceDeg: 0.05,
  });
  const upright = limits.find((l) => l.leanDeg === 0);
  const info = fullAcc.turningCircleInfo({ left: upright?.left.handlebarDeg ?? null, right: upright?.right.handlebarDeg ?? null });
  info.push(TIE_ROD_SPIN_TREATMENT);
  if (contact === 'ground' && design.frontEnd.kind === 'centrePivot' && (design.envelope.bumpMm > 0 || design.envelope.reboundMm > 0)) {
    info.unshift('travel not swept: a centre-pivot front end on the ground has its ride height set by the linkage');
  }
  const travelAxis = travelAxisOf(design, contact);
  if (travelAxis.note) info.unshift(travelAxis.note);
  const decides = judged === 'operating' ? operating : full;
  return {
    design: design.name,
    contact,
    axes,
    travelAxis,
    judged,
    operating,
    full,
    items: decides.items,
    passed: decides.passed,
    riding: design.riding,
    info,
    limits,
    summary,
  };
}
