/**
 * What the charts draw: core's 1-D curves and the lean x handlebar envelope map. Plain data (it crosses the worker boundary); null where a
 * pose could not be assembled.
 */
import type { Tolerances } from '../../design/types';
import type { Verdict } from '../../analysis/tolerance';
import type { Curve, CurveKind } from '../../analysis/curves';
import type { Severity } from '../severity';

/** Core's 1-D curves of one design (core/analysis/curves.ts), with what the charts mark on them. */
export interface CurveSet {
  design: string;
  curves: Partial<Record<CurveKind, Curve>>;
  /** Why a curve is missing (a non-tilting design has no lean curves, say). */
  missing: Partial<Record<CurveKind, string>>;
  tolerances: Tolerances;
  /** Rated articulation of each joint, degrees. */
  ratedDeg: Record<string, number>;
  elapsedMs: number;
}

export type MapMetric = 'status' | 'slip' | 'selfSteer' | 'ratioChange' | 'jointMargin' | 'clearance';

export interface MapCell {
  leanIndex: number;
  handlebarIndex: number;
  /** Core's verdict on the pose. */
  status: Verdict;
  /** Core's verdict on each metric ('none': not measured here; 'broken' where the pose cannot be assembled). */
  severity: Record<MapMetric, Severity>;
  values: Record<Exclude<MapMetric, 'status'>, number | null>;
  /** Whether core counts the pose in the operating region (a balanced turn in the riding range, widened by the transient band). */
  inRegion: boolean;
  reason?: string;
}

/**
 * Core's balanced-turn line for one speed: the balanced lean at each of its handlebar values
 * (finer than the map's cells; null where that speed cannot ride the turn: grip, lean limit).
 */
export interface MapBalancedLine {
  speedKmh: number;
  handlebarDeg: number[];
  leanDeg: (number | null)[];
}

export interface EnvelopeMapData {
  design: string;
  lean: number[];
  handlebar: number[];
  travelMm: number;
  /**
   * What travelMm is: "travel" (wheel-centre travel, bump +) or, on a lean-linkage design on
   * the ground, "spring travel" (compression +); absent: wheel travel.
   */
  travelName?: string;
  contact: 'ground' | 'travel';
  cells: MapCell[];
  /** One per riding speed core picked; none for a vehicle that does not lean. */
  balancedLines: MapBalancedLine[];
  /** The design's riding range, km/h, and lean limit, deg (for the map's words). */
  riding: { minKmh: number; maxKmh: number; maxLeanDeg: number };
  tolerances: CurveSet['tolerances'];
  elapsedMs: number;
}
