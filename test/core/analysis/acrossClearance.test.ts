/**
 * Issue 14, item 5: the left-to-right clearance `check` keeps, the two front tyres apart.
 * - The tyre-to-tyre distance against a closed form: two mirror-image cambered wheels (plane
 *   geometry, derived below) and against a brute-force search over both circles;
 * - the crown circle rebuilt from a pose's reported centre, contact point and heading against
 *   the solved mechanism's own spin axis;
 * - `check` carries the item, judges a narrow track whose tyres meet when steered as over its
 *   limit, and passes the demos' wide tracks.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { crownCircleOf, tyreToTyreDistance, type CrownCircle } from '../../../core/analysis/clearance';
import { ACROSS_ID, acrossClearance, checkDesign } from '../../../core/analysis/designCheck';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import type { DesignFile, Vec3Mm } from '../../../core/design/types';

const DEG = Math.PI / 180;
const demo = (name: string) => JSON.parse(readFileSync(new URL(`../../../assets/designs/${name}.tiltsheet`, import.meta.url), 'utf8')) as DesignFile;

/** A circle of radius r about `centre`, in the plane spanned by x and the unit vector (0, -s*sin g, cos g). */
function cambered(y: number, z: number, r: number, inwardTopDeg: number, side: 1 | -1): CrownCircle {
  const g = inwardTopDeg * DEG;
  // The wheel plane holds x and its up direction, tilted toward the centre line at the top.
  const up: [number, number, number] = [0, -side * Math.sin(g), Math.cos(g)];
  const normal: [number, number, number] = [0, up[2], -up[1]]; // x cross up
  return { centre: [0, side * y, z], normal, radius: r };
}

describe('tyre-to-tyre distance', () => {
  it('mirror-image wheels tops tilted inward: 2 max(0, w - r sin g) - 2 c (plane geometry)', () => {
    // A circle of radius r with unit normal n reaches y = w - r sqrt(1 - n_y^2) at least (its
    // top here, n_y = cos g); its mirror image reaches -(that) at most, and the mirror pair of
    // tops is that far apart: the least distance between the circles. Past the centre line
    // (w < r sin g) the circles cross it at the same two points: distance 0.
    for (const [w, r, g, c] of [[400, 225, 0, 20], [300, 225, 8, 20], [200, 300, 25, 30], [120, 250, 30, 10]]) {
      const want = 2 * Math.max(0, w - r * Math.sin(g * DEG)) - 2 * c;
      const got = tyreToTyreDistance(cambered(w, 245, r, g, 1), cambered(w, 245, r, g, -1), c);
      expect(got, `w ${w} r ${r} g ${g}`).toBeCloseTo(want, 6);
    }
  });

  it('agrees with a brute-force search over both circles (random pairs)', () => {
    let seed = 12345;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const unit = (): [number, number, number] => {
      const v: [number, number, number] = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5];
      const n = Math.hypot(...v);
      return [v[0] / n, v[1] / n, v[2] / n];
    };
    const point = (c: CrownCircle, t: number): [number, number, number] => {
      const a: [number, number, number] = Math.abs(c.normal[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
      const n = c.normal;
      const u0: [number, number, number] = [n[1] * a[2] - n[2] * a[1], n[2] * a[0] - n[0] * a[2], n[0] * a[1] - n[1] * a[0]];
      const un = Math.hypot(...u0);
      const u: [number, number, number] = [u0[0] / un, u0[1] / un, u0[2] / un];
      const v: [number, number, number] = [n[1] * u[2] - n[2] * u[1], n[2] * u[0] - n[0] * u[2], n[0] * u[1] - n[1] * u[0]];
      return [0, 1, 2].map((k) => c.centre[k] + c.radius * (Math.cos(t) * u[k] + Math.sin(t) * v[k])) as [number, number, number];
    };
    const N = 1500;
    for (let trial = 0; trial < 12; trial++) {
      const a: CrownCircle = { centre: [0, 0, 0], normal: unit(), radius: 150 + 150 * rnd() };
      const b: CrownCircle = { centre: [600 * (rnd() - 0.5), 600 * (rnd() - 0.5), 600 * (rnd() - 0.5)], normal: unit(), radius: 150 + 150 * rnd() };
      const pb = Array.from({ length: N }, (_, j) => point(b, (2 * Math.PI * j) / N));
      let brute = Infinity;
      for (let i = 0; i < N; i++) {
        const p = point(a, (2 * Math.PI * i) / N);
        for (const q of pb) brute = Math.min(brute, Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]));
      }
      const got = tyreToTyreDistance(a, b, 0);
      // The search finds the true least distance; the grid of 1500 x 1500 points lies above it by at most
      // the chord sag and half a step on each circle: r (1 - cos(pi/N)) + r pi/N < 0.7 mm for r <= 300.
      expect(got, `trial ${trial}`).toBeLessThanOrEqual(brute + 1e-9);
      expect(brute - got, `trial ${trial}`).toBeLessThan(0.7);
    }
  });
});

describe('the crown circle from a pose analysis', () => {
  it("matches the solved mechanism's wheel centre and spin axis (leaned, steered, in travel)", () => {
    const design = resolveDesign(demo('heron-tilting-velomobile'));
    for (const [mode, lean, bar, travel] of [['ground', 20, 15, 0], ['ground', -15, -20, 0], ['travel', 10, 10, 25]] as const) {
      const engine = new PoseEngine(design, { contact: mode, steerBy: 'handlebar' }, { findings: false });
      const inputs = { ...zeroInputs(), leanDeg: lean, handlebarDeg: bar, travelLeftMm: travel, travelRightMm: travel };
      const a = engine.main.analyse(inputs);
      expect(a, `${mode} ${lean} ${bar}`).not.toBeNull();
      const g = engine.main.analyser.reader.read(engine.main.analyser.mechanism);
      for (const side of ['left', 'right'] as const) {
        const c = crownCircleOf(a!.wheels[side], design.wheels.front);
        const spin = g[side].spinAxis;
        expect(Math.abs(c.normal[0] * spin[0] + c.normal[1] * spin[1] + c.normal[2] * spin[2]), `${side} ${mode} ${lean} ${bar}`).toBeCloseTo(1, 9);
        c.centre.forEach((x, k) => expect(x).toBeCloseTo(g[side].wheelCentre[k], 6));
        expect(c.radius).toBe(design.wheels.front.rollingRadiusMm - design.wheels.front.crownRadiusMm);
      }
    }
  });
});

describe('check keeps the two tyres apart', () => {
  it('the demos: the item is there, within its limit, its worst the least distance found', () => {
    const design = resolveDesign(demo('wren-rack-trike'));
    const c = checkDesign(design, { steps: { handlebarDeg: 10, travelMm: 40 } });
    const item = c.full.items.find((i) => i.id === ACROSS_ID)!;
    expect(item.label).toBe('clearance left tyre to right tyre (across the vehicle)');
    expect(item.verdict).toBe('within');
    // Upright and straight the Wren's wheels are mirror images: the closed form above, with the
    // spin axis's y component cos(heading) cos(camber) (camber: the wheel plane's inclination from
    // the vertical; heading: its horizontal line's angle from x, here the static toe).
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' }, { findings: false });
    const straight = engine.main.analyse(zeroInputs())!;
    const left = straight.wheels.left;
    const ny = Math.cos(left.steerDeg * DEG) * Math.cos(left.camberDeg * DEG);
    const r = design.wheels.front.rollingRadiusMm - design.wheels.front.crownRadiusMm;
    const want = 2 * (left.centreMm.y - r * Math.sqrt(1 - ny * ny)) - 2 * design.wheels.front.crownRadiusMm;
    expect(acrossClearance(straight, design)).toBeCloseTo(want, 6);
    expect(item.worst!).toBeLessThanOrEqual(acrossClearance(straight, design) + 1e-9);
  });

  it('a narrow track whose tyres meet when steered: the item is over its limit and fails the full check', () => {
    const d = demo('wren-rack-trike');
    // Wheel centres 90 mm apart (two 40 mm tyres): legal at rest, but the wheels swing into each
    // other about steering axes far outboard of them.
    const written = d.upright.wheelCentre as Vec3Mm; // the demo writes one (mirrored) wheel centre
    d.upright.wheelCentre = { ...written, y: -45 };
    const c = checkDesign(resolveDesign(d), { steps: { handlebarDeg: 10, travelMm: 40 }, judged: 'full' });
    const item = c.full.items.find((i) => i.id === ACROSS_ID)!;
    expect(item.worst!).toBeLessThan(0);
    expect(item.verdict).toBe('over');
    expect(c.passed).toBe(false);
  });
});
