/**
 * The leaning rear pair (`vehicle.rear.kind: "leaningPair"`, a tilting quadricycle), on the
 * invented Plover demo and on changed copies of it.
 *
 * - The lean x handlebar grid: every pose closes below 1e-9 mm and both rear tyres touch the
 *   ground, their lowest point found from the closed form of a tilted circle (a circle of
 *   radius rho whose plane has unit normal a reaches rho sqrt(1 - a_z^2) below its centre;
 *   elementary analytic geometry), not from the solver's own contact routine.
 * - A parallelogram keeps opposite sides parallel (planar geometry, Euclid; the parallelogram
 *   four-bar in R. L. Norton, Design of Machinery): the rear uprights stay parallel to the
 *   carrier post, which is fixed in the frame, so a rear wheel with zero static camber has a
 *   camber to the ground equal to the frame's lean (right wheel +lean, left -lean, top outward
 *   positive) and a camber to the frame of 0; the members turn about axes along x, so toe stays 0.
 * - The four-wheel turn centre against an independent least-squares solve of the four axis
 *   lines by numpy.linalg.lstsq (/usr/bin/python3), with slip angles written out again in
 *   Python; and, in closed form, Ackermann geometry (Gillespie, Fundamentals of Vehicle
 *   Dynamics, 1992: each front wheel at atan(L / (R -+ t/2)), rear wheels straight) whose lines
 *   meet on the rear axle line at radius R with every slip 0.
 * - Mirrored inputs give mirrored results.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDesignText, validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign, unresolveDesign } from '../../../core/design/resolveDesign';
import { designWarnings } from '../../../core/design/designWarnings';
import { hardpointEntries } from '../../../core/design/hardpointCatalogue';
import { hardpointIds } from '../../../core/design/hardpointCsv';
import type { DesignFile, ResolvedDesign } from '../../../core/design/types';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { drawingProblems } from '../../../core/mechanism/drawingLayout';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { fourWheelTurnCentre } from '../../../core/analysis/rearPair';
import { starterLeaningRear } from '../../../core/design/rearPairStarter';
import { loadDemos } from '../reliability/demoDesigns';
import { drawView, VIEWS, type DrawingFigures, type KeyedPoint } from '../../../core/report/drawings';
import { hardpointTable } from '../../../core/design/hardpointCsv';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';
import { report } from '../solver/report';

const DEG = Math.PI / 180;
const DEMO = new URL('../../../assets/designs/plover-tilting-quad.tiltsheet', import.meta.url);

function demoFile(): DesignFile {
  const parsed = parseDesignText(readFileSync(DEMO, 'utf8'), 'plover-tilting-quad.tiltsheet');
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('; '));
  return parsed.design;
}

function resolved(d: DesignFile): ResolvedDesign {
  const checked = validateDesign(d);
  if (!checked.ok) throw new Error(checked.issues.map((i) => i.message).join('; '));
  return resolveDesign(checked.design);
}

const inputs = (leanDeg: number, handlebarDeg: number): PoseInputs => ({ ...zeroInputs(), leanDeg, handlebarDeg });

/** Lowest point height of a torus tyre: the crown circle (radius R - r, plane normal a) sinks (R - r) sqrt(1 - a_z^2) below its centre, then the crown r. */
function lowestTyreZ(centreZ: number, axis: readonly number[], rolling: number, crown: number): number {
  const n = Math.hypot(axis[0], axis[1], axis[2]);
  const az = axis[2] / n;
  return centreZ - (rolling - crown) * Math.sqrt(Math.max(0, 1 - az * az)) - crown;
}

/** World spin axis of a rear wheel from the body rotation (column-major, design -> world). */
function turn(rot: readonly number[], d: readonly number[]): number[] {
  return [0, 1, 2].map((i) => rot[i] * d[0] + rot[3 + i] * d[1] + rot[6 + i] * d[2]);
}

describe('leaning rear pair: the Plover demo', () => {
  const design = resolved(demoFile());

  it('validates with no warnings, lists its rear hardpoints, and draws every part it names', () => {
    expect(designWarnings(demoFile())).toEqual([]);
    const keys = hardpointEntries(demoFile()).map((e) => e.key);
    for (const k of ['vehicle.rear.upper.pivot', 'vehicle.rear.lower.pivot', 'vehicle.rear.upper.outerJoint', 'vehicle.rear.lower.outerJoint', 'vehicle.rear.wheelCentre']) {
      expect(keys).toContain(k);
    }
    // the hardpoint CSV walks the schema: the rear points are rows of it too
    expect(hardpointIds(demoFile())).toContain('vehicle.rear.wheelCentre.left');
    const graph = buildMechanism(design);
    expect(drawingProblems(graph)).toEqual([]);
    expect(graph.wheels.map((w) => w.side).sort()).toEqual(['left', 'right']);
    expect(graph.rearWheels?.map((w) => w.side).sort()).toEqual(['left', 'right']);
    expect(graph.drawing.rearWheels.map((w) => w.body).sort()).toEqual(['left.rearUpright', 'right.rearUpright']);
    // every drawn joint selects a row of the hardpoint table (the rear joints included)
    const ids = new Set(hardpointIds(demoFile()));
    const drawn = graph.drawing.joints.map((j) => j.hardpoint);
    expect(drawn.filter((h) => !ids.has(h))).toEqual([]);
    expect(drawn).toContain('vehicle.rear.upper.outerJoint.right');
    // the resolved design writes back to the file form it came from
    expect(unresolveDesign(design)).toEqual(demoFile());
  });

  it('solves the lean x handlebar grid, every pose closed below 1e-9 mm with both rear tyres on the ground', () => {
    for (const contact of ['ground', 'travel'] as const) {
      const graph = buildMechanism(design, { contact, steerBy: 'handlebar' });
      const solver = new PoseSolver(graph);
      const rear = graph.rearWheels!;
      let worstResidual = 0;
      let worstHeight = 0;
      let poses = 0;
      for (let lean = -30; lean <= 30; lean += 10) {
        for (let hb = -30; hb <= 30; hb += 10) {
          const res = solver.solve(inputs(lean, hb), false);
          expect(res.status, `${contact}, lean ${lean}, handlebar ${hb}: ${res.message}`).toBe('converged');
          expect(res.residualMm!).toBeLessThan(1e-9);
          worstResidual = Math.max(worstResidual, res.residualMm!);
          const m = solver.mechanism;
          m.forward();
          for (const w of rear) {
            const c = [0, 0, 0];
            m.worldPoint(w.body, w.centre, c);
            const rot = Array.from(m.rot.subarray(9 * w.body, 9 * w.body + 9));
            const z = lowestTyreZ(c[2], turn(rot, w.spinAxis), w.rollingRadius, w.crownRadius);
            worstHeight = Math.max(worstHeight, Math.abs(z));
            expect(Math.abs(z), `${contact}, lean ${lean}, handlebar ${hb}, ${w.side} rear tyre height`).toBeLessThan(1e-9);
          }
          poses++;
        }
      }
      expect(poses).toBe(49);
      report(`leaning rear pair, ${contact}: worst residual (mm) over the grid`, worstResidual);
      report(`leaning rear pair, ${contact}: worst rear tyre height (mm) over the grid`, worstHeight);
    }
  });

  it('negative control: rear wheels fixed in the leaning frame would not both touch the ground', () => {
    // Turned with the frame about x through the origin by 20 deg, the design wheel centres' tyres
    // differ in height by about the track times sin(20 deg).
    const r = demoFile().vehicle.rear;
    if (r.kind !== 'leaningPair') throw new Error('demo rear is not a leaning pair');
    const y = (r.wheelCentre as { y: number; z: number }).y;
    const z = (r.wheelCentre as { y: number; z: number }).z;
    const lean = 20 * DEG;
    const axis = [0, Math.cos(lean), Math.sin(lean)];
    const tyre = demoFile().wheels.rear;
    const heights = [y, -y].map((yy) => lowestTyreZ(yy * Math.sin(lean) + z * Math.cos(lean), axis, tyre.rollingRadiusMm, tyre.crownRadiusMm));
    expect(Math.abs(heights[0] - heights[1])).toBeGreaterThan(100);
  });

  it('rear camber to the ground equals the lean (parallelogram), camber to the frame and toe stay 0', () => {
    const solver = new PoseSolver(buildMechanism(design));
    const rear = solver.mechanism.graph.rearWheels!;
    let worst = 0;
    for (const lean of [-30, -17.5, -5, 0, 12, 25, 30]) {
      for (const hb of [0, 20]) {
        const res = solver.solve(inputs(lean, hb), false);
        expect(res.status).toBe('converged');
        const m = solver.mechanism;
        m.forward();
        for (const w of rear) {
          const a = [0, 0, 0];
          m.worldDirection(w.body, w.spinAxis, a);
          // camber top outward positive: the spin axis (pointing left) tilts by it; right wheel +lean, left -lean
          const camberDeg = (w.side === 'right' ? 1 : -1) * Math.asin(a[2]) / DEG;
          const toeDeg = Math.atan2(-a[0], a[1]) / DEG;
          const want = w.side === 'right' ? lean : -lean;
          worst = Math.max(worst, Math.abs(camberDeg - want));
          expect(Math.abs(camberDeg - want), `lean ${lean}, handlebar ${hb}, ${w.side}`).toBeLessThan(1e-9);
          expect(Math.abs(toeDeg)).toBeLessThan(1e-9);
        }
      }
    }
    report('leaning rear pair: worst |rear camber - lean| (deg)', worst);
  });

  it('the pose analysis reports the same rear camber, toe 0 and the rear contacts on the ground', () => {
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    for (const lean of [-25, 10, 30]) {
      const a = engine.solve(inputs(lean, 15), { relatives: false }).analysis!;
      expect(a.rear).toBeDefined();
      for (const side of ['left', 'right'] as const) {
        const w = a.rear![side];
        expect(Math.abs(w.camberDeg - (side === 'right' ? lean : -lean))).toBeLessThan(1e-9);
        expect(Math.abs(w.camberToFrameDeg)).toBeLessThan(1e-9);
        expect(Math.abs(w.toeDeg)).toBeLessThan(1e-9);
        expect(Math.abs(w.steerDeg)).toBeLessThan(1e-9);
        expect(Math.abs(w.contactPatchMm.z)).toBeLessThan(1e-9);
      }
    }
  });

  it('mirrored inputs give mirrored rear wheels, turn centre and slips', () => {
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    for (const [lean, hb] of [[20, 20], [12, -25], [-30, 10]]) {
      const a = engine.solve(inputs(lean, hb), { relatives: false }).analysis!;
      const b = engine.solve(inputs(-lean, -hb), { relatives: false }).analysis!;
      const ra = a.rear!;
      const rb = b.rear!;
      // relative to the size: a turn centre tens of metres away moves by micrometres for 1e-10 changes in heading
      const near = (x: number, y: number, what: string) => expect(Math.abs(x - y) / Math.max(1, Math.abs(x)), what).toBeLessThan(1e-9);
      near(ra.left.camberDeg, rb.right.camberDeg, 'camber');
      near(ra.left.contactPatchMm.y, -rb.right.contactPatchMm.y, 'contact y');
      near(ra.left.contactPatchMm.x, rb.right.contactPatchMm.x, 'contact x');
      near(ra.left.centreMm.z, rb.right.centreMm.z, 'centre z');
      const ca = ra.turnCentre.centreMm!;
      const cb = rb.turnCentre.centreMm!;
      near(ca.x, cb.x, 'centre x');
      near(ca.y, -cb.y, 'centre y');
      const sa = ra.turnCentre.slipDeg!;
      const sb = rb.turnCentre.slipDeg!;
      near(sa.frontLeftDeg, -sb.frontRightDeg, 'front slip');
      near(sa.rearLeftDeg, -sb.rearRightDeg, 'rear slip');
      expect(a.turningCircle.turningDiameterMm === null).toBe(b.turningCircle.turningDiameterMm === null);
      if (a.turningCircle.turningDiameterMm !== null) near(a.turningCircle.turningDiameterMm, b.turningCircle.turningDiameterMm!, 'turning diameter');
    }
  });
});

describe('four-wheel turn centre', () => {
  it('Ackermann geometry (Gillespie): all four lines meet on the rear axle line at the radius, every slip 0', () => {
    const L = 1250;
    const t = 800;
    const tr = 760;
    for (const R of [3000, 6000, -4500]) {
      const left = { x: 0, y: t / 2, heading: Math.atan(L / (R - t / 2)) };
      const right = { x: 0, y: -t / 2, heading: Math.atan(L / (R + t / 2)) };
      const rl = { x: -L, y: tr / 2, heading: 0 };
      const rr = { x: -L, y: -tr / 2, heading: 0 };
      const c = fourWheelTurnCentre(left, right, rl, rr, 1);
      expect(Math.abs(c.centreMm!.x + L)).toBeLessThan(1e-6);
      expect(Math.abs(c.centreMm!.y - R)).toBeLessThan(1e-6);
      expect(c.lineSpreadMm!).toBeLessThan(1e-6);
      expect(c.worstSlipDeg!).toBeLessThan(1e-9);
    }
    // negative control: parallel steer (both front wheels at the inner angle) leaves slip
    const h = Math.atan(L / (3000 - t / 2));
    const c = fourWheelTurnCentre({ x: 0, y: t / 2, heading: h }, { x: 0, y: -t / 2, heading: h }, { x: -L, y: tr / 2, heading: 0 }, { x: -L, y: -tr / 2, heading: 0 }, 1);
    expect(c.worstSlipDeg!).toBeGreaterThan(0.1);
  });

  it('straight ahead: no centre, with the reason', () => {
    const z = { heading: 0 };
    const c = fourWheelTurnCentre({ x: 0, y: 400, ...z }, { x: 0, y: -400, ...z }, { x: -1250, y: 380, ...z }, { x: -1250, y: -380, ...z }, 1);
    expect(c.centreMm).toBeNull();
    expect(c.reason).toMatch(/straight ahead/);
  });

  it('the demo posed: the centre equals numpy.linalg.lstsq on the four axis lines, slips as Python computes them', () => {
    const design = resolved(demoFile());
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    const cases: { lean: number; hb: number; a: PoseAnalysis }[] = [];
    for (const [lean, hb] of [[0, 25], [20, 20], [-15, -30], [30, 10]]) {
      cases.push({ lean, hb, a: engine.solve(inputs(lean, hb), { relatives: false }).analysis! });
    }
    const lines = cases.map(({ a }) => {
      const w = [a.wheels.left, a.wheels.right, a.rear!.left, a.rear!.right];
      return w.map((x) => [x.contactPatchMm.x, x.contactPatchMm.y, x.steerDeg]);
    });
    const py = [
      'import json, math, sys',
      'import numpy as np',
      'out = []',
      'for wheels in json.load(sys.stdin):',
      '    A = []; b = []',
      '    for x, y, h in wheels:',
      '        h = math.radians(h); n = (math.cos(h), math.sin(h))',
      '        A.append(n); b.append(n[0] * x + n[1] * y)',
      '    c = np.linalg.lstsq(np.array(A), np.array(b), rcond=None)[0]',
      '    left = (wheels[0][2] + wheels[1][2]) / 2 >= 0',
      '    s = 1 if left else -1',
      '    slips = []',
      '    for x, y, h in wheels:',
      '        vx, vy = -s * (y - c[1]), s * (x - c[0])',
      '        d = math.degrees(math.atan2(vy, vx)) - h',
      '        d = (d + 180) % 360 - 180',
      '        slips.append(d)',
      '    out.append([float(c[0]), float(c[1]), slips])',
      'print(json.dumps(out))',
    ].join('\n');
    const got = JSON.parse(execFileSync('/usr/bin/python3', ['-c', py], { input: JSON.stringify(lines), encoding: 'utf8' })) as [number, number, number[]][];
    let worstC = 0;
    let worstS = 0;
    cases.forEach(({ lean, hb, a }, i) => {
      const tc = a.rear!.turnCentre;
      const [cx, cy, slips] = got[i];
      const what = `lean ${lean}, handlebar ${hb}`;
      expect(tc.centreMm, what).not.toBeNull();
      const dc = Math.hypot(tc.centreMm!.x - cx, tc.centreMm!.y - cy) / Math.max(1, Math.hypot(cx, cy));
      worstC = Math.max(worstC, dc);
      expect(dc, `${what}: centre ${JSON.stringify(tc.centreMm)} against numpy ${cx}, ${cy}`).toBeLessThan(1e-9);
      const s = tc.slipDeg!;
      const mine = [s.frontLeftDeg, s.frontRightDeg, s.rearLeftDeg, s.rearRightDeg];
      mine.forEach((v, k) => {
        worstS = Math.max(worstS, Math.abs(v - slips[k]));
        expect(Math.abs(v - slips[k]), `${what}: slip ${k}`).toBeLessThan(1e-9);
      });
      expect(tc.worstSlipDeg).toBeCloseTo(Math.max(...slips.map(Math.abs)), 12);
    });
    report('four-wheel turn centre against numpy lstsq: worst relative distance', worstC);
    report('four-wheel slips against Python: worst difference (deg)', worstS);
  });

  it('the turning circle is absent, with the reason, when the four wheels disagree beyond the slip tolerance', () => {
    const file = demoFile();
    file.tolerances = { ...(file.tolerances ?? {}), slipDeg: 0.01 };
    const engine = new PoseEngine(resolved(file), { contact: 'ground', steerBy: 'handlebar' });
    const a = engine.solve(inputs(20, 20), { relatives: false }).analysis!;
    expect(a.rear!.turnCentre.worstSlipDeg!).toBeGreaterThan(0.01);
    expect(a.turningCircle.turningDiameterMm).toBeNull();
    expect(a.turningCircle.reason).toMatch(/disagree on the turn centre/);
  });
});

describe('leaning rear pair: validation names the field', () => {
  const messages = (d: DesignFile) => {
    const r = validateDesign(d);
    return r.ok ? [] : r.issues.map((i) => i.message);
  };
  const rearOf = (d: DesignFile) => {
    if (d.vehicle.rear.kind !== 'leaningPair') throw new Error('not a leaning pair');
    return d.vehicle.rear;
  };

  it('a member pivot off the centre line', () => {
    const d = demoFile();
    rearOf(d).upper.pivot = { ...rearOf(d).upper.pivot, y: 12 };
    expect(messages(d).join('\n')).toMatch(/vehicle\.rear\.upper\.pivot\.y: expected a y within 1 mm of 0.*found 12/);
  });

  it('a rear wheel centre off the rear axle line the wheelbase gives', () => {
    const d = demoFile();
    rearOf(d).wheelCentre = { x: -1200, y: -380, z: 240 };
    expect(messages(d).join('\n')).toMatch(/vehicle\.rear\.wheelCentre\.x: expected an x within 1 mm of -vehicle\.wheelbaseMm = -1250 mm.*found -1200 mm/);
  });

  it('a missing field of the leaning pair', () => {
    const d = demoFile() as unknown as { vehicle: { rear: Record<string, unknown> } };
    delete d.vehicle.rear.wheelCentre;
    expect(messages(d as unknown as DesignFile).join('\n')).toMatch(/vehicle\.rear\.wheelCentre: required field missing/);
  });

  it('members that are not a parallelogram are warned about, naming the field', () => {
    const d = demoFile();
    rearOf(d).upper.outerJoint = { x: -1250, y: -300, z: 420 };
    expect(validateDesign(d).ok).toBe(true);
    const w = designWarnings(d).map((i) => i.message).join('\n');
    expect(w).toMatch(/vehicle\.rear\.upper\.outerJoint: on the right side, the rear members and the rear upright are not a parallelogram in rear view/);
  });
});

describe('leaning rear pair: the starter the design sheet offers', () => {
  it('on every demo: validates without a warning about the rear, and solves lean 20 deg with the rear tyres on the ground', () => {
    for (const demo of loadDemos()) {
      const d = JSON.parse(JSON.stringify(demo.design)) as DesignFile;
      d.vehicle.rear = starterLeaningRear(d);
      const warnings = designWarnings(d).filter((w) => w.path.startsWith('vehicle.rear'));
      expect(warnings, demo.file).toEqual([]);
      const engine = new PoseEngine(resolved(d), { contact: 'ground', steerBy: 'handlebar' });
      const a = engine.solve(inputs(d.vehicle.tilting ? 20 : 0, 10), { relatives: false }).analysis;
      expect(a, demo.file).not.toBeNull();
      expect(Math.abs(a!.rear!.left.contactPatchMm.z)).toBeLessThan(1e-9);
      expect(Math.abs(a!.rear!.right.contactPatchMm.z)).toBeLessThan(1e-9);
    }
  });
});

describe('leaning rear pair: the report drawings stay drawings of the front end', () => {
  it('no rear hardpoint is numbered and the side view spans the front end only', () => {
    const file = demoFile();
    const graph = buildMechanism(resolved(file));
    const points: KeyedPoint[] = hardpointTable(file).map((h, i) => ({ id: h.id, key: i + 1, label: h.id, side: h.side, at: [h.at.x, h.at.y, h.at.z] }));
    // the rear points are rows of the table (so a filter is needed at all)
    expect(points.some((p) => p.id.startsWith('vehicle.rear.'))).toBe(true);
    const figures: DrawingFigures = { contactLeft: [0, 400, 0], contactRight: [0, -400, 0], axisGroundLeft: [30, 340, 0], kpiDeg: 0, casterDeg: 7, trailMm: 35, scrubRadiusMm: 60, wheelbaseMm: 1250 };
    for (const view of VIEWS) {
      const svg = drawView(view, graph, points, figures);
      expect(svg, view.id).not.toMatch(/data-id="vehicle\.rear\./);
      expect(svg).toMatch(/data-id="frontEnd\.upper\.outerJoint/);
      if (view.id === 'side') {
        // viewBox u0 v0 width height: the front end is well under the 1250 mm wheelbase long
        const width = Number(/viewBox="[^ ]+ [^ ]+ ([^ ]+) /.exec(svg)![1]);
        expect(width).toBeLessThan(1000);
      }
    }
  });
});
