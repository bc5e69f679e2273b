/**
 * 1-D curves a designer reads the front end by, each a one-axis sweep (sweep.ts, so the
 * same warm continuation and the same measures):
 *   leanSteer     self-steer (road-wheel angle change at zero handlebar) and toe against lean
 *   bumpSteer     self-steer and toe against wheel travel (relative to the frame, zero lean)
 *   ratioLean     steering-ratio change from upright against lean, at the held handlebar
 *   slipSteer     toe mismatch: the front slip angles against handlebar (zero lean)
 *   ackermann     outer road-wheel angle against inner, with the ideal outer and the percentages
 *   camberLean    camber to ground and to frame against lean
 *   camberTravel  camber against wheel travel
 *   jointsLean    every joint's articulation against lean
 *   jointsSteer   every joint's articulation against handlebar
 *   steeringRatio road-wheel angles and overall and local ratio against handlebar
 *   frontLift     front lift with steer against handlebar (zero lean, tyres on the ground)
 * A pose that cannot be assembled leaves null in every series and is listed in `failures`.
 */

import type { ResolvedDesign } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { runSweep, type SweepAxes, type SweepCell, type SweepContact } from './sweep';
import { jointWords } from './words';
import { LOCAL_RATIO_STEP_DEG } from './PoseEngine';

export type CurveKind =
  | 'leanSteer'
  | 'bumpSteer'
  | 'ratioLean'
  | 'slipSteer'
  | 'ackermann'
  | 'camberLean'
  | 'camberTravel'
  | 'jointsLean'
  | 'jointsSteer'
  | 'steeringRatio'
  | 'frontLift';

export const CURVE_KINDS: readonly CurveKind[] = ['leanSteer', 'bumpSteer', 'ratioLean', 'slipSteer', 'ackermann', 'camberLean', 'camberTravel', 'jointsLean', 'jointsSteer', 'steeringRatio', 'frontLift'];

export interface CurveSeries {
  id: string;
  label: string;
  unit: string;
  values: (number | null)[];
}

export interface Curve {
  kind: CurveKind;
  title: string;
  /** The swept input. */
  input: { label: string; unit: string; values: number[] };
  /** The x axis to plot against (the swept input, or for 'ackermann' the inner road-wheel angle). */
  x: { label: string; unit: string; values: (number | null)[] };
  series: CurveSeries[];
  failures: { input: number; status: string; message: string }[];
}

export interface CurveOptions {
  /** Values of the swept input; a default from the design's envelope otherwise. */
  values?: number[];
  /** Inputs held: lean, handlebar, travel (defaults 0). */
  leanDeg?: number;
  handlebarDeg?: number;
  travelMm?: number;
}

type Axis = 'lean' | 'handlebar' | 'travel';

const SPEC: Record<CurveKind, { title: string; axis: Axis; contact: SweepContact }> = {
  leanSteer: { title: 'Self-steer against lean (lean steer), handlebar at zero', axis: 'lean', contact: 'ground' },
  bumpSteer: { title: 'Self-steer against wheel travel (bump steer)', axis: 'travel', contact: 'travel' },
  ratioLean: { title: 'Steering-ratio change against lean', axis: 'lean', contact: 'ground' },
  slipSteer: { title: 'Toe mismatch: front slip angles against handlebar', axis: 'handlebar', contact: 'ground' },
  ackermann: { title: 'Ackermann: outer against inner road-wheel angle', axis: 'handlebar', contact: 'ground' },
  camberLean: { title: 'Camber against lean', axis: 'lean', contact: 'ground' },
  camberTravel: { title: 'Camber against wheel travel', axis: 'travel', contact: 'travel' },
  jointsLean: { title: 'Joint articulation against lean', axis: 'lean', contact: 'ground' },
  jointsSteer: { title: 'Joint articulation against handlebar', axis: 'handlebar', contact: 'ground' },
  steeringRatio: { title: 'Steering ratio against handlebar', axis: 'handlebar', contact: 'ground' },
  frontLift: { title: 'Front lift with steer', axis: 'handlebar', contact: 'ground' },
};

/** Whether a curve kind sweeps lean (nothing to draw for a vehicle that does not lean). */
export const sweepsLean = (kind: CurveKind): boolean => SPEC[kind].axis === 'lean';

function defaultValues(design: ResolvedDesign, axis: Axis, kind: CurveKind): number[] {
  const e = design.envelope;
  const range = (lo: number, hi: number, n: number) => Array.from({ length: n + 1 }, (_, i) => lo + ((hi - lo) * i) / n);
  if (axis === 'lean') return e.leanDeg > 0 ? range(-e.leanDeg, e.leanDeg, 2 * Math.ceil(e.leanDeg)) : [0];
  if (axis === 'travel') {
    const lo = e.reboundMm > 0 ? -e.reboundMm : -40;
    const hi = e.bumpMm > 0 ? e.bumpMm : 40;
    const n = Math.max(2, Math.ceil((hi - lo) / 2));
    const v = range(lo, hi, n);
    if (!v.includes(0)) v.push(0);
    return v.sort((a, b) => a - b);
  }
  // Ackermann: left turns from straight ahead to lock (inner = left).
  if (kind === 'ackermann') return range(0, e.handlebarDeg, Math.max(1, Math.ceil(e.handlebarDeg)));
  return range(-e.handlebarDeg, e.handlebarDeg, Math.max(2, 2 * Math.ceil(e.handlebarDeg)));
}

type Getter = (a: PoseAnalysis) => number | null;

function seriesFor(kind: CurveKind, design: ResolvedDesign): { id: string; label: string; unit: string; get: Getter }[] {
  const both = (id: string, label: string, unit: string, get: (a: PoseAnalysis, side: 'left' | 'right') => number | null) => [
    { id: `${id}.left`, label: `${label}, left`, unit, get: (a: PoseAnalysis) => get(a, 'left') },
    { id: `${id}.right`, label: `${label}, right`, unit, get: (a: PoseAnalysis) => get(a, 'right') },
  ];
  const joints = () =>
    (['left', 'right'] as const).flatMap((side) =>
      (['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const).map((name) => ({
        id: `joint.${name}.${side}`,
        label: `${jointWords(name, side)} (rated ${design.joints[name].ratedDeg} deg)`,
        unit: 'deg',
        get: (a: PoseAnalysis) => a.joints.find((j) => j.joint === name && j.side === side)?.articulationDeg ?? null,
      })),
    );
  switch (kind) {
    case 'leanSteer':
    case 'bumpSteer':
      return [
        ...both('selfSteer', 'self-steer (road-wheel angle change, left +)', 'deg', (a, s) => a.selfSteer[`${s}Deg`]),
        ...both('toe', 'toe (toe-in +)', 'deg', (a, s) => a.wheels[s].toeDeg),
      ];
    case 'ratioLean':
      return [
        { id: 'ratioChange', label: 'steering-ratio change from upright', unit: '%', get: (a) => a.steering.ratioChangePct },
        { id: 'localRatio', label: 'local ratio (d handlebar / d mean road wheel)', unit: '', get: (a) => a.steering.localRatio },
      ];
    case 'slipSteer':
      return [...both('slip', 'slip angle (ISO 8855)', 'deg', (a, s) => a.slip[s].slipDeg)];
    case 'ackermann':
      return [
        { id: 'outer', label: 'outer road-wheel angle', unit: 'deg', get: (a) => a.ackermann.outerDeg },
        { id: 'idealOuter', label: 'ideal outer (Ackermann)', unit: 'deg', get: (a) => a.ackermann.idealOuterDeg },
        { id: 'error', label: 'outer - ideal outer', unit: 'deg', get: (a) => a.ackermann.errorDeg },
        { id: 'percent', label: 'Ackermann % (difference, adopted)', unit: '%', get: (a) => a.ackermann.percent },
        { id: 'percentCot', label: 'Ackermann % (cotangent form)', unit: '%', get: (a) => a.ackermann.percentCot },
      ];
    case 'camberLean':
    case 'camberTravel':
      return [
        ...both('camber', 'camber to ground (top out +)', 'deg', (a, s) => a.wheels[s].camberDeg),
        ...both('camberToFrame', 'camber to frame (top out +)', 'deg', (a, s) => a.wheels[s].camberToFrameDeg),
      ];
    case 'jointsLean':
    case 'jointsSteer':
      return joints();
    case 'steeringRatio':
      return [
        ...both('wheel', 'road-wheel angle', 'deg', (a, s) => a.wheels[s].steerDeg),
        { id: 'overallRatio', label: 'overall ratio (handlebar / mean road wheel)', unit: '', get: (a) => a.steering.overallRatio },
        { id: 'localRatio', label: 'local ratio (d handlebar / d mean road wheel)', unit: '', get: (a) => a.steering.localRatio },
      ];
    case 'frontLift':
      return [
        { id: 'frontLift', label: 'front lift with steer', unit: 'mm', get: (a) => a.suspension.frontLiftMm },
        ...both('travel', 'wheel travel (bump +)', 'mm', (a, s) => a.wheels[s].travelMm),
      ];
  }
}

export function curve(design: ResolvedDesign, kind: CurveKind, options: CurveOptions = {}): Curve {
  const spec = SPEC[kind];
  const values = options.values ?? defaultValues(design, spec.axis, kind);
  const held = { lean: options.leanDeg ?? 0, handlebar: options.handlebarDeg ?? 0, travel: options.travelMm ?? 0 };
  // The ratio change needs the local ratio, so its sweep carries the handlebar a step either
  // side of the held value and keeps the middle column.
  const withRatio = kind === 'ratioLean';
  const axes: SweepAxes = {
    leanDeg: spec.axis === 'lean' ? values : [held.lean],
    handlebarDeg:
      spec.axis === 'handlebar' ? values : withRatio ? [held.handlebar - LOCAL_RATIO_STEP_DEG, held.handlebar, held.handlebar + LOCAL_RATIO_STEP_DEG] : [held.handlebar],
    travelMm: spec.axis === 'travel' ? values : [held.travel],
  };
  const cells: SweepCell[] = new Array(values.length);
  runSweep(design, axes, { contact: spec.contact }, (c) => {
    if (withRatio && c.handlebarIndex !== 1) return;
    cells[spec.axis === 'lean' ? c.leanIndex : spec.axis === 'handlebar' ? c.handlebarIndex : c.travelIndex] = c;
  });
  const defs = seriesFor(kind, design);
  const failures: Curve['failures'] = [];
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (!c.ok) failures.push({ input: values[i], status: c.failure.solver.status, message: c.failure.solver.message });
  }
  const input = {
    label: spec.axis === 'lean' ? 'lean' : spec.axis === 'handlebar' ? 'handlebar angle' : 'wheel travel (bump +)',
    unit: spec.axis === 'travel' ? 'mm' : 'deg',
    values,
  };
  const x =
    kind === 'ackermann'
      ? { label: 'inner road-wheel angle', unit: 'deg', values: cells.map((c) => (c.ok ? c.analysis.ackermann.innerDeg : null)) }
      : { label: input.label, unit: input.unit, values: values.slice() };
  return {
    kind,
    title: spec.title,
    input,
    x,
    series: defs.map((d) => ({ id: d.id, label: d.label, unit: d.unit, values: cells.map((c) => (c.ok ? d.get(c.analysis) : null)) })),
    failures,
  };
}
