/**
 * The balance-beam lean linkage (design block leanLinkage) on the Pipit demo: the lean x
 * handlebar grid and spring-travel sweeps close below 1e-9 mm; pure lean keeps the spring's
 * length while the frame's height and lateral place come out of the solve; the tilt lock
 * (rocker angle driven) gives the same pose as driving the lean it took; mirrored inputs give
 * mirrored poses (with a lopsided design as the negative control); and the travel mode, where
 * the carrier and rocker are solved from the wheels, agrees with the ground mode.
 */
import { describe, expect, it } from 'vitest';
import { pipitDoc } from './pipitDemo';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { ResolvedDesign } from '../../../core/design/types';
import { bodyIndex, buildMechanism, type PoseMode } from '../../../core/mechanism/templates/buildMechanism';
import { LEAN_IDS } from '../../../core/mechanism/templates/leanLinkage';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { leanLinkageMeasures } from '../../../core/analysis/leanLinkageMeasures';

const GROUND: PoseMode = { contact: 'ground', steerBy: 'handlebar' };
const inputs = (p: Partial<PoseInputs>): PoseInputs => ({ ...zeroInputs(), ...p });

/** Every named point of the graph in world coordinates, by id. */
function points(solver: PoseSolver): Map<string, [number, number, number]> {
  const m = solver.mechanism;
  const out = new Map<string, [number, number, number]>();
  for (const p of m.graph.points) {
    const w: [number, number, number] = [0, 0, 0];
    m.worldPoint(p.body, p.design, w);
    out.set(p.id, w);
  }
  return out;
}

function springLength(solver: PoseSolver): number {
  const p = points(solver);
  const a = p.get(LEAN_IDS.frameMount)!;
  const b = p.get(LEAN_IDS.carrierMount)!;
  return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
}

function solveOrThrow(solver: PoseSolver, i: PoseInputs): void {
  const r = solver.solve(i);
  if (!r.reached || !(r.residualMm! < 1e-9)) throw new Error(`not closed at ${JSON.stringify(i)}: ${r.status} ${r.residualMm}`);
}

describe('balance-beam lean linkage (Pipit demo)', () => {
  const design = resolveDesign(pipitDoc());
  const env = design.envelope;

  it('closes every pose of the lean x handlebar grid and of spring-travel sweeps below 1e-9 mm', () => {
    const solver = new PoseSolver(buildMechanism(design, GROUND));
    let worst = 0;
    let count = 0;
    for (let lean = -env.leanDeg; lean <= env.leanDeg + 1e-9; lean += 5) {
      for (let bar = -env.handlebarDeg; bar <= env.handlebarDeg + 1e-9; bar += 5) {
        const r = solver.solve(inputs({ leanDeg: lean, handlebarDeg: bar }));
        expect(r.reached, `lean ${lean} handlebar ${bar}: ${r.message}`).toBe(true);
        worst = Math.max(worst, r.residualMm!);
        count++;
      }
    }
    for (const lean of [0, 15]) {
      // heaveMm is spring extension here: rebound is +, bump is -.
      for (let s = -env.bumpMm; s <= env.reboundMm + 1e-9; s += 5) {
        const r = solver.solve(inputs({ leanDeg: lean, heaveMm: s }));
        expect(r.reached, `lean ${lean} spring travel ${s}: ${r.message}`).toBe(true);
        worst = Math.max(worst, r.residualMm!);
        count++;
      }
    }
    expect(count).toBe(11 * 11 + 2 * (Math.floor((env.bumpMm + env.reboundMm) / 5 + 1e-9) + 1));
    expect(worst).toBeLessThan(1e-9);
  });

  it('pure lean keeps the spring length; the frame height and lateral place and the rocker move', () => {
    // In this layout pure lean is lean with the spring travel held (the carrier is driven), so the
    // length measured between the posed mounts is a consistency check of the drawing points and
    // the slide; what the solve must find is the frame's place and the rocker angle.
    const solver = new PoseSolver(buildMechanism(design, GROUND));
    const g = solver.mechanism.graph;
    const lateral = bodyIndex(g, LEAN_IDS.lateral);
    const heave = bodyIndex(g, 'heave');
    const rocker = bodyIndex(g, LEAN_IDS.rocker);
    const lengths: number[] = [];
    const shift: number[] = [];
    for (const lean of [-25, -10, 0, 10, 25]) {
      solveOrThrow(solver, inputs({ leanDeg: lean }));
      lengths.push(springLength(solver));
      shift.push(solver.mechanism.coord[lateral]);
      const m = solver.mechanism;
      // Mean y of the two lowest tyre points is zero (the new constraint row), read from the wheels.
      let ySum = 0;
      for (const w of g.wheels) {
        const c = [0, 0, 0];
        const a = [0, 0, 0];
        m.worldPoint(w.body, w.centre, c);
        m.worldDirection(w.body, w.spinAxis, a);
        const s = Math.sqrt(1 - a[2] * a[2]);
        ySum += c[1] + ((w.rollingRadius - w.crownRadius) * a[2] * a[1]) / s;
      }
      expect(Math.abs(ySum / 2)).toBeLessThan(1e-9);
      if (lean !== 0) {
        expect(Math.abs(m.coord[rocker])).toBeGreaterThan(0.05);
        expect(Math.abs(m.coord[heave])).toBeGreaterThan(0.01);
      }
    }
    for (const l of lengths) expect(Math.abs(l - lengths[2])).toBeLessThan(1e-9);
    // Leaning the other way mirrors the lateral shift (symmetric design).
    expect(shift[0]).toBeCloseTo(-shift[4], 9);
    expect(Math.abs(shift[4])).toBeGreaterThan(1);
  });

  it('tilt lock: driving the rocker to the angle a lean gave reproduces that pose to 1e-9 mm, and the lean at a stop gives the stop angle', () => {
    const byLean = new PoseSolver(buildMechanism(design, GROUND));
    const byRocker = new PoseSolver(buildMechanism(design, { ...GROUND, leanBy: 'rocker' }));
    const rocker = bodyIndex(byLean.mechanism.graph, LEAN_IDS.rocker);
    const frame = byLean.mechanism.graph.frameBody;
    let worst = 0;
    for (const [lean, bar, heave] of [[-20, 0, 0], [7, 10, 5], [18, -15, -10], [25, 25, 0]]) {
      solveOrThrow(byLean, inputs({ leanDeg: lean, handlebarDeg: bar, heaveMm: heave }));
      const angle = byLean.mechanism.coord[rocker] * (180 / Math.PI);
      byRocker.reset();
      solveOrThrow(byRocker, inputs({ leanDeg: angle, handlebarDeg: bar, heaveMm: heave }));
      expect(byRocker.mechanism.coord[frame] * (180 / Math.PI)).toBeCloseTo(lean, 9);
      const a = points(byLean);
      const b = points(byRocker);
      for (const [id, p] of a) {
        const q = b.get(id)!;
        worst = Math.max(worst, Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]));
      }
    }
    expect(worst).toBeLessThan(1e-9);

    const m = leanLinkageMeasures(design, GROUND, inputs({}))!;
    const stop = design.leanLinkage!.rocker.stopDeg;
    for (const [leanAtStop, expected] of [[m.leanAtStopDeg.positive!, stop], [m.leanAtStopDeg.negative!, -stop]] as const) {
      byLean.reset();
      solveOrThrow(byLean, inputs({ leanDeg: leanAtStop }));
      expect(byLean.mechanism.coord[rocker] * (180 / Math.PI)).toBeCloseTo(expected, 8);
    }
  });

  it('mirrored inputs give mirrored poses (lean +a, handlebar +h vs -a, -h); a lopsided design fails the same check', () => {
    const mirrorGap = (d: ResolvedDesign): number => {
      const s1 = new PoseSolver(buildMechanism(d, GROUND));
      const s2 = new PoseSolver(buildMechanism(d, GROUND));
      let worst = 0;
      for (const [lean, bar] of [[10, 5], [25, 0], [15, -10]]) {
        solveOrThrow(s1, inputs({ leanDeg: lean, handlebarDeg: bar }));
        solveOrThrow(s2, inputs({ leanDeg: -lean, handlebarDeg: -bar }));
        const a = points(s1);
        const b = points(s2);
        for (const [id, p] of a) {
          // The tilt lock sits on one side of the Pipit: it has no mirror image.
          if (id.startsWith('leanLinkage.actuator')) continue;
          const other = id.endsWith('.right') ? id.replace(/\.right$/, '.left') : id.endsWith('.left') ? id.replace(/\.left$/, '.right') : id;
          const q = b.get(other)!;
          worst = Math.max(worst, Math.hypot(p[0] - q[0], p[1] + q[1], p[2] - q[2]));
        }
      }
      return worst;
    };
    expect(mirrorGap(design)).toBeLessThan(1e-8);
    const lopsided = resolveDesign(pipitDoc());
    lopsided.leanLinkage!.pushLinks.armJoint.left = { ...lopsided.leanLinkage!.pushLinks.armJoint.left, y: lopsided.leanLinkage!.pushLinks.armJoint.left.y + 5 };
    expect(mirrorGap(lopsided)).toBeGreaterThan(0.1);
  });

  it('with the wheel travel given, the carrier and rocker solved from the wheels put the spring where the ground pose had it', () => {
    const ground = new PoseSolver(buildMechanism(design, GROUND));
    const travel = new PoseSolver(buildMechanism(design, { contact: 'travel', steerBy: 'handlebar' }));
    const frame = ground.mechanism.graph.frameBody;
    for (const [lean, heave] of [[0, 12], [15, 0], [-20, -8]]) {
      solveOrThrow(ground, inputs({ leanDeg: lean, heaveMm: heave }));
      // Each wheel centre's height in the frame's design axes, relative to design: the travel inputs.
      const m = ground.mechanism;
      const r = m.rot.subarray(9 * frame, 9 * frame + 9);
      const t = m.trans.subarray(3 * frame, 3 * frame + 3);
      const travelOf = (side: 'left' | 'right') => {
        const w = m.graph.wheels.find((x) => x.side === side)!;
        const p = [0, 0, 0];
        m.worldPoint(w.body, w.centre, p);
        return r[6] * (p[0] - t[0]) + r[7] * (p[1] - t[1]) + r[8] * (p[2] - t[2]) - w.centre[2];
      };
      const spring = springLength(ground);
      travel.reset();
      solveOrThrow(travel, inputs({ leanDeg: lean, travelRightMm: travelOf('right'), travelLeftMm: travelOf('left') }));
      expect(springLength(travel)).toBeCloseTo(spring, 7);
      // heaveMm is spring extension on this layout.
      expect(spring).toBeCloseTo(200 + heave, 9);
    }
  });
});
