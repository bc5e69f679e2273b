// The coordinates a study moves, the copy of a design with some moved, and the default poses.
import { describe, it, expect } from 'vitest';
import { demo, demoDoc } from '../analysis/helpers';
import { hardpointIds } from '../../../core/design/hardpointCsv';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { offsetDesignFile, studyCoordinates } from '../../../core/studies/studyCoordinates';
import { regionSamplePoses } from '../../../core/studies/studyPoses';

describe('study coordinates', () => {
  const file = demoDoc('heron-tilting-velomobile');

  it('covers every hardpoint of the table: x y z of each point and side, or of each mirrored pair', () => {
    const ids = hardpointIds(file);
    const each = studyCoordinates(file, 'each');
    expect(each.length).toBe(3 * ids.length);
    for (const id of ids) for (const axis of ['x', 'y', 'z']) expect(each.some((c) => c.id === `${id}:${axis}`), `${id}:${axis}`).toBe(true);
    const pairs = studyCoordinates(file, 'together');
    const sided = ids.filter((id) => /\.(right|left)$/.test(id)).length;
    expect(pairs.length).toBe(3 * (ids.length - sided / 2));
    const joint = pairs.find((c) => c.id === 'frontEnd.lower.outerJoint:z')!;
    expect(joint.point).toBe('lower wishbone outer joints (both sides)');
    expect(joint.direction).toBe('up');
    expect(each.find((c) => c.id === 'frontEnd.lower.outerJoint.right:y')!.point).toBe('right lower wishbone outer joint');
    expect(pairs.find((c) => c.id === 'steering.pivot:y')!).toMatchObject({ point: 'bell crank pivot', direction: 'to the left', side: null });
  });

  it('moves a pair as mirror images, one side alone, or a centre point, and leaves the input alone', () => {
    const before = JSON.stringify(file);
    const pairs = studyCoordinates(file, 'together');
    const each = studyCoordinates(file, 'each');
    const move = (coords: typeof pairs, id: string, d: number) => resolveDesign(offsetDesignFile(file, coords, coords.map((c) => (c.id === id ? d : 0))));
    const base = resolveDesign(file);
    const arm = base.upright.steeringArmJoint;

    const out = move(pairs, 'upright.steeringArmJoint:y', 2).upright.steeringArmJoint;
    expect(out.right.y).toBeCloseTo(arm.right.y - 2, 12); // outward on the right is -y
    expect(out.left.y).toBeCloseTo(arm.left.y + 2, 12);

    const one = move(each, 'upright.steeringArmJoint.left:z', 1.5).upright.steeringArmJoint;
    expect(one.left.z).toBeCloseTo(arm.left.z + 1.5, 12);
    expect(one.right).toEqual(arm.right);

    const pivot = move(pairs, 'steering.pivot:y', 1).steering;
    expect(pivot.kind === 'bellCrank' && pivot.pivot.y).toBeCloseTo((base.steering as { pivot: { y: number } }).pivot.y + 1, 12);
    expect(JSON.stringify(file)).toBe(before);
  });
});

describe('default poses: a sample of the operating region', () => {
  it('keeps the ridden cells of a 5 x 5 lean x handlebar grid and drops the countersteer corners', () => {
    const design = demo('heron-tilting-velomobile');
    const s = regionSamplePoses(design);
    expect(s.poses.length + s.outside + s.notAssembled).toBe(25);
    expect(s.poses.every((p) => p.travelMm === 0)).toBe(true);
    // Leaning right (positive lean) while steering left (positive handlebar) at full lean is a
    // transient, not a place the vehicle rides (a balanced turn leans into it: tan(lean) =
    // v^2 / gR; common practice, no source).
    const e = design.envelope;
    expect(s.poses.some((p) => p.leanDeg === e.leanDeg && p.handlebarDeg === e.handlebarDeg)).toBe(false);
    expect(s.poses.some((p) => p.leanDeg === -e.leanDeg && p.handlebarDeg === -e.handlebarDeg)).toBe(false);
    expect(s.poses.some((p) => p.leanDeg === 0 && p.handlebarDeg === 0)).toBe(true);
  });

  it('a vehicle that does not tilt is sampled upright only', () => {
    const s = regionSamplePoses(demo('wren-rack-trike'));
    expect(s.poses.length).toBe(5);
    expect(s.poses.every((p) => p.leanDeg === 0)).toBe(true);
  });
});
