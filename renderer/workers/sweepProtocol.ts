/** Messages between the workbench and its sweep worker. */
import type { CurveSet, EnvelopeMapData } from '../../core/report/charts/chartData';
import type { CurveRequest, MapRequest } from './sweepJobs';
import type { SensitivityData, SensitivityRequest } from './sensitivityJob';

export type SweepRequest =
  | { id: number; kind: 'curves'; request: CurveRequest }
  | { id: number; kind: 'map'; request: MapRequest }
  | { id: number; kind: 'sensitivity'; request: SensitivityRequest };

export type SweepResponse =
  | { id: number; type: 'progress'; done: number; total: number }
  | { id: number; type: 'curves'; data: CurveSet }
  | { id: number; type: 'map'; data: EnvelopeMapData }
  | { id: number; type: 'sensitivity'; data: SensitivityData }
  | { id: number; type: 'error'; message: string };
