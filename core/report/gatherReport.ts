/**
 * Everything the workshop report shows, gathered from core's own analyses (nothing recomputed
 * another way): the design pose as `tiltbench pose` solves it, the curves and the envelope map
 * the workbench's charts draw, `tiltbench check`'s judged tables and steering limits, full-lock
 * poses for the turning circles, and, when asked, the sensitivity and tolerance studies.
 * Pure: the file's hash and the date come in from the caller (the CLI computes the hash).
 */
import type { DesignFile, ResolvedDesign } from '../design/types';
import { hardpointTable, type HardpointRow } from '../design/hardpointCsv';
import { hardpointEntries } from '../design/hardpointCatalogue';
import { solveSinglePose, type PoseReport, type PoseRequest } from '../analysis/solveSinglePose';
import { checkDesign, type DesignCheck } from '../analysis/designCheck';
import { buildMechanism } from '../mechanism/templates/buildMechanism';
import type { MechanismGraph, Vec3 } from '../mechanism/MechanismGraph';
import type { DrawingLayout } from '../mechanism/drawingLayout';
import { runSensitivity, type SensitivityReport } from '../studies/sensitivity';
import { runToleranceSpread, type ToleranceReport } from '../studies/toleranceSpread';
import { runTune, type TuneReport } from '../studies/tune';
import type { ResolvedVariable, TunePlan } from '../studies/tunePlan';
import { computeCurves, computeMap } from './chartSweeps';
import type { CurveSet, EnvelopeMapData } from './charts/chartData';
import type { DrawingFigures, KeyedPoint } from './drawings';

export interface ReportSource {
  file: DesignFile;
  design: ResolvedDesign;
  /** The design file's name as the user gave it. */
  fileName: string;
  /** SHA-256 of the design file's bytes, hex. */
  sha256: string;
  /** When the report was made, ISO 8601 (UTC). */
  madeAt: string;
}

export interface ReportOptions {
  /** Grid of the check (as `tiltbench check`: at most 1 deg, 1 deg, 10 mm by default). */
  checkSteps?: { leanDeg: number; handlebarDeg: number; travelMm: number };
  /** Cell size of the envelope map, deg (the workbench's default map is 2 deg). */
  mapStepDeg?: number;
  /** Run the sensitivity study (core/studies/sensitivity.ts, its defaults). */
  sensitivity?: boolean;
  /** Run the tolerance spread (Monte Carlo, +-0.5 mm on every coordinate unless bandMm is given). */
  tolerance?: { samples: number; seed: number; bandMm?: number };
  /** Run a tune with this plan (checked by readTunePlan) and report what it would change; the report stays of the design as drawn. */
  tune?: { plan: TunePlan; variables: ResolvedVariable[]; planName: string };
  /** Which stage is running, for a progress line. */
  onStage?: (stage: string) => void;
}

export const DEFAULT_MAP_STEP_DEG = 2;

/** A full-lock pose (lean 0, the envelope's handlebar angle one way) and its turning circle. */
export interface FullLock {
  turn: 'left' | 'right';
  handlebarDeg: number;
  pose: PoseReport;
}

/** One pose of the lean-linkage sheet: its inputs and `tiltbench pose --json`'s leanLinkage there. */
export interface LeanLinkageRow {
  leanDeg: number;
  /** Spring compression, mm (+ = compressed; the pose's heave is minus this). */
  springTravelMm: number;
  pose: PoseReport;
}

/** The lean-linkage sheet: the rocker against lean (spring held) and the spring against its travel (upright). */
export interface LeanLinkageSheetData {
  byLean: LeanLinkageRow[];
  byTravel: LeanLinkageRow[];
}

/** One pose of the rear-pair sheet and `tiltbench pose --json` there (its analysis.rear). */
export interface RearPairRow {
  leanDeg: number;
  handlebarDeg: number;
  pose: PoseReport;
}

/** The leaning rear pair's sheet: rear camber and toe against lean (straight ahead); the four-wheel turn centre and slips in turns. */
export interface RearPairSheetData {
  byLean: RearPairRow[];
  turns: RearPairRow[];
}

export interface ReportData {
  source: Omit<ReportSource, 'file' | 'design'> & { name: string; notes: string };
  design: ResolvedDesign;
  hardpoints: (HardpointRow & { key: number; label: string; group: string })[];
  /** The design pose as `tiltbench pose <design> --json` reports it (lean 0, handlebar 0, tyres on the ground). */
  designPose: PoseReport;
  curves: CurveSet;
  map: EnvelopeMapData;
  check: DesignCheck;
  fullLock: FullLock[];
  graph: MechanismGraph & { drawing: DrawingLayout };
  drawingPoints: KeyedPoint[];
  figures: DrawingFigures | null;
  sensitivity: SensitivityReport | null;
  tolerance: ToleranceReport | null;
  tune: (TuneReport & { planName: string }) | null;
  /** With a lean linkage: its sheet's poses (null without one). */
  leanLinkage: LeanLinkageSheetData | null;
  /** With a leaning rear pair: its sheet's poses (null for other rears). */
  rearPair: RearPairSheetData | null;
}

/** The request `tiltbench pose` makes by default: lean 0, handlebar 0, on the ground. */
export const DESIGN_POSE_REQUEST: PoseRequest = {
  contact: 'ground',
  steerBy: 'handlebar',
  leanDeg: 0,
  handlebarDeg: 0,
  heaveMm: 0,
  travelRightMm: 0,
  travelLeftMm: 0,
  wheelAngleDeg: 0,
};

const v3 = (p: { x: number; y: number; z: number }): Vec3 => [p.x, p.y, p.z];

export function gatherReport(src: ReportSource, options: ReportOptions = {}): ReportData {
  const stage = options.onStage ?? (() => {});
  const d = src.design;
  const entries = new Map(hardpointEntries(src.file).map((e) => [e.key, e]));
  const keys = new Map<string, number>();
  const hardpoints = hardpointTable(src.file).map((row) => {
    if (!keys.has(row.point)) keys.set(row.point, keys.size + 1);
    const e = entries.get(row.point);
    return { ...row, key: keys.get(row.point)!, label: e?.label ?? row.point, group: e?.group ?? '' };
  });

  stage('design pose');
  const designPose = solveSinglePose(d, DESIGN_POSE_REQUEST).report;
  stage('curves');
  const curves = computeCurves({ design: src.file });
  stage('envelope map');
  const map = computeMap({ design: src.file, angleStepDeg: options.mapStepDeg ?? DEFAULT_MAP_STEP_DEG });
  stage('check');
  const check = checkDesign(d, { steps: options.checkSteps ?? { leanDeg: 1, handlebarDeg: 1, travelMm: 10 }, contact: 'ground', judged: 'operating' });
  stage('full lock');
  const fullLock: FullLock[] = (['left', 'right'] as const).map((turn) => {
    const handlebarDeg = turn === 'left' ? d.envelope.handlebarDeg : -d.envelope.handlebarDeg;
    return { turn, handlebarDeg, pose: solveSinglePose(d, { ...DESIGN_POSE_REQUEST, handlebarDeg }).report };
  });

  let leanLinkage: LeanLinkageSheetData | null = null;
  if (d.leanLinkage) {
    stage('lean linkage');
    const at = (leanDeg: number, springTravelMm: number): LeanLinkageRow => ({
      leanDeg,
      springTravelMm,
      pose: solveSinglePose(d, { ...DESIGN_POSE_REQUEST, leanDeg, heaveMm: -springTravelMm }).report,
    });
    const L = d.envelope.leanDeg;
    const e = d.envelope;
    leanLinkage = {
      byLean: [-L, -L / 2, 0, L / 2, L].map((lean) => at(lean, 0)),
      byTravel: [-e.reboundMm, -e.reboundMm / 2, 0, e.bumpMm / 2, e.bumpMm].map((t) => at(0, t)),
    };
  }

  let rearPair: RearPairSheetData | null = null;
  if (d.vehicle.rear.kind === 'leaningPair') {
    stage('rear pair');
    const at = (leanDeg: number, handlebarDeg: number): RearPairRow => ({
      leanDeg,
      handlebarDeg,
      pose: solveSinglePose(d, { ...DESIGN_POSE_REQUEST, leanDeg, handlebarDeg }).report,
    });
    const L = d.vehicle.tilting ? d.envelope.leanDeg : 0;
    const H = d.envelope.handlebarDeg;
    rearPair = {
      byLean: [-L, -L / 2, 0, L / 2, L].map((lean) => at(lean, 0)),
      // Upright at half and full handlebar each way, and leaning into each turn by half the envelope.
      turns: [at(0, H), at(0, H / 2), at(0, -H / 2), at(0, -H), at(L / 2, -H / 2), at(-L / 2, H / 2)],
    };
  }

  // The drawing at design position: the template's graph, its points at their design places.
  const graph = buildMechanism(d, { contact: 'travel', steerBy: 'handlebar' });
  const drawingPoints: KeyedPoint[] = hardpoints.map((h) => ({ id: h.id, key: h.key, label: `${h.group ? h.group.toLowerCase() + ' ' : ''}${h.label}${h.side === 'centre' ? '' : `, ${h.side}`}`, side: h.side, at: [h.at.x, h.at.y, h.at.z] }));
  const a = designPose.analysis;
  const figures: DrawingFigures | null =
    a && a.wheels.left.axisGroundPointMm
      ? {
        contactLeft: v3(a.wheels.left.contactPatchMm),
        contactRight: v3(a.wheels.right.contactPatchMm),
        axisGroundLeft: v3(a.wheels.left.axisGroundPointMm),
        kpiDeg: a.wheels.left.kpiDeg,
        casterDeg: a.wheels.left.casterDeg,
        trailMm: a.wheels.left.trailMm,
        scrubRadiusMm: a.wheels.left.scrubRadiusMm,
        wheelbaseMm: d.vehicle.wheelbaseMm,
      }
    : null;

  let sensitivity: SensitivityReport | null = null;
  if (options.sensitivity) {
    stage('sensitivity study');
    sensitivity = runSensitivity(src.file, {});
  }
  let tolerance: ToleranceReport | null = null;
  if (options.tolerance) {
    stage('tolerance study');
    tolerance = runToleranceSpread(src.file, { samples: options.tolerance.samples, seed: options.tolerance.seed, bands: { defaultMm: options.tolerance.bandMm ?? 0.5 } });
  }
  let tune: ReportData['tune'] = null;
  if (options.tune) {
    stage('tune');
    tune = { ...runTune(src.file, options.tune.plan, options.tune.variables), planName: options.tune.planName };
  }
  return {
    source: { fileName: src.fileName, sha256: src.sha256, madeAt: src.madeAt, name: src.file.name, notes: src.file.notes ?? '' },
    design: d,
    hardpoints,
    designPose,
    curves,
    map,
    check,
    fullLock,
    graph,
    drawingPoints,
    figures,
    sensitivity,
    tolerance,
    tune,
    leanLinkage,
    rearPair,
  };
}
