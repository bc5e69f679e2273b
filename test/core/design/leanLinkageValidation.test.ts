/**
 * Validation of the balance-beam lean linkage (design block leanLinkage): the Pipit demo is
 * accepted and resolves and writes back unchanged; each refused variant gets one message
 * naming the field, what was expected and what was found. Built from the Pipit with one thing
 * changed.
 */
import { describe, expect, it } from 'vitest';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign, unresolveDesign } from '../../../core/design/resolveDesign';
import { hardpointEntries } from '../../../core/design/hardpointCatalogue';
import type { DesignFile } from '../../../core/design/types';
import { pipitDoc } from '../mechanism/pipitDemo';

function messages(d: DesignFile): string[] {
  const r = validateDesign(d, 'test.tiltsheet');
  return r.ok ? [] : r.issues.map((i) => i.message);
}

describe('lean linkage validation', () => {
  it('accepts the Pipit, resolves both sides and writes the same file back', () => {
    const d = pipitDoc();
    expect(messages(d)).toEqual([]);
    const r = resolveDesign(d);
    expect(r.leanLinkage!.rocker.linkJoint.left).toEqual({ x: 0, y: 200, z: 420 });
    expect(r.leanLinkage!.pushLinks.armJoint.right.y).toBe(-200);
    expect(unresolveDesign(r).leanLinkage).toEqual(d.leanLinkage);
    const keys = hardpointEntries(d).map((e) => e.key);
    expect(keys).toEqual(expect.arrayContaining(['leanLinkage.rocker.pivot', 'leanLinkage.pushLinks.armJoint', 'leanLinkage.actuator.rockerMount']));
  });

  it('on a vehicle that does not tilt: names leanLinkage and vehicle.tilting', () => {
    const d = pipitDoc();
    d.vehicle.tilting = false;
    d.envelope.leanDeg = 0;
    const m = messages(d);
    expect(m).toEqual(['test.tiltsheet: leanLinkage: expected a tilting vehicle (vehicle.tilting true): the linkage lets the frame lean, found vehicle.tilting false']);
  });

  it('coincident spring mounts: names leanLinkage.carrier.carrierMount and the distance', () => {
    const d = pipitDoc();
    d.leanLinkage!.carrier.carrierMount = { ...d.leanLinkage!.carrier.frameMount };
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toMatch(/^test\.tiltsheet: leanLinkage\.carrier\.carrierMount: is 0 mm from leanLinkage\.carrier\.frameMount; the carrier slides along the line between them/);
  });

  it('a rocker link joint on the rocker axis: names leanLinkage.rocker.linkJoint', () => {
    const d = pipitDoc();
    d.leanLinkage!.rocker.linkJoint = { x: 50, y: 0, z: 420 };
    const m = messages(d);
    expect(m.some((x) => /^test\.tiltsheet: leanLinkage\.rocker\.linkJoint: is 0 mm from the line through leanLinkage\.rocker\.pivot and leanLinkage\.rocker\.axis/.test(x))).toBe(true);
  });

  it('a push-link joint on the wishbone pivot axis: names leanLinkage.pushLinks.armJoint', () => {
    const d = pipitDoc();
    d.leanLinkage!.pushLinks.armJoint = { x: 0, y: -60, z: 140 };
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toMatch(/^test\.tiltsheet: leanLinkage\.pushLinks\.armJoint: is 0 mm from the line through frontEnd\.lower\.frontPivot and frontEnd\.lower\.rearPivot/);
  });

  it('a stop angle out of range and a missing rocker axis: the schema names the field, unit and value', () => {
    const d = pipitDoc();
    d.leanLinkage!.rocker.stopDeg = 120;
    const m = messages(d);
    expect(m).toHaveLength(1);
    expect(m[0]).toMatch(/leanLinkage\.rocker\.stopDeg/);
    expect(m[0]).toMatch(/120/);
    expect(m[0]).toMatch(/deg/);
    const e = pipitDoc() as unknown as { leanLinkage: { rocker: Record<string, unknown> } };
    delete e.leanLinkage.rocker.axis;
    const m2 = messages(e as unknown as DesignFile);
    expect(m2.join('\n')).toMatch(/leanLinkage\.rocker\.axis/);
  });

  it('on centre-pivot members: names leanLinkage and frontEnd.kind', () => {
    const d = pipitDoc();
    d.frontEnd = {
      kind: 'centrePivot',
      upper: { pivot: { x: 0, y: 0, z: 330 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: -13.3, y: -313.7, z: 330 } },
      lower: { pivot: { x: 0, y: 0, z: 150 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: 12, y: -352, z: 150 } },
    };
    const m = messages(d);
    expect(m).toContain('test.tiltsheet: leanLinkage: expected split wishbones (frontEnd.kind "splitWishbones"): the push links act on one wishbone per side, found frontEnd.kind "centrePivot"');
  });
});
