/**
 * The sweeps behind the charts and the envelope map: core's `curve` and `envelopeMap`,
 * reshaped into chart data. Runs in the sweep worker (or on the main thread
 * where workers are unavailable). No maths here beyond picking numbers out of core's results.
 */
import { resolveDesign } from '../../core/design/resolveDesign';
import type { DesignFile } from '../../core/design/types';
import type { SweepAxes } from '../../core/analysis/sweep';
import { CURVE_KINDS, curve } from '../../core/analysis/curves';
import { envelopeMap } from '../../core/analysis/envelopeMap';
import { judgeAbs, judgeClearance } from '../../core/analysis/tolerance';
import type { CurveSet, EnvelopeMapData, MapCell } from '../charts/chartData';
import { statusSeverity, verdictSeverity } from '../model/analysisAdapter';

export type Progress = (done: number, total: number) => void;

/** n values from -half to half through 0, at most `step` apart. */
export function symmetricAxis(half: number, step: number): number[] {
  if (!(half > 0)) return [0];
  const n = Math.max(1, Math.ceil(half / step - 1e-9));
  return Array.from({ length: 2 * n + 1 }, (_, i) => (half * (i - n)) / n);
}

export interface CurveRequest {
  design: DesignFile;
}

/** Every 1-D curve core defines, for the design's envelope (core's default axes). */
export function computeCurves(req: CurveRequest, progress?: Progress): CurveSet {
  const t0 = Date.now();
  const d = resolveDesign(req.design);
  const kinds = CURVE_KINDS.filter((k) => {
    if (!d.vehicle.tilting && (k === 'leanSteer' || k === 'camberLean' || k === 'jointsLean')) return false;
    return true;
  });
  const curves: CurveSet['curves'] = {};
  const missing: CurveSet['missing'] = {};
  for (const k of CURVE_KINDS) if (!kinds.includes(k)) missing[k] = 'this vehicle does not lean';
  kinds.forEach((k, i) => {
    progress?.(i, kinds.length);
    try {
      curves[k] = curve(d, k);
    } catch (e) {
      missing[k] = e instanceof Error ? e.message : String(e);
    }
  });
  progress?.(kinds.length, kinds.length);
  const ratedDeg: Record<string, number> = {};
  for (const [name, j] of Object.entries(d.joints)) ratedDeg[name] = j.ratedDeg;
  return { design: d.name, curves, missing, tolerances: { ...d.tolerances }, ratedDeg, elapsedMs: Date.now() - t0 };
}

export interface MapRequest {
  design: DesignFile;
  angleStepDeg: number;
  travelMm?: number;
}

export function computeMap(req: MapRequest, progress?: Progress): EnvelopeMapData {
  const t0 = Date.now();
  const d = resolveDesign(req.design);
  const e = d.envelope;
  const axes: SweepAxes = {
    leanDeg: d.vehicle.tilting ? symmetricAxis(e.leanDeg, req.angleStepDeg) : [0],
    handlebarDeg: symmetricAxis(e.handlebarDeg, req.angleStepDeg),
    travelMm: [req.travelMm ?? 0],
  };
  const map = envelopeMap(d, axes, { contact: 'ground', onProgress: progress });
  const tol = d.tolerances;
  const nH = axes.handlebarDeg.length;
  const cells: MapCell[] = map.cells.map((c, k) => {
    const leanIndex = Math.floor(k / nH) % axes.leanDeg.length;
    const handlebarIndex = k % nH;
    if (c.status === 'cannot-assemble' && c.worstSlipDeg === null) {
      return {
        leanIndex,
        handlebarIndex,
        status: c.status,
        severity: { status: 'broken', slip: 'broken', jointMargin: 'broken', clearance: 'broken', toeError: 'broken' },
        values: { slip: null, jointMargin: null, clearance: null, toeError: null },
        reason: c.reason,
      };
    }
    const joint = c.worstJointMarginDeg;
    return {
      leanIndex,
      handlebarIndex,
      status: c.status,
      severity: {
        status: statusSeverity(c.status),
        slip: c.worstSlipDeg === null ? 'none' : verdictSeverity(judgeAbs(c.worstSlipDeg, tol.slipDeg)),
        // A joint's margin against the required margin (core's judgeJoint works on articulation; the
        // margin form is the same rule: fail below the required margin).
        jointMargin: joint === null ? 'none' : joint < tol.jointMarginDeg ? 'over' : 'within',
        clearance: c.worstClearanceMm === null ? 'none' : verdictSeverity(judgeClearance(c.worstClearanceMm, tol)),
        toeError: c.worstToeErrorDeg === null ? 'none' : verdictSeverity(judgeAbs(c.worstToeErrorDeg, tol.toeErrorDeg)),
      },
      values: { slip: c.worstSlipDeg, jointMargin: joint, clearance: c.worstClearanceMm, toeError: c.worstToeErrorDeg },
      ...(c.reason ? { reason: c.reason } : {}),
    };
  });
  return {
    design: d.name,
    lean: axes.leanDeg,
    handlebar: axes.handlebarDeg,
    travelMm: axes.travelMm[0],
    contact: 'ground',
    cells,
    tolerances: { ...tol },
    elapsedMs: Date.now() - t0,
  };
}
