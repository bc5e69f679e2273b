/**
 * The front wheels on their uprights, and what fixes each wheel's travel: the tyre on the
 * ground, or a travel input per wheel (nothing when the suspension is held at design: the held
 * wishbones or members fix it); plus the road-wheel angle target when a wheel's angle, not the
 * handlebar, is the steering input.
 */

import type { InputBinding } from '../MechanismGraph';
import type { ResolvedDesign, Side } from '../../design/types';
import { wheelSpinAxisAtDesign } from '../wheelAxis';
import type { PoseMode } from './buildMechanism';
import type { Uprights } from './uprights';
import { DEG, SIDES, v, type MechanismBuilder } from './mechanismBuilder';

export function addFrontWheels(b: MechanismBuilder, design: ResolvedDesign, frame: number, uprights: Uprights, mode: PoseMode): void {
  const tyre = design.wheels.front;
  const centrePivot = design.frontEnd.kind === 'centrePivot';
  for (const side of SIDES) {
    const centre = design.upright.wheelCentre[side];
    const spin = wheelSpinAxisAtDesign(side, design.upright.staticToeDeg[side], design.upright.staticCamberDeg[side]);
    const body = uprights.body[side];
    b.wheels.push({
      side,
      body,
      centre: v(centre),
      spinAxis: spin,
      rollingRadius: tyre.rollingRadiusMm,
      crownRadius: tyre.crownRadiusMm,
      tyreWidth: tyre.tyreWidthMm,
    });
    const drawn = `tyre.${side}`;
    b.drawing.frontWheels.push({ id: drawn, label: `${side} front tyre`, side, rollingRadius: tyre.rollingRadiusMm, crownRadius: tyre.crownRadiusMm, width: tyre.tyreWidthMm });
    b.shows({ kind: 'clearance', part: 'tyre', side }, drawn);

    let fixed: string | null = null;
    if (mode.hold === 'suspension') {
      // Held suspension: a tyre-on-ground or travel row would over-constrain the upright.
    } else if (mode.contact === 'ground') {
      fixed = b.addConstraint({
        kind: 'groundContact',
        id: `${side}.groundContact`,
        label: `${side} tyre on the ground`,
        body,
        wheelCentre: v(centre),
        spinAxis: spin,
        rollingRadius: tyre.rollingRadiusMm,
        crownRadius: tyre.crownRadiusMm,
      });
    } else if (!(centrePivot && side === 'left')) {
      // A centre-pivot parallelogram couples the sides: the right wheel's travel sets both.
      const target: InputBinding = { input: side === 'right' ? 'travelRightMm' : 'travelLeftMm', gain: 1 };
      fixed = b.addConstraint({ kind: 'pointHeight', id: `${side}.travel`, label: `${side} wheel travel`, body, point: v(centre), refBody: frame, target });
    }
    if (fixed) b.shows({ kind: 'constraint', constraint: fixed }, uprights.spindle[side]);
  }
  if (mode.steerBy !== 'handlebar') {
    const side: Side = mode.steerBy === 'leftWheel' ? 'left' : 'right';
    const heading = b.addConstraint({
      kind: 'wheelHeading',
      id: `${side}.wheelAngle`,
      label: `${side} road-wheel angle target`,
      body: uprights.body[side],
      spinAxis: b.wheels.find((w) => w.side === side)!.spinAxis,
      target: { input: 'wheelAngleDeg', gain: DEG },
    });
    b.shows({ kind: 'constraint', constraint: heading }, uprights.spindle[side]);
  }
}
