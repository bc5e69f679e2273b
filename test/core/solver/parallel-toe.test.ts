/**
 * Equal, parallel wishbones with a tie rod of the same length, parallel to them (its inner end
 * on the line of the inner pivots, its outer end on the line of the ball joints) keep toe
 * constant as the vehicle leans or the suspension moves. Common practice, no source (the
 * classic front-view construction; see the project's domain primer). The reason is exact
 * geometry: wishbones, upright, tie rod and frame form parallelograms, so the upright only
 * translates relative to the frame.
 *
 * Negative control: the same design with the tie rod 20 mm shorter (inner joint moved
 * outward) must show toe change, so these tests can fail.
 */
import { describe, it, expect } from 'vitest';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot, type PoseSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import type { ResolvedDesign } from '../../../core/design/types';
import { splitDesign, rack, P } from './designs';
import { report } from './report';

/**
 * Right side (left mirrors): both wishbones 370 mm long, horizontal, pivot axes along x, inner
 * pivots on the vertical line y = -30, ball joints on the vertical line y = -400. Tie rod at a
 * height between them (z = 240), 70 mm behind, from y = -30 (rack joint) to y = -400 (arm).
 */
function parallelDesign(rackJointY: number): ResolvedDesign {
  return splitDesign({
    name: 'equal parallel wishbones',
    upperFront: P(100, -30, 330),
    upperRear: P(-100, -30, 330),
    upperOuter: P(0, -400, 330),
    lowerFront: P(100, -30, 150),
    lowerRear: P(-100, -30, 150),
    lowerOuter: P(0, -400, 150),
    steeringArm: P(-70, -400, 240),
    wheelCentre: P(0, -460, 245),
    staticToeDeg: 0,
    staticCamberDeg: 0,
    steering: rack(P(-70, rackJointY, 240)),
    rollingRadiusMm: 245,
  });
}

const LEANS: number[] = [];
for (let l = 0; l <= 45; l += 2.5) LEANS.push(l);
const TRAVELS: number[] = [];
for (let t = 0; t <= 100; t += 5) TRAVELS.push(t);

/** Sweep an input outward from zero both ways, warm, as a user would drag a slider. */
function sweep(design: ResolvedDesign, contact: 'ground' | 'travel', values: number[], inputs: (v: number) => PoseInputs): Array<{ v: number; snap: PoseSnapshot }> {
  const out: Array<{ v: number; snap: PoseSnapshot }> = [];
  const solver = new PoseSolver(buildMechanism(design, { contact, steerBy: 'handlebar' }));
  for (const dir of [1, -1]) {
    solver.reset();
    for (const v of values) {
      const res = solver.solve(inputs(dir * v));
      expect(res.status, `${contact} ${dir * v}: ${res.message}`).toBe('converged');
      expect(res.residualMm!).toBeLessThan(1e-9);
      out.push({ v: dir * v, snap: takeSnapshot(solver.mechanism) });
    }
  }
  return out;
}

function toeSpread(rows: Array<{ snap: PoseSnapshot }>): number {
  let worst = 0;
  for (const { snap } of rows) worst = Math.max(worst, Math.abs(snap.wheels.left.toeDeg), Math.abs(snap.wheels.right.toeDeg));
  return worst;
}

const leanInputs = (v: number): PoseInputs => ({ ...zeroInputs(), leanDeg: v });
const bothTravel = (v: number): PoseInputs => ({ ...zeroInputs(), travelRightMm: v, travelLeftMm: v });
const opposedTravel = (v: number): PoseInputs => ({ ...zeroInputs(), travelRightMm: v, travelLeftMm: -v });

describe('equal, parallel wishbones and tie rod keep toe constant (common practice, no source)', () => {
  const good = parallelDesign(-30);

  it('over lean -45..45 deg with both tyres on the ground', () => {
    const rows = sweep(good, 'ground', LEANS, leanInputs);
    report('parallel wishbones, lean -45..45: max |toe| (deg)', toeSpread(rows));
    expect(toeSpread(rows)).toBeLessThan(1e-6);
    for (const { v, snap } of rows) {
      // the tyres really are on the ground and the frame really leans
      expect(Math.abs(snap.wheels.left.contactPoint[2])).toBeLessThan(1e-9);
      expect(Math.abs(snap.wheels.right.contactPoint[2])).toBeLessThan(1e-9);
      // the upright only translates relative to the frame: camber to the frame stays at its
      // static value, so camber to the ground equals the lean (right wheel: + lean, left: - lean)
      expect(Math.abs(snap.wheels.right.camberToFrameDeg)).toBeLessThan(1e-6);
      expect(Math.abs(snap.wheels.right.camberDeg - v)).toBeLessThan(1e-6);
      expect(Math.abs(snap.wheels.left.camberDeg + v)).toBeLessThan(1e-6);
    }
  });

  it('over wheel travel -100..100 mm, both wheels together and opposed', () => {
    const together = sweep(good, 'travel', TRAVELS, bothTravel);
    const opposed = sweep(good, 'travel', TRAVELS, opposedTravel);
    report('parallel wishbones, travel -100..100: max |toe| (deg)', Math.max(toeSpread(together), toeSpread(opposed)));
    expect(toeSpread(together)).toBeLessThan(1e-6);
    expect(toeSpread(opposed)).toBeLessThan(1e-6);
    // the travel was applied: wheel centre height in the (unleaned) frame = 245 + travel
    for (const { v, snap } of together) {
      expect(Math.abs(snap.wheels.right.centre[2] - (245 + v))).toBeLessThan(1e-9);
      expect(Math.abs(snap.wheels.left.centre[2] - (245 + v))).toBeLessThan(1e-9);
    }
  });
});

describe('negative control: a tie rod 20 mm shorter changes toe', () => {
  const short = parallelDesign(-50); // inner joint moved 20 mm outward on each side

  it('with lean', () => {
    const rows = sweep(short, 'ground', LEANS, leanInputs);
    report('short tie rod (control), lean: max |toe| (deg)', toeSpread(rows));
    expect(toeSpread(rows)).toBeGreaterThan(0.1);
  });

  it('with wheel travel', () => {
    const rows = sweep(short, 'travel', TRAVELS, bothTravel);
    const worst = toeSpread(rows);
    report('short tie rod (control), travel: max |toe| (deg)', worst);
    expect(worst).toBeGreaterThan(0.1);
    // Direction (primer, common practice): a tie rod shorter than the ideal pulls the steering
    // arm inward away from design height; with rearward arms that is toe-out (negative toe).
    for (const { v, snap } of rows) {
      if (Math.abs(v) >= 20) {
        expect(snap.wheels.right.toeDeg).toBeLessThan(0);
        expect(snap.wheels.left.toeDeg).toBeLessThan(0);
      }
    }
  });
});
