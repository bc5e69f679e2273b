/**
 * The sweeps behind the charts and the envelope map: core's `curve` and `envelopeMap`
 * (with its operating region per cell and its balanced-turn lines), reshaped into chart data.
 * The workbench runs them in the sweep worker (renderer/workers/sweepJobs.ts re-exports them,
 * on the main thread where workers are unavailable); the report calls them directly. No maths
 * here beyond picking numbers out of core's results.
 */
import { resolveDesign } from '../design/resolveDesign';
import type { DesignFile, ResolvedDesign } from '../design/types';
import { runSweep, type SweepAxes } from '../analysis/sweep';
import { CURVE_KINDS, curve, type CurveKind } from '../analysis/curves';
import { balancedLines, envelopeMap } from '../analysis/envelopeMap';
import { travelAxisOf } from '../analysis/designCheck';
import type { Verdict } from '../analysis/tolerance';
import type { CurveSet, EnvelopeMapData, MapBalancedLine, MapCell } from './charts/chartData';
import { LEAN_CURVES, NO_LEAN_REASON } from './charts/curveOptions';
import type { Severity } from './severity';

export type Progress = (done: number, total: number) => void;

/** n values from -half to half through 0, at most `step` apart. */
export function symmetricAxis(half: number, step: number): number[] {
  if (!(half > 0)) return [0];
  const n = Math.max(1, Math.ceil(half / step - 1e-9));
  return Array.from({ length: 2 * n + 1 }, (_, i) => (half * (i - n)) / n);
}

export interface CurveRequest {
  design: DesignFile;
  /**
   * Only these kinds (the workbench asks for the open chart's first, then the rest); every
   * kind when absent. A kind not asked for is in neither `curves` nor `missing`.
   */
  kinds?: readonly CurveKind[];
}

/** Every 1-D curve core defines (or those asked for), for the design's envelope (core's default axes). */
export function computeCurves(req: CurveRequest, progress?: Progress): CurveSet {
  const t0 = Date.now();
  const d = resolveDesign(req.design);
  const asked = req.kinds ?? CURVE_KINDS;
  const kinds = asked.filter((k) => d.vehicle.tilting || !LEAN_CURVES.has(k));
  const curves: CurveSet['curves'] = {};
  const missing: CurveSet['missing'] = {};
  for (const k of asked) if (!kinds.includes(k)) missing[k] = NO_LEAN_REASON;
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
  const nH = axes.handlebarDeg.length;
  // Verdicts are core's (the engine judged every cell); only reshaped here.
  const cells: MapCell[] = map.cells.map((c, k) => {
    const leanIndex = Math.floor(k / nH) % axes.leanDeg.length;
    const handlebarIndex = k % nH;
    const of = (v: Verdict | null): Severity => (c.status === 'broken' ? 'broken' : (v ?? 'none'));
    return {
      leanIndex,
      handlebarIndex,
      status: c.status,
      severity: {
        status: c.status,
        slip: of(c.checks.slip),
        selfSteer: of(c.checks.selfSteer),
        ratioChange: of(c.checks.ratioChange),
        jointMargin: of(c.checks.joint),
        clearance: of(c.checks.clearance),
      },
      values: {
        slip: c.worstSlipDeg,
        selfSteer: c.worstSelfSteerDeg,
        ratioChange: c.ratioChangePct,
        jointMargin: c.worstJointMarginDeg,
        clearance: c.worstClearanceMm,
      },
      inRegion: c.inRegion,
      ...(c.reason ? { reason: c.reason } : {}),
    };
  });
  return {
    design: d.name,
    lean: axes.leanDeg,
    handlebar: axes.handlebarDeg,
    travelMm: axes.travelMm[0],
    travelName: travelAxisOf(d, 'ground').name,
    contact: 'ground',
    cells,
    balancedLines: balancedTurnLines(d, axes.handlebarDeg, map.balancedLines),
    riding: { minKmh: d.riding.minKmh, maxKmh: d.riding.maxKmh, maxLeanDeg: d.riding.maxLeanDeg },
    tolerances: { ...d.tolerances },
    elapsedMs: Date.now() - t0,
  };
}

/** Handlebar step of the balanced-turn lines, deg. */
export const LINE_STEP_DEG = 0.25;

/**
 * Core's balanced-turn lines on a handlebar axis of their own. Core samples them at the map's
 * handlebar values; on a coarse map a fast line reaches the lean limit within the first step
 * and would be drawn as a dot at the centre. So when the map is coarser than LINE_STEP_DEG,
 * core's upright turns are found again along a fine handlebar axis (a one-row sweep at zero
 * lean and travel) and core's `balancedLines` turns them into lines.
 */
function balancedTurnLines(d: ResolvedDesign, mapHandlebar: number[], coarse: { speedKmh: number; leanDeg: (number | null)[] }[]): MapBalancedLine[] {
  if (coarse.length === 0) return [];
  const mapStep = mapHandlebar.length > 1 ? mapHandlebar[1] - mapHandlebar[0] : Infinity;
  if (mapStep <= LINE_STEP_DEG + 1e-9) return coarse.map((l) => ({ speedKmh: l.speedKmh, handlebarDeg: [...mapHandlebar], leanDeg: [...l.leanDeg] }));
  const handlebarDeg = symmetricAxis(d.envelope.handlebarDeg, LINE_STEP_DEG);
  const upright = runSweep(d, { leanDeg: [0], handlebarDeg, travelMm: [0] }, { contact: 'ground' }, () => {});
  return balancedLines(d, upright.uprightTurns).map((l) => ({ speedKmh: l.speedKmh, handlebarDeg, leanDeg: l.leanDeg }));
}
