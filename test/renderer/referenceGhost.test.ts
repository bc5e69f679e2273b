// The reference design's ghost: its parts at the solved pose of the reference (a moved hardpoint
// shows where the reference has it), and each wheel's rim a circle of the rolling radius about
// the solved wheel centre, square to the solved spin axis (plain vector geometry).
import { describe, expect, it } from 'vitest';
import { resolveDesign } from '../../core/design/resolveDesign';
import { PoseSession } from '../../renderer/model/analysisAdapter';
import { DESIGN_POSE } from '../../renderer/model/poseInputs';
import { ghostSegments, RIM_SEGMENTS } from '../../renderer/viewport/ghostSegments';
import { demoDesign } from './helpers';

function ghostOf(design: ReturnType<typeof demoDesign>) {
  const resolved = resolveDesign(design);
  const session = new PoseSession(resolved, DESIGN_POSE.contact);
  const o = session.solve({ ...DESIGN_POSE, handlebarDeg: 20 }, false);
  const out = new Float32Array(600 * 6);
  const n = ghostSegments(session.engine.graph.drawing!, o.snapshot!, resolved.wheels.front.rollingRadiusMm, out);
  return { n, out, snap: o.snapshot!, radius: resolved.wheels.front.rollingRadiusMm, tubes: session.engine.graph.drawing!.tubes.length + session.engine.graph.drawing!.axisLines.length };
}

describe('reference ghost', () => {
  it('draws every part and a rim circle per front wheel at the solved pose', () => {
    const g = ghostOf(demoDesign('swift-parallelogram-trike'));
    expect(g.n).toBe(g.tubes + 2 * RIM_SEGMENTS);
    for (const [k, side] of [[0, 'right'], [1, 'left']] as const) {
      const w = g.snap.wheels[side];
      const axis = w.spinAxis;
      const len = Math.hypot(...axis);
      for (let s = 0; s < RIM_SEGMENTS; s++) {
        const i = 6 * (g.tubes + k * RIM_SEGMENTS + s);
        const d = [g.out[i] - w.centre[0], g.out[i + 1] - w.centre[1], g.out[i + 2] - w.centre[2]];
        // Float32 storage: within 0.05 mm of the radius, square to the axis.
        expect(Math.abs(Math.hypot(...d) - g.radius)).toBeLessThan(0.05);
        expect(Math.abs((d[0] * axis[0] + d[1] * axis[1] + d[2] * axis[2]) / len)).toBeLessThan(0.05);
      }
    }
  });

  it("follows the reference's own hardpoints (a moved point moves its ghost)", () => {
    const design = demoDesign('wren-rack-trike');
    const moved = JSON.parse(JSON.stringify(design)) as typeof design;
    (moved as unknown as { frontEnd: { upper: { frontPivot: { z: number } } } }).frontEnd.upper.frontPivot.z += 6;
    const a = ghostOf(design);
    const b = ghostOf(moved);
    let most = 0;
    for (let i = 0; i < 6 * a.tubes; i++) most = Math.max(most, Math.abs(a.out[i] - b.out[i]));
    // The pivot itself is a tube end: it moved 6 mm up in the reference.
    expect(most).toBeGreaterThan(5.9);
  });
});
