/**
 * Validation of a one-piece track rod (steering.kind "trackRod"): each refused design gets a
 * message naming the field, what was expected and what was found; the Linnet demo and its
 * knuckle-mounted variant are accepted. Built from the Linnet demo with one thing changed.
 */
import { describe, expect, it } from 'vitest';
import { validateDesign } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';
import { clone, demo } from '../reliability/demoDesigns';
import { starterSteering, starterTrackRodDrive } from '../../../renderer/model/designStarters';

const linnet = (): DesignFile => clone(demo('linnet').design);

function messages(d: DesignFile): string[] {
  const r = validateDesign(d, 'test.tiltsheet');
  return r.ok ? [] : r.issues.map((i) => i.message);
}

describe('one-piece track rod validation', () => {
  it('accepts the Linnet demo and a knuckle-mounted variant on kingpins', () => {
    expect(messages(linnet())).toEqual([]);
    const d = linnet();
    d.steering = { kind: 'trackRod', drive: { kind: 'knuckle', upright: 'left' } };
    d.upright.steeringAxis = 'kingpin';
    expect(messages(d)).toEqual([]);
  });

  it('a handlebar on an upright with ball joints: names steering.drive.kind and upright.steeringAxis', () => {
    const d = linnet();
    d.steering = { kind: 'trackRod', drive: { kind: 'knuckle', upright: 'right' } };
    d.upright.steeringAxis = 'ballJoints';
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toMatch(/^test\.tiltsheet: steering\.drive\.kind: expected "dragLink", or upright\.steeringAxis "kingpin".*found "knuckle" with upright\.steeringAxis "ballJoints"$/);
  });

  it('track-rod ends that differ from each other: names joints.tieRodInner with both ratings', () => {
    const d = linnet();
    d.joints.tieRodInner = { ...d.joints.tieRodInner, ratedDeg: 12 };
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toContain('joints.tieRodInner: expected the same kind and rating as joints.tieRodOuter (ballJoint, 25 deg)');
    expect(m[0]).toContain('found ballJoint, 12 deg');
    const e = linnet();
    e.joints.tieRodInner = { ...e.joints.tieRodInner, studAxis: { x: 1, y: 0, z: 0 } };
    expect(messages(e)[0]).toContain('joints.tieRodInner.studAxis: expected the stud axes of joints.tieRodOuter');
  });

  it('a drag-link arm joint on the driven upright\'s steering axis: names the field and the line', () => {
    const d = linnet();
    if (d.steering.kind !== 'trackRod' || d.steering.drive.kind !== 'dragLink') throw new Error('the Linnet has a drag link');
    const lo = d.frontEnd.lower.outerJoint as { x: number; y: number; z: number };
    d.steering.drive.uprightArmJoint = { ...lo };
    const m = messages(d);
    expect(m.some((x) => x.startsWith('test.tiltsheet: steering.drive.uprightArmJoint: on the right side, is 0 mm from the line through frontEnd.lower.outerJoint and frontEnd.upper.outerJoint; a joint on the steering axis cannot turn the upright'))).toBe(true);
  });

  it('a column arm joint on the column axis, and a drag link of zero length', () => {
    const d = linnet();
    if (d.steering.kind !== 'trackRod' || d.steering.drive.kind !== 'dragLink') throw new Error('the Linnet has a drag link');
    d.steering.drive.columnArmJoint = { ...d.steering.drive.columnPivot, z: 200 };
    expect(messages(d).some((x) => x.includes('steering.drive.columnArmJoint: is 0 mm from the line through steering.drive.columnPivot and steering.drive.columnAxis'))).toBe(true);
    const e = linnet();
    if (e.steering.kind !== 'trackRod' || e.steering.drive.kind !== 'dragLink') throw new Error('the Linnet has a drag link');
    e.steering.drive.uprightArmJoint = { ...e.steering.drive.columnArmJoint };
    expect(messages(e).some((x) => x.includes('steering.drive.uprightArmJoint: is 0 mm from steering.drive.columnArmJoint; the drag link runs between them'))).toBe(true);
  });

  it('a centre lever: accepted with its joint on the rod; a joint off the rod\'s line or past its end is refused, naming the field', () => {
    const d = linnet();
    const a = (d.upright.steeringArmJoint as { x: number; y: number; z: number });
    d.steering = { kind: 'trackRod', drive: { kind: 'centreLever', pivot: { x: a.x - 60, y: -80, z: a.z + 40 }, axis: { x: 0, y: 0, z: 1 }, leverJoint: { x: a.x, y: -80, z: a.z + 40 }, trackRodJoint: { x: a.x, y: 0, z: a.z } } };
    expect(messages(d)).toEqual([]);
    if (d.steering.kind !== 'trackRod' || d.steering.drive.kind !== 'centreLever') throw new Error('unreachable');
    d.steering.drive.trackRodJoint = { x: a.x, y: 0, z: a.z + 5 };
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toContain("steering.drive.trackRodJoint: expected a point on the track rod's line between upright.steeringArmJoint right and left");
    expect(m[0]).toContain('found 5 mm off the line, at 50 % of the way from the right end');
    d.steering.drive.trackRodJoint = { x: a.x, y: a.y - 20, z: a.z };
    expect(messages(d)[0]).toContain('steering.drive.trackRodJoint: expected a point on the track rod');
  });

  it('a drive of unknown kind or an upright named wrongly: the schema names the field', () => {
    const d = linnet() as unknown as { steering: { drive: Record<string, unknown> } };
    d.steering.drive.kind = 'chain';
    expect(messages(d as unknown as DesignFile)[0]).toContain('steering.drive.kind: expected one of "dragLink", "centreLever", "knuckle", found "chain"');
    const e = linnet() as unknown as { steering: { drive: Record<string, unknown> } };
    e.steering.drive.upright = 'middle';
    expect(messages(e as unknown as DesignFile)[0]).toContain('steering.drive.upright');
  });

  it("the workbench's starting blocks: a track rod on every demo, each drive, and back to tie rods, all valid", () => {
    for (const name of ['heron', 'swift', 'wren', 'linnet', 'finch']) {
      const base = clone(demo(name).design);
      for (const kind of ['dragLink', 'centreLever', 'knuckle'] as const) {
        const d = clone(base);
        d.steering = starterSteering(d, 'trackRod');
        if (d.steering.kind !== 'trackRod') throw new Error('expected a track rod');
        d.steering.drive = starterTrackRodDrive(d, kind);
        d.joints.tieRodInner = clone(d.joints.tieRodOuter);
        if (kind === 'knuckle') d.upright.steeringAxis = 'kingpin';
        expect(messages(d), `${name}, ${kind}`).toEqual([]);
      }
      for (const kind of ['bellCrank', 'rack', 'direct'] as const) {
        const d = clone(base);
        d.steering = starterSteering(d, kind);
        expect(messages(d), `${name} to ${kind}`).toEqual([]);
      }
    }
  });
});
