/**
 * The wheel-centre height warning (issue 9): a wheel centre more than 1 mm from the height at
 * which its tyre touches the ground loads with a warning that says what the design pose does.
 * The warning's claims are checked against what the pose solver then does at zero inputs, and
 * its on-the-ground height against a brute-force lowest point of the tyre.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { groundContactHeightMm, WHEEL_HEIGHT_TOLERANCE_MM } from '../../../core/design/designWarnings';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { designWarnings, parseDesignText, validateDesign } from '../../../core/design/validateDesign';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import type { DesignFile } from '../../../core/design/types';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Doc = any;

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');
const demoText = (name: string) => readFileSync(new URL(`../../../assets/designs/${name}.tiltsheet`, import.meta.url), 'utf8');

function design(json: Doc): DesignFile {
  const result = validateDesign(json);
  if (!result.ok) throw new Error(result.issues.map((i) => i.message).join('\n'));
  return result.design;
}

/** World z of each wheel centre and of the frame's origin at zero inputs, as the pose solver settles them. */
function designPose(d: DesignFile): { right: number; left: number; frameZ: number } {
  const graph = buildMechanism(resolveDesign(d));
  const solver = new PoseSolver(graph);
  const result = solver.solve(zeroInputs(), false);
  expect(result.reached, result.message).toBe(true);
  const m = solver.mechanism;
  m.forward();
  const z = (body: number, p: ArrayLike<number>) => {
    const out = [0, 0, 0];
    m.worldPoint(body, p, out);
    return out[2];
  };
  const wheel = (side: string) => graph.wheels.find((w) => w.side === side)!;
  const frame = graph.bodies.findIndex((b) => b.id === 'frame');
  return { right: z(wheel('right').body, wheel('right').centre), left: z(wheel('left').body, wheel('left').centre), frameZ: z(frame, [0, 0, 0]) };
}

describe('the on-the-ground height of a wheel centre', () => {
  it('matches the lowest point of the tyre found by brute force, with and without camber', () => {
    // The tyre is a torus: its crown circle's centre ring has radius (rolling - crown) in the
    // wheel plane, and the tread is `crown` below the ring's lowest point (geometry of a torus
    // on a plane). Sample the ring of a wheel cambered by c about the x axis.
    for (const [rolling, crown, camberDeg] of [[250, 20, 0], [230, 20, 8], [240, 23, -15]]) {
      const c = (camberDeg * Math.PI) / 180;
      let lowest = Infinity;
      for (let k = 0; k < 200000; k++) {
        const t = (2 * Math.PI * k) / 200000;
        // Ring point: (rolling - crown) (cos t along x + sin t along the plane's tilted up direction).
        lowest = Math.min(lowest, (rolling - crown) * Math.sin(t) * Math.cos(c));
      }
      const centreHeight = -lowest + crown; // the centre above the ground when the tread touches it
      expect(groundContactHeightMm(rolling, crown, camberDeg)).toBeCloseTo(centreHeight, 6);
    }
  });
});

describe('designWarnings', () => {
  it('says nothing for the demos and the fixture, whose wheel centres sit at their rolling radius', () => {
    for (const name of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike']) {
      const result = parseDesignText(demoText(name), `${name}.tiltsheet`);
      expect(result.ok && result.warnings).toEqual([]);
    }
    expect(designWarnings(design(JSON.parse(FIXTURE_TEXT)))).toEqual([]);
  });

  it('warns at more than 1 mm and not within it (negative control)', () => {
    const json: Doc = JSON.parse(FIXTURE_TEXT);
    json.upright.wheelCentre.z = 250 - WHEEL_HEIGHT_TOLERANCE_MM * 0.9;
    expect(designWarnings(design(json))).toEqual([]);
    json.upright.wheelCentre.z = 250 - WHEEL_HEIGHT_TOLERANCE_MM * 1.1;
    expect(designWarnings(design(json)).map((w) => w.path)).toEqual(['upright.wheelCentre.z']);
  });

  it('split wishbones: a wheel centre 6 mm low is lifted 6 mm against the frame, as the warning says', () => {
    const json: Doc = JSON.parse(demoText('heron-tilting-velomobile'));
    const written = json.upright.wheelCentre.z;
    json.upright.wheelCentre.z = written - 6;
    const d = design(json);
    const warnings = designWarnings(d);
    expect(warnings).toHaveLength(1); // one mirrored value: one warning for both sides
    expect(warnings[0].path).toBe('upright.wheelCentre.z');
    expect(warnings[0].message).toContain('is 6 mm below the height at which the tyre touches the ground (wheels.front.rollingRadiusMm = 245 mm)');
    expect(warnings[0].message).toContain('the wheel sits 6 mm higher against the frame than written');
    const pose = designPose(d);
    // The wishbones turn, so the upright tilts a little and the contact height moves by a few
    // hundredths of a millimetre: 0.1 mm covers it.
    expect(pose.right - (written - 6)).toBeCloseTo(6, 1);
    expect(pose.left - (written - 6)).toBeCloseTo(6, 1);
    expect(Math.abs(pose.frameZ)).toBeLessThan(1e-9); // the frame stays put (heave is driven at 0)
  });

  it('centre-pivot members: wheel centres 4 mm high make the frame sink 4 mm, as the warning says', () => {
    const json: Doc = JSON.parse(demoText('swift-parallelogram-trike'));
    json.upright.wheelCentre.z += 4;
    const d = design(json);
    const warnings = designWarnings(d);
    expect(warnings).toHaveLength(1);
    expect(warnings[0].message).toContain('is 4 mm above');
    expect(warnings[0].message).toContain('the frame sinks by about 4 mm');
    expect(designPose(d).frameZ).toBeCloseTo(-4, 1);
  });

  it('one side only: says which side, with that side\'s path', () => {
    const json: Doc = JSON.parse(FIXTURE_TEXT);
    const right = json.upright.wheelCentre;
    json.upright.wheelCentre = { right, left: { ...right, y: -right.y, z: right.z + 3 } };
    const warnings = designWarnings(design(json));
    expect(warnings.map((w) => w.path)).toEqual(['upright.wheelCentre.left.z']);
    expect(warnings[0].message).toContain('is 3 mm above');
  });

  it('with static camber, measures against the cambered tyre\'s height, not the rolling radius', () => {
    const json: Doc = JSON.parse(FIXTURE_TEXT);
    json.upright.staticCamberDeg = 8;
    const onGround = groundContactHeightMm(250, 20, 8); // 247.76 mm
    json.upright.wheelCentre.z = onGround + 0.5;
    expect(designWarnings(design(json))).toEqual([]); // 2.2 mm from 250 but 0.5 mm from the tyre's height
    json.upright.wheelCentre.z = 250;
    const [warning] = designWarnings(design(json));
    expect(warning.message).toContain(`${Math.round((250 - onGround) * 1000) / 1000} mm above`);
    expect(warning.message).toContain('8° of static camber');
  });

  it('reaches parseDesignText\'s result with the file name, and never refuses the design', () => {
    const text = FIXTURE_TEXT.replace(/("wheelCentre":\s*\{[^}]*"z":\s*)250/, '$1260');
    expect(text).not.toBe(FIXTURE_TEXT);
    const result = parseDesignText(text, 'trike.tiltsheet');
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.warnings.map((w) => w.message.slice(0, 40))).toEqual(['trike.tiltsheet: upright.wheelCentre.z: ']);
  });
});

describe('centre-pivot members that are not a parallelogram', () => {
  it('are warned about, and the warning is true: the demo leans, the same design with an upper outer joint 0.5 mm up does not', () => {
    const doc = JSON.parse(demoText('swift-parallelogram-trike'));
    expect(designWarnings(design(doc))).toEqual([]);
    const leans = (d: DesignFile) => new PoseSolver(buildMechanism(resolveDesign(d))).solve({ ...zeroInputs(), leanDeg: 5 }, false).reached;
    expect(leans(design(doc))).toBe(true);
    doc.frontEnd.upper.outerJoint.z += 0.5;
    const warnings = designWarnings(design(doc));
    expect(warnings.map((w) => w.path)).toEqual(['frontEnd.upper.outerJoint', 'frontEnd.upper.outerJoint']);
    expect(warnings[0].message).toMatch(/not a parallelogram in front view.*cannot lean/);
    // The mechanism agrees (negative control of the warning's claim): 5 deg of lean cannot be reached.
    expect(leans(design(doc))).toBe(false);
  });
});
