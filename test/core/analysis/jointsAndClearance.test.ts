// Sources: joint angles against Rodrigues' rotation formula (a steer of t about axis k turns a
// stud s by acos(cos t + (k.s)^2 (1 - cos t))); the closed-form distances and the minimax tie-rod
// spin against brute-force search over densely sampled points (an independent method, no
// source needed beyond geometry).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { articulation, rotateShortest, tieRodArticulation } from '../../../core/analysis/jointArticulation';
import { segmentCircleDistance, segmentSegmentDistance } from '../../../core/analysis/distance3';
import { demo, demoDoc, kingpinTrike, resolveDoc, solveAnalyse } from './helpers';

type V = [number, number, number];
const DEG = Math.PI / 180;
const unit = (v: V): V => {
  const n = Math.hypot(...v);
  return [v[0] / n, v[1] / n, v[2] / n];
};
const dot = (a: V, b: V) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
function rotate(v: V, k: V, t: number): V {
  const c = Math.cos(t);
  const s = Math.sin(t);
  const kv = dot(k, v);
  const kx: V = [k[1] * v[2] - k[2] * v[1], k[2] * v[0] - k[0] * v[2], k[0] * v[1] - k[1] * v[0]];
  return [v[0] * c + kx[0] * s + k[0] * kv * (1 - c), v[1] * c + kx[1] * s + k[1] * kv * (1 - c), v[2] * c + kx[2] * s + k[2] * kv * (1 - c)];
}
const vec = fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true })).filter((v) => Math.hypot(...v) > 0.1) as fc.Arbitrary<V>;

describe('joint articulation', () => {
  it('is the angle between stud and housing axes', () => {
    expect(articulation([0, 0, 1], [0, 0, 1])).toBe(0);
    expect(articulation([0, 0, 1], [0, Math.sin(20 * DEG), Math.cos(20 * DEG)]) / DEG).toBeCloseTo(20, 12);
  });

  it('the shortest rotation takes a to b', () => {
    fc.assert(
      fc.property(vec, vec, vec, (a, b, v) => {
        const ua = unit(a);
        const ub = unit(b);
        const r = rotateShortest(ua, ub, ua);
        for (let i = 0; i < 3; i++) expect(r[i]).toBeCloseTo(ub[i], 9);
        const rv = rotateShortest(ua, ub, v);
        expect(Math.hypot(...rv)).toBeCloseTo(Math.hypot(...v), 9); // a rotation keeps lengths
      }),
      { numRuns: 200 },
    );
  });

  it('the tie-rod spin treatment climbs from the un-spun rod to the nearest minimax optimum (checked by brute force over the spin)', () => {
    // Directions from whole-numbered angles (0.01 deg steps): no exact axis alignments, whose
    // ties make flat optima no brute force can pin down.
    const direction = fc
      .tuple(fc.integer({ min: 0, max: 35999 }), fc.integer({ min: -8999, max: 8999 }))
      .map(([az, el]): V => [Math.cos((el / 100) * DEG) * Math.cos((az / 100) * DEG), Math.cos((el / 100) * DEG) * Math.sin((az / 100) * DEG), Math.sin((el / 100) * DEG)]);
    fc.assert(
      fc.property(direction, direction, direction, direction, direction, direction, (ad, an, so, si, uo, ui) => {
        const t = { axisDesign: unit(ad), axisNow: unit(an), outerStudDesign: unit(so), innerStudDesign: unit(si), outerStudNow: unit(uo), innerStudNow: unit(ui) };
        // Rods as built: a stud or bolt never lies along its rod, and a rod never turns end for end.
        const along = (a: V, b: V) => Math.abs(a[0] * b[0] + a[1] * b[1] + a[2] * b[2]);
        fc.pre(along(t.outerStudDesign, t.axisDesign) < 0.95 && along(t.innerStudDesign, t.axisDesign) < 0.95);
        fc.pre(along(t.outerStudNow, t.axisNow) < 0.95 && along(t.innerStudNow, t.axisNow) < 0.95);
        fc.pre(t.axisDesign[0] * t.axisNow[0] + t.axisDesign[1] * t.axisNow[1] + t.axisDesign[2] * t.axisNow[2] > -0.9);
        const res = tieRodArticulation(t);
        const e = t.axisNow;
        // The larger end articulation at spin s, by rotating the studs directly (Rodrigues).
        const worst = (s: number) =>
          Math.max(
            articulation(t.outerStudNow, rotate(rotateShortest(t.axisDesign, e, t.outerStudDesign), e, s)),
            articulation(t.innerStudNow, rotate(rotateShortest(t.axisDesign, e, t.innerStudDesign), e, s)),
          );
        // Each end must care about the spin (an end whose stud lies near the rod axis, or whose
        // articulation the spin hardly moves, leaves a flat optimum that no test can pin down).
        const ends = (s: number) => [
          articulation(t.outerStudNow, rotate(rotateShortest(t.axisDesign, e, t.outerStudDesign), e, s)),
          articulation(t.innerStudNow, rotate(rotateShortest(t.axisDesign, e, t.innerStudDesign), e, s)),
        ];
        const sweep = Array.from({ length: 72 }, (_, k) => ends((k / 72) * 2 * Math.PI));
        for (const i of [0, 1]) fc.pre(Math.max(...sweep.map((x) => x[i])) - Math.min(...sweep.map((x) => x[i])) > 0.05);
        const best = Math.max(res.outerRad, res.innerRad);
        expect(best).toBeCloseTo(worst(res.spinRad), 6); // acos near 0 resolves about 1e-8 rad
        // Never worse than the un-spun rod, and no better than the global optimum (the brute
        // force on a 0.1 deg grid bounds that from above, to within the grid's 0.0017 rad).
        let brute = Infinity;
        for (let k = 0; k < 720; k++) brute = Math.min(brute, worst((k / 720) * 2 * Math.PI));
        expect(best).toBeLessThanOrEqual(worst(0) + 1e-9);
        expect(best).toBeGreaterThan(brute - 0.01);
        // A local optimum: no nearby spin is better.
        // (1e-7 rad: where both ends are equal the optimum is a kink found to about that)
        for (const d of [-1e-3, 1e-3, -1e-2, 1e-2]) expect(worst(res.spinRad + d)).toBeGreaterThan(best - 1e-6);
        // Reached by a climb: one way round from 0 to the spin used (directly, or the other way
        // round the circle), the worse end never gets worse.
        const steps = 200;
        const monotone = (end: number) => {
          let prev = worst(0);
          for (let k = 1; k <= steps; k++) {
            const w = worst((end * k) / steps);
            if (w > prev + 1e-7) return false;
            prev = w;
          }
          return true;
        };
        const other = res.spinRad > 0 ? res.spinRad - 2 * Math.PI : res.spinRad + 2 * Math.PI;
        expect(monotone(res.spinRad) || monotone(other)).toBe(true);
      }),
      { numRuns: 300, seed: 20261204, endOnFailure: true },
    );
  });

  it('the tie-rod spin moves continuously along a smooth sweep of the joints (no jump to another optimum)', () => {
    // Outer stud turning steadily about a tilted axis while the rod axis swings: a path on which
    // the global minimax optimum switches between its two local optima.
    let prevSpin: number | null = null;
    let worstJump = 0;
    for (let k = 0; k <= 720; k++) {
      const a = (k / 720) * 2 * Math.PI;
      const res = tieRodArticulation({
        axisDesign: [0, 1, 0],
        axisNow: unit([0.2 * Math.sin(a), 1, 0.2 * Math.cos(a)]),
        outerStudDesign: [0, 0, 1],
        innerStudDesign: [0, 0, 1],
        outerStudNow: unit([Math.sin(0.6 * Math.sin(a)), 0.3 * Math.sin(2 * a), Math.cos(0.6 * Math.sin(a))]),
        innerStudNow: unit([-Math.sin(0.5 * Math.cos(a)), 0, Math.cos(0.5 * Math.cos(a))]),
      });
      if (prevSpin !== null) worstJump = Math.max(worstJump, Math.abs(Math.atan2(Math.sin(res.spinRad - prevSpin), Math.cos(res.spinRad - prevSpin))));
      prevSpin = res.spinRad;
    }
    expect(worstJump).toBeLessThan(0.05); // radians between poses 0.5 deg of sweep apart
  });

  it('is zero at design for every joint, and for a pure steer about a fixed axis equals the stud tilt (Rodrigues)', () => {
    const zero = solveAnalyse(demo('heron-tilting-velomobile'), {}).analysis;
    for (const j of zero.joints) expect(j.articulationDeg).toBeLessThan(1e-6);
    // Vertical steering axis, stud axes vertical: steering moves nothing about the outer joints.
    const kp = solveAnalyse(resolveDoc(kingpinTrike({ armInward: 20 })), { wheelAngleDeg: 30 }, { contact: 'travel', steerBy: 'leftWheel' }).analysis;
    const upper = kp.joints.find((j) => j.joint === 'upperOuter' && j.side === 'left')!;
    expect(upper.articulationDeg).toBeLessThan(1e-6);
    // Tilt the studs 30 degrees off the axis: a steer of theta about the axis k turns the stud
    // by acos(cos t + (k.s)^2 (1 - cos t)).
    const d = kingpinTrike({ armInward: 20 });
    const s: V = [0, Math.sin(30 * DEG), Math.cos(30 * DEG)];
    d.joints.upperOuter.studAxis = { x: s[0], y: -s[1], z: s[2] }; // right side; mirrored to the left
    const a = solveAnalyse(resolveDoc(d), { wheelAngleDeg: 30 }, { contact: 'travel', steerBy: 'leftWheel' }).analysis;
    const kz = Math.cos(30 * DEG);
    const t = 30 * DEG;
    const expected = Math.acos(Math.cos(t) + kz * kz * (1 - Math.cos(t))) / DEG;
    expect(a.joints.find((j) => j.joint === 'upperOuter' && j.side === 'left')!.articulationDeg).toBeCloseTo(expected, 6);
  });

  it('reports margin = rated - articulation and flags a joint over its rating', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    doc.joints.tieRodInner.ratedDeg = 10;
    const { analysis: a } = solveAnalyse(resolveDoc(doc), { handlebarDeg: 20 });
    const j = a.joints.find((x) => x.joint === 'tieRodInner' && x.side === 'right')!;
    expect(j.marginDeg).toBeCloseTo(10 - j.articulationDeg, 12);
    expect(j.marginDeg).toBeLessThan(0);
    expect(a.status).toBe('over');
    expect(a.checks.joint).toBe('over');
    expect(a.findings.some((f) => f.includes('tie rod, inner end, right'))).toBe(true);
  });
});

/** Distance from q to the circle (centre c, unit normal n, radius r), closed form. */
function pointCircle(q: V, c: V, n: V, r: number): number {
  const d: V = [q[0] - c[0], q[1] - c[1], q[2] - c[2]];
  const h = d[0] * n[0] + d[1] * n[1] + d[2] * n[2];
  return Math.hypot(Math.hypot(d[0] - h * n[0], d[1] - h * n[1], d[2] - h * n[2]) - r, h);
}

/** Nearest approach of a segment to a circle: 1e5 samples, then golden-section search around the best. */
function nearestBySearch(p0: V, p1: V, c: V, n: V, r: number): number {
  const at = (t: number): V => [p0[0] + t * (p1[0] - p0[0]), p0[1] + t * (p1[1] - p0[1]), p0[2] + t * (p1[2] - p0[2])];
  const N = 100000;
  let best = 0;
  for (let i = 0; i <= N; i++) if (pointCircle(at(i / N), c, n, r) < pointCircle(at(best / N), c, n, r)) best = i;
  let lo = Math.max(0, (best - 1) / N);
  let hi = Math.min(1, (best + 1) / N);
  const g = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 200; k++) {
    const a = hi - g * (hi - lo);
    const b = lo + g * (hi - lo);
    if (pointCircle(at(a), c, n, r) < pointCircle(at(b), c, n, r)) hi = b;
    else lo = a;
  }
  return pointCircle(at((lo + hi) / 2), c, n, r);
}

describe('clearance distances', () => {
  const point = fc.tuple(fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true })) as fc.Arbitrary<V>;
  const lerp = (a: V, b: V, t: number): V => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];

  it('segment to segment matches brute force', () => {
    fc.assert(
      fc.property(point, point, point, point, (p0, p1, q0, q1) => {
        let brute = Infinity;
        for (let i = 0; i <= 200; i++) {
          for (let j = 0; j <= 200; j++) {
            const a = lerp(p0, p1, i / 200);
            const b = lerp(q0, q1, j / 200);
            brute = Math.min(brute, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
          }
        }
        const d = segmentSegmentDistance(p0, p1, q0, q1);
        // A segment shorter than 1e-6 mm is taken as a point.
        expect(d).toBeLessThanOrEqual(brute + 1e-5);
        expect(d).toBeGreaterThan(brute - 1.5); // brute force grid spacing
      }),
      { numRuns: 40 },
    );
  });

  it('segment to circle matches brute force', () => {
    fc.assert(
      fc.property(point, point, vec, fc.double({ min: 10, max: 120, noNaN: true }), (p0, p1, n, r) => {
        const nn = unit(n);
        const c: V = [0, 0, 0];
        // circle points: c + r (u cos + w sin) with u, w spanning the plane normal to n
        const u = unit(Math.abs(nn[0]) < 0.9 ? [0, -nn[2], nn[1]] : [-nn[2], 0, nn[0]]);
        let brute = Infinity;
        for (let i = 0; i <= 400; i++) {
          const q = lerp(p0, p1, i / 400);
          // nearest circle point to q: along the projection of q onto the plane
          const h = dot(q, nn);
          const px: V = [q[0] - h * nn[0], q[1] - h * nn[1], q[2] - h * nn[2]];
          const rho = Math.hypot(...px);
          const dirv = rho > 1e-12 ? ([px[0] / rho, px[1] / rho, px[2] / rho] as V) : u;
          brute = Math.min(brute, Math.hypot(q[0] - r * dirv[0], q[1] - r * dirv[1], q[2] - r * dirv[2]));
        }
        const d = segmentCircleDistance(p0, p1, c, nn, r);
        const len = Math.hypot(p1[0] - p0[0], p1[1] - p0[1], p1[2] - p0[2]);
        expect(d).toBeLessThanOrEqual(brute + 1e-5);
        expect(d).toBeGreaterThanOrEqual(brute - len / 400 - 1e-9);
      }),
      { numRuns: 300 },
    );
  });

  it('segment to circle: a narrow dip between samples, a segment through the centre, one along the axis', () => {
    // Cases that defeated sampling-based versions: found by random search against brute force.
    const u = unit([-0.055894914434755534, 0, 0.08292019380302582]);
    // A line through the circle's centre at angle a to its plane passes r sin a from the circle
    // (here sin a = |u . x|); the foot, 8.3 mm along, lies on the segment.
    expect(segmentCircleDistance([0, 0, 0], [-66.33615503759673, 0, 0], [0, 0, 0], u, 10)).toBeCloseTo(10 * Math.abs(u[0]), 12);
    const p0: V = [69.28148832250254, 77.68848876984653, 30.4068234943633];
    const p1: V = [-64.88076658833997, -63.950642548829784, -17.724933140340006];
    const n = unit([0.6892680894700036, -0.2681337896147675, -0.6730629775178505]);
    expect(segmentCircleDistance(p0, p1, [0, 0, 0], n, 20.428697840305993)).toBeCloseTo(nearestBySearch(p0, p1, [0, 0, 0], n, 20.428697840305993), 9);
    // The segment lies in the circle's plane through its centre and crosses the circle at z = -r.
    expect(segmentCircleDistance([0, 0, 32.42732661773984], [0, 0, -54.04554436289974], [0, 0, 0], [0, 1, 0], 32.53541820646565)).toBeCloseTo(0, 9);
    expect(segmentCircleDistance([0, -0.0141, 0], [0, 0.0149, 0], [0, 0, 0], [0, 1, 0], 10)).toBeCloseTo(10, 12);
  });

  it('flags a tie rod pushed into the lower wishbone, and the distance goes negative when they intersect', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    const base = solveAnalyse(resolveDoc(doc), {}).analysis.clearances.find((c) => c.pair === 'tieRod-lowerRail' && c.side === 'right')!;
    expect(base.distanceMm).toBeCloseTo(31, 9); // tie rod at z 187..200 above the rail at z 140: 187 - 140 - 10 - 6
    doc.parts = { tieRodRadiusMm: 40 };
    const fat = solveAnalyse(resolveDoc(doc), {}).analysis;
    const c = fat.clearances.find((x) => x.pair === 'tieRod-lowerRail' && x.side === 'right')!;
    expect(c.distanceMm).toBeCloseTo(31 - 34, 9);
    expect(fat.status).toBe('over');
    expect(fat.checks.clearance).toBe('over');
    expect(fat.worst.clearanceMm).toBeLessThan(0);
  });
});
