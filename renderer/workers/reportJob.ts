/**
 * The workshop report made in the sweep worker: core's gatherReport and reportHtml (the same
 * document `tiltbench report` writes), for the design on screen.
 */
import { resolveDesign } from '../../core/design/resolveDesign';
import type { DesignFile } from '../../core/design/types';
import { gatherReport } from '../../core/report/gatherReport';
import { reportHtml } from '../../core/report/reportHtml';
import type { Progress } from './sweepJobs';

export interface ReportRequest {
  design: DesignFile;
  /** The name the report gives the design's file. */
  fileName: string;
  /** SHA-256 (hex) of the design's text as the workbench saves it. */
  sha256: string;
  /** ISO 8601, UTC. */
  madeAt: string;
}

// ECharts' init reads `global` where there is no `window` (its server-side path, written for
// Node); a worker has neither, so the worker's global object is named `global` for it.
const scope = globalThis as { global?: unknown };
scope.global ??= globalThis;

/** The report's stages, in order (for the progress count). */
const STAGES = ['design pose', 'curves', 'envelope map', 'check', 'full lock'];

export function computeReport(req: ReportRequest, progress?: Progress): string {
  const data = gatherReport(
    { file: req.design, design: resolveDesign(req.design), fileName: req.fileName, sha256: req.sha256, madeAt: req.madeAt },
    { onStage: (s) => progress?.(Math.max(0, STAGES.indexOf(s)), STAGES.length + 1) },
  );
  progress?.(STAGES.length, STAGES.length + 1);
  return reportHtml(data);
}
