/**
 * The one-piece track-rod demo (Linnet) through the whole analysis: every pose of its lean x
 * handlebar grid (lean stays 0 on this non-tilting trike, so the grid runs over handlebar and
 * wheel travel) closes below 1e-9 mm with every measure finite or null with a reason; the
 * track rod keeps its length; the mirrored design (drag link on the other upright, y -> -y) at
 * mirrored inputs gives the same measures with left and right swapped (and the yaw-like ones
 * negated); a negative control shows the mirror check would catch an unswapped design.
 */
import { describe, expect, it } from 'vitest';
import { mirrorY, resolveSidedVec } from '../../../core/design/resolveDesign';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { runSweep, type SweepCell } from '../../../core/analysis/sweep';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';
import { nonFinitePaths, resolveDoc, solveAnalyse, unexplainedNulls, type Doc } from './helpers';
import { clone, demo } from '../reliability/demoDesigns';

const linnetDoc = (): Doc => clone(demo('linnet').design);

/** The Linnet with every point mirrored (y -> -y), sides swapped, the drag link on the left upright. */
function mirroredLinnet(): Doc {
  const d = linnetDoc();
  const m = linnetDoc();
  for (const [obj, key] of [
    [m.frontEnd.upper, 'frontPivot'],
    [m.frontEnd.upper, 'rearPivot'],
    [m.frontEnd.upper, 'outerJoint'],
    [m.frontEnd.lower, 'frontPivot'],
    [m.frontEnd.lower, 'rearPivot'],
    [m.frontEnd.lower, 'outerJoint'],
    [m.upright, 'steeringArmJoint'],
    [m.upright, 'wheelCentre'],
  ] as const) {
    const r = resolveSidedVec(obj[key]);
    obj[key] = { right: mirrorY(r.left), left: mirrorY(r.right) };
  }
  const drive = d.steering.drive;
  m.steering.drive = {
    kind: 'dragLink',
    upright: 'left',
    columnPivot: mirrorY(drive.columnPivot),
    columnAxis: mirrorY(drive.columnAxis),
    columnArmJoint: mirrorY(drive.columnArmJoint),
    uprightArmJoint: mirrorY(drive.uprightArmJoint),
  };
  return m;
}

describe('the Linnet (one-piece track rod, drag link) through the analysis', () => {
  it('its lean x handlebar x travel grid: every pose closed below 1e-9 mm, measures finite or explained, the track rod whole', () => {
    const design = resolveDoc(linnetDoc());
    const env = design.envelope;
    expect(design.vehicle.tilting).toBe(false);
    const handlebarDeg: number[] = [];
    for (let hb = -env.handlebarDeg; hb <= env.handlebarDeg + 1e-9; hb += 5) handlebarDeg.push(hb);
    const cells: SweepCell[] = [];
    runSweep(design, { leanDeg: [0], handlebarDeg, travelMm: [-env.reboundMm, 0, env.bumpMm] }, {}, (c) => cells.push(c));
    expect(cells).toHaveLength(handlebarDeg.length * 3);
    let worstResidual = 0;
    for (const c of cells) {
      if (!c.ok) throw new Error(`handlebar ${c.handlebarDeg}, travel ${c.travelMm}: did not solve`);
      expect(c.analysis.solver.status).toBe('converged');
      worstResidual = Math.max(worstResidual, c.analysis.solver.residualMm!);
      expect(nonFinitePaths(c.analysis)).toEqual([]);
      expect(unexplainedNulls(c.analysis)).toEqual([]);
    }
    expect(worstResidual).toBeLessThan(1e-9);
    // The track rod keeps its length (a fresh solve of a few poses, read from the snapshot).
    const solver = new PoseSolver(buildMechanism(design, { contact: 'ground', steerBy: 'handlebar' }));
    const arm = design.upright.steeringArmJoint;
    const rodLength = Math.hypot(arm.right.x - arm.left.x, arm.right.y - arm.left.y, arm.right.z - arm.left.z);
    for (const hb of [-50, -20, 35, 50]) {
      const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
      expect(res.status).toBe('converged');
      const snap = takeSnapshot(solver.mechanism);
      const r = snap.points['upright.steeringArmJoint.right'];
      const l = snap.points['upright.steeringArmJoint.left'];
      expect(Math.abs(Math.hypot(r[0] - l[0], r[1] - l[1], r[2] - l[2]) - rodLength)).toBeLessThan(1e-9);
    }
  });

  it('the mirrored design at mirrored inputs: the same measures, sides swapped, yaw-like ones negated', () => {
    const a0 = resolveDoc(linnetDoc());
    const m0 = resolveDoc(mirroredLinnet());
    for (const [travel, bar] of [
      [0, 15],
      [10, -30],
      [-5, 45],
    ]) {
      const a: PoseAnalysis = solveAnalyse(a0, { handlebarDeg: bar, travelRightMm: travel, travelLeftMm: travel }, { contact: 'travel' }).analysis;
      const m: PoseAnalysis = solveAnalyse(m0, { handlebarDeg: -bar, travelRightMm: travel, travelLeftMm: travel }, { contact: 'travel' }).analysis;
      for (const [s, o] of [
        ['left', 'right'],
        ['right', 'left'],
      ] as const) {
        for (const key of ['toeDeg', 'camberDeg', 'casterDeg', 'kpiDeg', 'trailMm', 'scrubRadiusMm', 'travelMm'] as const) {
          expect(m.wheels[o][key]!, `${key} ${s}, handlebar ${bar}`).toBeCloseTo(a.wheels[s][key]!, 7);
        }
        expect(m.wheels[o].steerDeg).toBeCloseTo(-a.wheels[s].steerDeg, 7);
        expect(m.slip[o].slipDeg).toBeCloseTo(-a.slip[s].slipDeg, 7);
        for (const j of a.joints.filter((x) => x.side === s)) {
          expect(m.joints.find((x) => x.side === o && x.joint === j.joint)!.articulationDeg, `${j.joint} ${s}`).toBeCloseTo(j.articulationDeg, 6);
        }
        expect(m.steering.steeringArmTransmissionDeg[o]).toBeCloseTo(a.steering.steeringArmTransmissionDeg[s], 6);
        expect(m.steering.linkageTransmissionDeg[o]).toBeCloseTo(a.steering.linkageTransmissionDeg[s], 6);
      }
      expect(m.steering.dragLinkTransmissionDeg!).toBeCloseTo(a.steering.dragLinkTransmissionDeg!, 6);
      expect(m.ackermann.innerSide).toBe(a.ackermann.innerSide === 'left' ? 'right' : 'left');
    }
  });

  it('negative control: the design against itself at mirrored inputs does not match (the drag link sits on one side)', () => {
    const a0 = resolveDoc(linnetDoc());
    const a = solveAnalyse(a0, { handlebarDeg: 30 }, { contact: 'travel' }).analysis;
    const m = solveAnalyse(a0, { handlebarDeg: -30 }, { contact: 'travel' }).analysis;
    expect(Math.abs(m.wheels.right.toeDeg - a.wheels.left.toeDeg)).toBeGreaterThan(0.01);
  });

  it('driven by a centre lever instead (the rod a body on a universal joint): the grid closes below 1e-9 mm and the mirror matches', () => {
    const withLever = (mirror: boolean): Doc => {
      const d = mirror ? mirroredLinnet() : linnetDoc();
      const a = resolveSidedVec(d.upright.steeringArmJoint).right;
      const s = mirror ? -1 : 1;
      // A lever on a vertical column 60 mm behind the rod, off the centre line, the short link to the rod's middle.
      d.steering.drive = {
        kind: 'centreLever',
        pivot: { x: a.x - 60, y: -80 * s, z: a.z + 40 },
        axis: { x: 0, y: 0, z: 1 },
        leverJoint: { x: a.x, y: -80 * s, z: a.z + 40 },
        trackRodJoint: { x: a.x, y: 0, z: a.z },
      };
      return d;
    };
    const design = resolveDoc(withLever(false));
    const cells: SweepCell[] = [];
    const handlebarDeg = [-40, -20, -5, 0, 5, 20, 40];
    runSweep(design, { leanDeg: [0], handlebarDeg, travelMm: [-8, 0, 15] }, {}, (c) => cells.push(c));
    expect(cells).toHaveLength(21);
    for (const c of cells) {
      if (!c.ok) throw new Error(`handlebar ${c.handlebarDeg}, travel ${c.travelMm}: did not solve`);
      expect(c.analysis.solver.residualMm!).toBeLessThan(1e-9);
      expect(nonFinitePaths(c.analysis)).toEqual([]);
      expect(c.analysis.steering.dragLinkTransmissionDeg).not.toBeNull();
    }
    const mirrored = resolveDoc(withLever(true));
    for (const bar of [15, -30]) {
      const a = solveAnalyse(design, { handlebarDeg: bar }, { contact: 'travel' }).analysis;
      const m = solveAnalyse(mirrored, { handlebarDeg: -bar }, { contact: 'travel' }).analysis;
      for (const [s, o] of [
        ['left', 'right'],
        ['right', 'left'],
      ] as const) {
        expect(m.wheels[o].toeDeg).toBeCloseTo(a.wheels[s].toeDeg, 7);
        expect(m.wheels[o].steerDeg).toBeCloseTo(-a.wheels[s].steerDeg, 7);
      }
      expect(m.steering.dragLinkTransmissionDeg!).toBeCloseTo(a.steering.dragLinkTransmissionDeg!, 6);
    }
  });
});
