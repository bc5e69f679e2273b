/**
 * What is wrong, and what would fix it: the findings of the pose on screen and of the operating
 * region's check as one list, worst first, each with the study objective it is about (so the
 * fix can list the hardpoints whose rates per mm move that objective most, and the proposals
 * that improve it). Pure reshaping of core's judgement, check items, sensitivity rates and
 * proposals: no numbers are computed here except ordering.
 */
import type { FindingSubject } from '../../core/analysis/poseVerdict';
import type { CheckItem, CheckWhere } from '../../core/analysis/designCheck';
import type { Proposal } from '../../core/studies/geometricSuggestion';
import type { SensitivityData, SensitivityRow } from '../workers/sensitivityJob';
import type { Severity } from './severity';

/** A finding the fix view can open: where it came from, how bad, its words and what it is about. */
export interface OpenFinding {
  /** 'pose:<index>' for an alert of the pose on screen, 'region:<check item id>' for the operating region. */
  id: string;
  source: 'pose' | 'region';
  severity: Severity;
  text: string;
  /** The hardpoint that shows the part (selected in the view and the tables), when there is one. */
  hardpoint: string | null;
  /** The study objective the finding is about (sensitivity and proposals), null when the studies have none for it. */
  objective: string | null;
  /** Where it is first exceeded, for a region item. */
  where: CheckWhere | null;
}

const SEVERITY_RANK: Record<Severity, number> = { broken: 0, over: 1, close: 2, within: 3, none: 4 };

/** Worst first; within a severity, the pose's own findings before the region's (they are on screen now), else as given. */
export function worstFirst<T extends { severity: Severity; source: 'pose' | 'region' }>(list: readonly T[]): T[] {
  return list
    .map((f, i) => ({ f, i }))
    .sort((a, b) => SEVERITY_RANK[a.f.severity] - SEVERITY_RANK[b.f.severity] || (a.f.source === b.f.source ? 0 : a.f.source === 'pose' ? -1 : 1) || a.i - b.i)
    .map((x) => x.f);
}

/**
 * The objective of a check item (core's designCheck ids): each side's self-steer and slip are
 * judged by the study's worst over both sides; a joint by its own margin (or the least of all
 * when the rates do not name that joint); clearances, dead centre and poses that cannot be
 * assembled have no study objective.
 */
export function objectiveOfCheckItem(id: string): string | null {
  const head = id.split('.')[0];
  if (head === 'selfSteer' || head === 'slip') return head;
  if (id === 'ratioChange') return 'ratioChange';
  if (head === 'joint') return id;
  return null;
}

/** The objective as the rates know it: a joint the rates do not name falls back to the least margin of all joints. */
export function usableObjective(objective: string | null, known: readonly string[]): string | null {
  if (objective === null) return null;
  if (known.includes(objective)) return objective;
  return objective.startsWith('joint.') && known.includes('jointMargin') ? 'jointMargin' : null;
}

/**
 * The objective of a pose finding, from its subject and core's words (poseVerdict.ts writes
 * "<side> slip ..." or "<side> self-steer ..." for a wheel, and names the joint in the subject).
 */
export function objectiveOfPoseFinding(subject: FindingSubject | undefined, text: string): string | null {
  if (!subject) return null;
  switch (subject.kind) {
    case 'wheel':
      if (/self-steer/i.test(text)) return 'selfSteer';
      if (/\bslip\b/i.test(text)) return 'slip';
      return null;
    case 'steering':
      return /ratio/i.test(text) ? 'ratioChange' : null;
    case 'joint':
      return `joint.${subject.joint}.${subject.side}`;
    default:
      return null;
  }
}

/** A region check item as a finding (items within their limit are not findings). */
export function regionFinding(item: CheckItem, hardpoint: string | null): OpenFinding | null {
  if (item.verdict === 'within') return null;
  return { id: `region:${item.id}`, source: 'region', severity: item.verdict, text: item.label, hardpoint, objective: objectiveOfCheckItem(item.id), where: item.firstOver ?? item.where };
}

/** Whether a larger value of the objective is better (a least margin) or worse (a worst |value|): core's StudyObjective.kind. */
export function objectiveKind(id: string): 'worst' | 'least' {
  return id === 'jointMargin' || id.startsWith('joint.') ? 'least' : 'worst';
}

/** One hardpoint of a fix: its rates per mm of the objective on each axis, and the axis that moves it most. */
export interface FixPoint {
  /** The point's field path (as the hardpoint table's rows and the sensitivity's rows). */
  key: string;
  rates: { axis: 'x' | 'y' | 'z'; direction: string; perMm: number }[];
  /** The largest |rate| of the point, per mm. */
  strongest: number;
  /** The axis with that rate, and which way to move the point along it to improve the objective ('+' along the axis' direction, '-' against). */
  best: { axis: 'x' | 'y' | 'z'; direction: string; perMm: number; improveSign: 1 | -1 };
}

/**
 * The hardpoints whose coordinates move an objective most per mm (the sensitivity's central
 * differences of the full solve), strongest first, at most `limit` of them; points whose every
 * rate is absent or zero are left out. A worst |value| improves by moving against the rate's
 * sign, a least margin by moving with it.
 */
export function fixPoints(rates: SensitivityData, objective: string, limit = 4): FixPoint[] {
  const byKey = new Map<string, SensitivityRow[]>();
  for (const r of rates.rows) byKey.set(r.key, [...(byKey.get(r.key) ?? []), r]);
  const kind = objectiveKind(objective);
  const out: FixPoint[] = [];
  for (const [key, rows] of byKey) {
    const axes = rows.flatMap((r) => {
      const v = r.perMm[objective];
      return v === null || v === undefined || !Number.isFinite(v) ? [] : [{ axis: r.axis, direction: r.direction, perMm: v }];
    });
    if (axes.length === 0) continue;
    const top = axes.reduce((a, b) => (Math.abs(b.perMm) > Math.abs(a.perMm) ? b : a));
    if (top.perMm === 0) continue;
    const sign = Math.sign(top.perMm) as 1 | -1;
    out.push({ key, rates: axes, strongest: Math.abs(top.perMm), best: { ...top, improveSign: kind === 'worst' ? ((-sign) as 1 | -1) : sign } });
  }
  out.sort((a, b) => b.strongest - a.strongest || a.key.localeCompare(b.key));
  return out.slice(0, limit);
}

/** A proposal's effect on one objective, when it has one. */
export interface ProposalForFinding {
  proposal: Proposal;
  before: number;
  after: number | null;
  unit: string;
  improves: boolean;
}

/**
 * The live proposals that say what they do to the objective: those that improve it first (a
 * worst |value| falls, a least margin rises), then those that make it worse, so the user sees
 * the cost too. A proposal whose design does not assemble is listed as not improving.
 */
export function proposalsFor(list: readonly Proposal[], objective: string): ProposalForFinding[] {
  const kind = objectiveKind(objective);
  const out: ProposalForFinding[] = [];
  for (const p of list) {
    if (!p.design || !p.effect) continue;
    const e = p.effect.find((x) => x.id === objective);
    if (!e || e.before === null) continue;
    const improves = e.after !== null && (kind === 'worst' ? e.after < e.before : e.after > e.before);
    out.push({ proposal: p, before: e.before, after: e.after, unit: e.unit, improves });
  }
  return out.sort((a, b) => Number(b.improves) - Number(a.improves));
}
