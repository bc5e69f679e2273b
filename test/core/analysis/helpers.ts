/**
 * Test helpers for the analysis: demo and invented designs, and one-call solve + analyse.
 * Designs are plain JSON documents edited in place, then validated and resolved exactly as
 * a file would be, so a test design that the validator would refuse fails loudly.
 */

import { readFileSync } from 'node:fs';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile, ResolvedDesign } from '../../../core/design/types';
import { buildMechanism, type PoseMode } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver, type SolveResult } from '../../../core/solver/PoseSolver';
import { PoseAnalyser } from '../../../core/analysis/PoseAnalyser';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';

/** Tests write designs freely, so documents are loosely typed here. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type Doc = any;

export function demoDoc(name: 'heron-tilting-velomobile' | 'swift-parallelogram-trike' | 'wren-rack-trike'): Doc {
  return JSON.parse(readFileSync(new URL(`../../../assets/designs/${name}.tiltsheet`, import.meta.url), 'utf8'));
}

export function resolveDoc(doc: Doc): ResolvedDesign {
  const v = validateDesign(doc);
  if (!v.ok) throw new Error('test design is invalid:\n' + v.issues.map((i) => i.message).join('\n'));
  return resolveDesign(v.design as DesignFile);
}

export const demo = (name: Parameters<typeof demoDoc>[0]): ResolvedDesign => resolveDoc(demoDoc(name));

export interface Solved {
  result: SolveResult;
  analysis: PoseAnalysis;
  solver: PoseSolver;
}

/** Solve one pose from the design pose (continuation) and analyse it; throws if it fails. */
export function solveAnalyse(design: ResolvedDesign, inputs: Partial<PoseInputs>, mode: Partial<PoseMode> = {}): Solved {
  const solver = new PoseSolver(buildMechanism(design, { contact: mode.contact ?? 'ground', steerBy: mode.steerBy ?? 'handlebar' }));
  const result = solver.solve({ ...zeroInputs(), ...inputs }, false);
  if (result.status !== 'converged') throw new Error(`pose did not solve: ${result.status}: ${result.message}`);
  return { result, analysis: new PoseAnalyser(design, solver.mechanism).analyse(result), solver };
}

/**
 * Invented split-wishbone trike with rack steering and a vertical steering axis through the
 * contact patch (zero caster, KPI, trail and scrub), so steering turns each wheel about its
 * contact point: the geometry of Gillespie's Ackermann relation and SAE J695's formula.
 *   track 760 mm (contact patches at y = +-380), wheelbase 1000 mm.
 *   arm: steering-arm joint at x = armX (negative = rearward arm), lateral offset `armInward`
 *        from the kingpin (positive = inboard), z 200; the rack's joint at the same x and z.
 *   scrubMm: the steering axis this far inboard of the wheel's mid-plane.
 */
export function kingpinTrike(opts: { armX?: number; armInward?: number; scrubMm?: number; rackY?: number } = {}): Doc {
  const armX = opts.armX ?? -72;
  const inward = opts.armInward ?? 0;
  const scrub = opts.scrubMm ?? 0;
  const ky = -380 + scrub;
  const d = demoDoc('wren-rack-trike');
  d.name = 'test: kingpin through the contact patch';
  d.vehicle.tilting = true;
  d.frontEnd.upper.outerJoint = { x: 0, y: ky, z: 310 };
  d.frontEnd.lower.outerJoint = { x: 0, y: ky, z: 140 };
  d.upright.wheelCentre = { x: 0, y: -380, z: 230 };
  d.upright.staticToeDeg = 0;
  d.upright.staticCamberDeg = 0;
  d.upright.steeringArmJoint = { x: armX, y: ky + inward, z: 200 };
  d.steering.tieRodJoint = { x: armX, y: opts.rackY ?? -150, z: 200 };
  d.envelope = { leanDeg: 20, handlebarDeg: 60, bumpMm: 40, reboundMm: 40 };
  return d;
}

/**
 * Invented tilting trike with equal, parallel, horizontal split wishbones (200 mm from the
 * pivots at y = -150 to the outer joints at y = -350), a vertical steering axis at y = -350,
 * rack steering, and the steering arm at x = armX (negative = rearward). The tie rod's inner
 * end sits at y = rackY: -150 makes it the same length as the wishbones and parallel to them.
 */
export function parallelTrike(opts: { armX?: number; rackY?: number } = {}): Doc {
  const armX = opts.armX ?? -70;
  const d = demoDoc('wren-rack-trike');
  d.name = 'test: equal parallel wishbones';
  d.vehicle.tilting = true;
  d.frontEnd = {
    kind: 'splitWishbones',
    upper: { frontPivot: { x: 100, y: -150, z: 300 }, rearPivot: { x: -100, y: -150, z: 300 }, outerJoint: { x: 0, y: -350, z: 300 } },
    lower: { frontPivot: { x: 100, y: -150, z: 150 }, rearPivot: { x: -100, y: -150, z: 150 }, outerJoint: { x: 0, y: -350, z: 150 } },
  };
  d.upright.wheelCentre = { x: 0, y: -400, z: 230 };
  d.upright.staticToeDeg = 0;
  d.upright.staticCamberDeg = 0;
  d.upright.steeringArmJoint = { x: armX, y: -350, z: 225 };
  d.steering = { kind: 'rack', axis: { x: 0, y: -1, z: 0 }, tieRodJoint: { x: armX, y: opts.rackY ?? -150, z: 225 }, mmPerHandlebarDeg: 0.5 };
  d.envelope = { leanDeg: 25, handlebarDeg: 30, bumpMm: 40, reboundMm: 40 };
  return d;
}

/** Every number in a value is finite; returns the paths of the ones that are not. */
export function nonFinitePaths(value: unknown, path = ''): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinitePaths(v, `${path}[${i}]`));
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => nonFinitePaths(v, path ? `${path}.${k}` : k));
  return [];
}

/**
 * Objects holding a null measure without saying why: every object with a null field must
 * carry a reason (`reason`, or `<field>Reason`, or its parent's reason for nested points).
 */
export function unexplainedNulls(value: unknown, path = '', parentHasReason = false): string[] {
  if (Array.isArray(value)) return value.flatMap((v, i) => unexplainedNulls(v, `${path}[${i}]`, parentHasReason));
  if (!value || typeof value !== 'object') return [];
  const obj = value as Record<string, unknown>;
  const hasReason = typeof obj.reason === 'string' && obj.reason.length > 0;
  const out: string[] = [];
  for (const [k, v] of Object.entries(obj)) {
    const p = path ? `${path}.${k}` : k;
    if (v === null) {
      const own = typeof obj[`${k.replace(/(Mm|Deg)$/, '')}Reason`] === 'string';
      if (!hasReason && !own && !parentHasReason) out.push(p);
    } else if (typeof v === 'object') {
      out.push(...unexplainedNulls(v, p, hasReason));
    }
  }
  return out;
}
