/**
 * Steering limits: at each lean, the handlebar angle each way at which the first limit is
 * met. A limit is any of
 *   - 'joint-rating'    a ball joint or rod end past its rated articulation;
 *   - 'clearance'       a clearance pair below tolerances.clearanceMm;
 *   - 'dead-centre'     the bell crank, lever or a steering arm at or past dead centre (a
 *                       transmission angle <= 0), or the solver reporting a singular pose;
 *   - 'cannot-assemble' the linkage failing to close.
 * Found by stepping the handlebar out from 0 (warm, one solver for every lean) and bisecting
 * between the last pose inside every limit and the first one outside.
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs, type PoseInputs } from '../mechanism/MechanismGraph';
import type { SolveResult } from '../solver/PoseSolver';
import type { PoseAnalysis } from './analysisTypes';
import { PoseEngine } from './PoseEngine';
import type { SweepContact } from './sweep';
import { clearancePairWords, jointWords } from './words';

export type LimitKind = 'cannot-assemble' | 'dead-centre' | 'joint-rating' | 'clearance';

export interface SteerLimit {
  /** Last handlebar angle inside every limit (signed; within `toleranceDeg` of the limit); null when none was met. */
  handlebarDeg: number | null;
  /** What is met just beyond it, most severe first. */
  kinds: LimitKind[];
  /** Which joint, pair or lever, or the solver's message. */
  detail: string | null;
  /** Road-wheel angles at `handlebarDeg`. */
  leftWheelDeg: number | null;
  rightWheelDeg: number | null;
  reason?: string;
}

export interface LeanLimits {
  leanDeg: number;
  /** Positive handlebar (turning left). */
  left: SteerLimit;
  /** Negative handlebar (turning right). */
  right: SteerLimit;
}

export interface LimitOptions {
  stepDeg?: number;
  maxHandlebarDeg?: number;
  toleranceDeg?: number;
  contact?: SweepContact;
  /** Travel as in a sweep: heave = -travel on the ground, wheel travel with contact 'travel'. */
  travelMm?: number;
  /** Run on this engine's main solver (handlebar mode, the same contact). */
  engine?: PoseEngine;
}

interface Hit {
  kinds: LimitKind[];
  detail: string;
}

/** The worst two of a list, and how many more. */
function listFirst(items: string[]): string {
  return items.length <= 2 ? items.join(', ') : `${items.slice(0, 2).join(', ')} and ${items.length - 2} more`;
}

function limitHit(r: SolveResult, a: PoseAnalysis | null, design: ResolvedDesign): Hit | null {
  if (!a) {
    return { kinds: [r.status === 'singular' ? 'dead-centre' : 'cannot-assemble'], detail: r.message };
  }
  const kinds: LimitKind[] = [];
  const details: string[] = [];
  if (r.status === 'singular') {
    kinds.push('dead-centre');
    details.push(r.message);
  } else if (a.worst.transmissionDeg <= 0) {
    kinds.push('dead-centre');
    const s = a.steering;
    const levers: [string, number][] = [
      ['left steering arm', s.steeringArmTransmissionDeg.left],
      ['right steering arm', s.steeringArmTransmissionDeg.right],
      ['left tie rod at the crank, lever or rack', s.linkageTransmissionDeg.left],
      ['right tie rod at the crank, lever or rack', s.linkageTransmissionDeg.right],
    ];
    if (s.dragLinkTransmissionDeg !== null) levers.push(['drag link at the crank', s.dragLinkTransmissionDeg]);
    details.push(levers.filter(([, v]) => v <= 0).map(([n]) => `${n} at dead centre`).join(', '));
  }
  const overJoints = a.joints.filter((j) => j.articulationDeg > j.ratedDeg).sort((x, y) => x.marginDeg - y.marginDeg);
  if (overJoints.length) {
    kinds.push('joint-rating');
    details.push(listFirst(overJoints.map((j) => `${jointWords(j.joint, j.side)} ${j.articulationDeg.toFixed(1)} deg > ${j.ratedDeg} rated`)));
  }
  const tight = a.clearances.filter((c) => c.distanceMm < design.tolerances.clearanceMm).sort((x, y) => x.distanceMm - y.distanceMm);
  if (tight.length) {
    kinds.push('clearance');
    details.push(listFirst(tight.map((c) => `${clearancePairWords(c.pair)}, ${c.side}, ${c.distanceMm.toFixed(1)} mm < ${design.tolerances.clearanceMm}`)));
  }
  return kinds.length ? { kinds, detail: details.join('; ') } : null;
}

export function steerLimits(design: ResolvedDesign, leans: number[], options: LimitOptions = {}): LeanLimits[] {
  const step = options.stepDeg ?? 1;
  const max = options.maxHandlebarDeg ?? 90;
  const tolDeg = options.toleranceDeg ?? 0.05;
  const contact = options.contact ?? 'ground';
  const travel = options.travelMm ?? 0;
  if (!(step > 0) || !(max > 0) || !(tolDeg > 0)) throw new Error('steerLimits: step, maximum and tolerance must be positive');
  const grid = (options.engine ?? new PoseEngine(design, { contact, steerBy: 'handlebar' }, { findings: false })).main;
  const input: PoseInputs = zeroInputs();
  if (contact === 'ground') input.heaveMm = -travel;
  else input.travelLeftMm = input.travelRightMm = travel;

  const at = (lean: number, bar: number): { r: SolveResult; a: PoseAnalysis | null } => {
    input.leanDeg = lean;
    input.handlebarDeg = bar;
    const r = grid.solve(input);
    const a = r.reached ? grid.analyser.analyse(r) : null;
    return { r, a };
  };

  const oneWay = (lean: number, dir: 1 | -1): SteerLimit => {
    // Each way starts afresh from the design pose, so a mirror-symmetric design walks mirror
    // paths and meets mirror limits (a warm start would carry one search's history into the other).
    grid.reset();
    const start = at(lean, 0);
    const hit0 = limitHit(start.r, start.a, design);
    if (hit0) return { handlebarDeg: 0, kinds: hit0.kinds, detail: hit0.detail, leftWheelDeg: start.a?.steering.leftWheelDeg ?? null, rightWheelDeg: start.a?.steering.rightWheelDeg ?? null };
    let lo = 0;
    let loA = start.a!;
    for (let h = step; h <= max + 1e-9; h += step) {
      const cur = at(lean, dir * h);
      let hit = limitHit(cur.r, cur.a, design);
      if (!hit) {
        lo = h;
        loA = cur.a!;
        continue;
      }
      let hi = h;
      while (hi - lo > tolDeg) {
        const mid = (lo + hi) / 2;
        const m = at(lean, dir * mid);
        const mh = limitHit(m.r, m.a, design);
        if (mh) {
          hi = mid;
          hit = mh;
        } else {
          lo = mid;
          loA = m.a!;
        }
      }
      return { handlebarDeg: dir * lo, kinds: hit.kinds, detail: hit.detail, leftWheelDeg: loA.steering.leftWheelDeg, rightWheelDeg: loA.steering.rightWheelDeg };
    }
    return { handlebarDeg: null, kinds: [], detail: null, leftWheelDeg: null, rightWheelDeg: null, reason: `no limit met within ${dir * max} deg of handlebar` };
  };

  return leans.map((lean) => ({ leanDeg: lean, left: oneWay(lean, 1), right: oneWay(lean, -1) }));
}
