/**
 * Parts drawn but not solved: the spring or damper per side, the frame's spine to the rear
 * wheel(s), the rear wheels, the body outline and the symbolic handlebar. All ride on the
 * frame (the spring's arm end on its wishbone or member).
 */

import type { ResolvedDesign } from '../../design/types';
import type { Vec3 } from '../MechanismGraph';
import type { Suspension } from './frontSuspension';
import { SIDES, type MechanismBuilder } from './mechanismBuilder';

/** Height of the drawn body outline above the ground, mm (just clear of the ground grid). */
const OUTLINE_Z_MM = 4;

export function drawVehicle(b: MechanismBuilder, design: ResolvedDesign, frame: number, suspension: Suspension, handlebarAt: Vec3): void {
  drawSpring(b, design, frame, suspension);
  drawSpineAndRear(b, design, frame);
  const outline = design.vehicle.bodyOutline ?? [];
  if (outline.length > 0) {
    b.drawing.outline = { id: 'outline', label: 'body outline', part: 'frame', body: b.bodyId(frame), points: outline.map((p) => [p.x, p.y, OUTLINE_Z_MM]) };
  }
  b.drawing.handlebar = {
    id: 'handlebar',
    label: 'handlebar',
    part: 'handlebar',
    body: b.bodyId(frame),
    at: handlebarAt,
    turnedBy: 'handlebarDeg',
    halfWidth: 230,
    stem: 150,
    barRadius: 11,
    stemRadius: 9,
  };
}

function drawSpring(b: MechanismBuilder, design: ResolvedDesign, frame: number, suspension: Suspension): void {
  const sp = design.spring;
  if (!sp) return;
  for (const side of SIDES) {
    const arm = suspension.carrier[side][sp.on];
    b.tube(`${side}.spring`, { label: `${side} spring`, part: 'spring', a: b.onBody(frame, sp.frameMount[side]), b: b.onBody(arm, sp.armMount[side]), radius: 16 });
    b.jointOnBody(`spring.frameMount.${side}`, `spring frame mount, ${side}`, 10, frame, sp.frameMount[side]);
    b.jointOnBody(`spring.armMount.${side}`, `spring arm mount, ${side}`, 10, arm, sp.armMount[side]);
  }
}

/** The spine from the lower front pivots back to the rear axle, and the rear wheel(s). */
function drawSpineAndRear(b: MechanismBuilder, design: ResolvedDesign, frame: number): void {
  const fe = design.frontEnd;
  const radius = design.parts.wishboneTubeRadiusMm * 0.8;
  const L = design.vehicle.wheelbaseMm;
  const tyre = design.wheels.rear;
  const rr = tyre.rollingRadiusMm;
  const frontX = fe.kind === 'splitWishbones' ? (fe.lower.frontPivot.right.x + fe.lower.rearPivot.right.x) / 2 : fe.lower.pivot.x;
  const frontZ = fe.kind === 'splitWishbones' ? fe.lower.frontPivot.right.z : fe.lower.pivot.z;
  const rear = design.vehicle.rear;
  if (rear.kind === 'leaningPair') {
    // The rear pair draws its own wheels (rearPair.ts); the spine reaches its carrier's slide.
    const p = rear.lower.pivot;
    b.tube('frame.spine', { label: 'frame spine', part: 'frame', a: b.onBody(frame, [frontX, 0, frontZ]), b: b.onBody(frame, [p.x, p.y, p.z]), radius: radius * 1.3 });
    return;
  }
  b.tube('frame.spine', { label: 'frame spine', part: 'frame', a: b.onBody(frame, [frontX, 0, frontZ]), b: b.onBody(frame, [-L, 0, rr]), radius: radius * 1.3 });
  const wheel = (id: string, label: string, y: number) =>
    b.drawing.rearWheels.push({
      id,
      label,
      body: b.bodyId(frame),
      centre: [-L, y, rr],
      spinAxis: [0, 1, 0],
      rollingRadius: rr,
      crownRadius: tyre.crownRadiusMm,
      width: tyre.tyreWidthMm,
    });
  if (rear.kind === 'single') {
    wheel('rearWheel', 'rear tyre', 0);
  } else {
    const half = rear.trackMm / 2;
    wheel('rearWheel.right', 'right rear tyre', -half);
    wheel('rearWheel.left', 'left rear tyre', half);
    b.tube('frame.rearAxle', { label: 'rear axle', part: 'frame', a: b.onBody(frame, [-L, -half, rr]), b: b.onBody(frame, [-L, half, rr]), radius });
  }
}
