/**
 * A pose's verdict: each check judged by tolerance.ts, the worst of them, and the findings in
 * words. Run once the pose's measures are complete (after the neighbouring poses filled in
 * self-steer and the ratio change), so every caller judges the same numbers the same way.
 */

import type { Tolerances } from '../design/types';
import type { JointName, PoseAnalysis } from './analysisTypes';
import { CHECK_KINDS, judgeClearance, judgeJoint, judgeRatioChange, judgeSelfSteer, judgeSlip, judgeTransmission, worseOf, type CheckKind, type Verdict } from './tolerance';
import { clearancePairWords, jointWords } from './words';

const fmt = (x: number, d = 2) => x.toFixed(d);

/** What a finding is about, so a reader can point at it (the workbench selects the part). */
export type FindingSubject =
  | { kind: 'wheel'; side: 'left' | 'right' }
  | { kind: 'steering' }
  | { kind: 'joint'; joint: JointName; side: 'left' | 'right' }
  | { kind: 'clearance'; pair: string; side: 'left' | 'right' }
  | { kind: 'deadCentre' };

export interface PoseJudgement {
  status: Verdict;
  checks: Record<CheckKind, Verdict | null>;
  findings: string[];
  /** One per finding, in the same order. */
  subjects: FindingSubject[];
}

export function noChecks(): Record<CheckKind, Verdict | null> {
  const c = {} as Record<CheckKind, Verdict | null>;
  for (const k of CHECK_KINDS) c[k] = null;
  return c;
}

/**
 * Judge every check of a solved pose; words only when asked for. This runs twice per pose of a
 * sweep (after the pose's own measures, then with the neighbours' ones), so without words it
 * builds no strings and no closures.
 */
export function judgePose(a: PoseAnalysis, tol: Tolerances, words: boolean): PoseJudgement {
  const checks = noChecks();
  const findings: string[] = [];
  const subjects: FindingSubject[] = [];
  const say = (text: string, subject: FindingSubject) => {
    findings.push(text);
    subjects.push(subject);
  };
  for (const side of SIDES) {
    const s = a.slip[side].slipDeg;
    const v = judgeSlip(s, tol);
    checks.slip = worseOf(checks.slip, v);
    if (words && v !== 'within') say(`${v}: ${side} slip ${fmt(s)} deg (tolerance ${tol.slipDeg} deg)`, { kind: 'wheel', side });
    const e = side === 'left' ? a.selfSteer.leftDeg : a.selfSteer.rightDeg;
    if (e !== null) {
      const ve = judgeSelfSteer(e, tol);
      checks.selfSteer = worseOf(checks.selfSteer, ve);
      if (words && ve !== 'within') say(`${ve}: ${side} self-steer ${fmt(e, 3)} deg (tolerance ${tol.selfSteerDeg} deg)`, { kind: 'wheel', side });
    }
  }
  const rc = a.steering.ratioChangePct;
  if (rc !== null) {
    const v = judgeRatioChange(rc, tol);
    checks.ratioChange = v;
    if (words && v !== 'within') say(`${v}: steering-ratio change ${fmt(rc, 1)} % (tolerance ${tol.ratioChangePct} %)`, { kind: 'steering' });
  }
  for (const j of a.joints) {
    const v = judgeJoint(j.articulationDeg, j.ratedDeg, tol);
    checks.joint = worseOf(checks.joint, v);
    if (words && v !== 'within') {
      say(`${v}: ${jointWords(j.joint, j.side)} at ${fmt(j.articulationDeg, 1)} deg of ${j.ratedDeg} rated (margin ${fmt(j.marginDeg, 1)}, required ${tol.jointMarginDeg})`, { kind: 'joint', joint: j.joint, side: j.side });
    }
  }
  for (const c of a.clearances) {
    const v = judgeClearance(c.distanceMm, tol);
    checks.clearance = worseOf(checks.clearance, v);
    if (words && v !== 'within') say(`${v}: ${clearancePairWords(c.pair)} clearance, ${c.side}, ${fmt(c.distanceMm, 1)} mm (required ${tol.clearanceMm} mm)`, { kind: 'clearance', pair: c.pair, side: c.side });
  }
  const t = a.worst.transmissionDeg;
  checks.deadCentre = judgeTransmission(t);
  if (words && checks.deadCentre !== 'within') say(`${checks.deadCentre}: a steering lever is at or past dead centre (transmission ${fmt(t, 1)} deg)`, { kind: 'deadCentre' });
  let status: Verdict = 'within';
  for (const k of CHECK_KINDS) status = worseOf(status, checks[k]) ?? status;
  return { status, checks, findings, subjects };
}

const SIDES = ['left', 'right'] as const;

/** Put a judgement on the analysis (in place) and return it. */
export function applyJudgement(a: PoseAnalysis, tol: Tolerances, words: boolean): PoseAnalysis {
  const j = judgePose(a, tol, words);
  a.status = j.status;
  a.checks = j.checks;
  a.findings = j.findings;
  a.findingSubjects = j.subjects;
  return a;
}
