/**
 * The design studies the workbench runs in the sweep worker: tune, tolerance spread, the
 * geometric proposals and the comparison of two designs. Each is core's study as the CLI runs
 * it (core/studies), with plain data in and out; no maths here.
 */
import type { DesignFile } from '../../core/design/types';
import { geometricProposals, type Proposal } from '../../core/studies/geometricSuggestion';
import { runToleranceSpread, type ToleranceOptions, type ToleranceReport } from '../../core/studies/toleranceSpread';
import { runTune, type TuneReport } from '../../core/studies/tune';
import { checkVariables, type TunePlan } from '../../core/studies/tunePlan';
import { compareVariants, type Variant, type VariantsReport } from '../../core/studies/variants';
import { runFit, type FitReport } from '../../core/studies/fit';
import { prepareFit } from '../../core/studies/fitInput';
import { checkDesign, type CheckItem } from '../../core/analysis/designCheck';
import { resolveDesign } from '../../core/design/resolveDesign';
import type { Progress } from './sweepJobs';

export interface TuneRequest {
  design: DesignFile;
  plan: TunePlan;
}

/** Core's tune; the plan's variables are checked against the design first (a TunePlanError names the one at fault). */
export function computeTune(req: TuneRequest, progress?: Progress): TuneReport {
  const variables = checkVariables(req.design, req.plan);
  return runTune(req.design, req.plan, variables, { onProgress: progress });
}

export interface ToleranceRequest {
  design: DesignFile;
  options: Omit<ToleranceOptions, 'onProgress' | 'shouldStop'>;
}

export function computeTolerance(req: ToleranceRequest, progress?: Progress): ToleranceReport {
  return runToleranceSpread(req.design, { ...req.options, onProgress: progress });
}

export interface ProposalsRequest {
  design: DesignFile;
}

export function computeProposals(req: ProposalsRequest, progress?: Progress): Proposal[] {
  progress?.(0, 1);
  const out = geometricProposals(req.design, true);
  progress?.(1, 1);
  return out;
}

export interface VariantsRequest {
  variants: Variant[];
}

export function computeVariants(req: VariantsRequest, progress?: Progress): VariantsReport {
  progress?.(0, 1);
  const out = compareVariants(req.variants, { check: true });
  progress?.(1, 1);
  return out;
}

export interface FitRequest {
  design: DesignFile;
  /** The measurement sheet's text and its file name (named in errors). */
  csv: string;
  csvName: string;
  /** Core's coordinate ids that may be off. */
  ids: string[];
}

/** Core's fit; input problems (CSV line:column, unknown ids, poses outside the design) are thrown as one message. */
export function computeFit(req: FitRequest, progress?: Progress): FitReport {
  const input = prepareFit(req.design, req.csv, req.csvName, req.ids, 'vary');
  if (!input.ok) throw new Error(input.problems.slice(0, 6).join('\n') + (input.problems.length > 6 ? `\n(and ${input.problems.length - 6} more)` : ''));
  return runFit(req.design, input.measurements, input.variables, { onProgress: progress });
}

/** Grid of the workbench's check: coarser than the CLI's default (1 deg, 10 mm) so it takes a second or two. */
export const WORKBENCH_CHECK_STEPS = { leanDeg: 2.5, handlebarDeg: 2.5, travelMm: 10 } as const;

export interface CheckRequest {
  design: DesignFile;
}

export interface CheckData {
  /** The operating region's items (core's check), worst verdicts first. */
  items: CheckItem[];
  passed: boolean;
  poses: number;
  steps: typeof WORKBENCH_CHECK_STEPS;
  elapsedMs: number;
}

const VERDICT_ORDER = ['broken', 'over', 'close', 'within'];

export function computeCheck(req: CheckRequest, progress?: Progress): CheckData {
  const t0 = Date.now();
  const c = checkDesign(resolveDesign(req.design), { steps: WORKBENCH_CHECK_STEPS, onProgress: progress });
  const items = [...c.operating.items].sort((a, b) => VERDICT_ORDER.indexOf(a.verdict) - VERDICT_ORDER.indexOf(b.verdict));
  return { items, passed: c.operating.passed, poses: c.operating.poses, steps: WORKBENCH_CHECK_STEPS, elapsedMs: Date.now() - t0 };
}
