/** One job of any kind, run where it is called (the worker, or the main thread as a fallback). */
import { computeCurves, computeMap, type Progress } from './sweepJobs';
import { computeSensitivity } from './sensitivityJob';
import { computeCheck, computeFit, computeProposals, computeTolerance, computeTune, computeVariants } from './studyJobs';
import { computeReport } from './reportJob';
import type { JobKinds, SweepRequest } from './sweepProtocol';

export function runJob(req: SweepRequest, progress?: Progress): JobKinds[SweepRequest['kind']]['data'] {
  switch (req.kind) {
    case 'curves':
      return computeCurves(req.request, progress);
    case 'map':
      return computeMap(req.request, progress);
    case 'sensitivity':
      return computeSensitivity(req.request, progress);
    case 'tune':
      return computeTune(req.request, progress);
    case 'tolerance':
      return computeTolerance(req.request, progress);
    case 'proposals':
      return computeProposals(req.request, progress);
    case 'variants':
      return computeVariants(req.request, progress);
    case 'fit':
      return computeFit(req.request, progress);
    case 'check':
      return computeCheck(req.request, progress);
    case 'report':
      return computeReport(req.request, progress);
  }
}
