/** Messages between the workbench and its sweep worker: one table of job kinds, their requests and results. */
import type { Proposal } from '../../core/studies/geometricSuggestion';
import type { ToleranceReport } from '../../core/studies/toleranceSpread';
import type { TuneReport } from '../../core/studies/tune';
import type { VariantsReport } from '../../core/studies/variants';
import type { CurveSet, EnvelopeMapData } from '../../core/report/charts/chartData';
import type { CurveRequest, MapRequest } from './sweepJobs';
import type { SensitivityData, SensitivityRequest } from './sensitivityJob';
import type { CheckData, CheckRequest, FitRequest, ProposalsRequest, ToleranceRequest, TuneRequest, VariantsRequest } from './studyJobs';
import type { FitReport } from '../../core/studies/fit';
import type { ReportRequest } from './reportJob';

export interface JobKinds {
  curves: { request: CurveRequest; data: CurveSet };
  map: { request: MapRequest; data: EnvelopeMapData };
  sensitivity: { request: SensitivityRequest; data: SensitivityData };
  tune: { request: TuneRequest; data: TuneReport };
  tolerance: { request: ToleranceRequest; data: ToleranceReport };
  proposals: { request: ProposalsRequest; data: Proposal[] };
  variants: { request: VariantsRequest; data: VariantsReport };
  fit: { request: FitRequest; data: FitReport };
  check: { request: CheckRequest; data: CheckData };
  /** The workshop report, one HTML document. */
  report: { request: ReportRequest; data: string };
}

export type JobKind = keyof JobKinds;

export type SweepRequest = { [K in JobKind]: { id: number; kind: K; request: JobKinds[K]['request'] } }[JobKind];

export type SweepResponse =
  | { id: number; type: 'progress'; done: number; total: number }
  | { id: number; type: 'done'; data: JobKinds[JobKind]['data'] }
  | { id: number; type: 'error'; message: string };
