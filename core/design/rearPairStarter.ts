/**
 * A starting leaning rear pair for a design (the workbench's rear picker): a parallelogram on
 * the rear axle line, the rear wheels as far apart as the front ones, the members 240 mm apart
 * with the lower one at three quarters of the rear tyre's rolling radius, each upright clear of
 * its tyre's inner face by 30 mm. Numbers to start from, not advice (common practice, no source).
 */
import { resolveSidedVec } from './resolveDesign';
import type { DesignFile, LeaningRearPair } from './types';

export function starterLeaningRear(d: DesignFile): LeaningRearPair {
  const x = -d.vehicle.wheelbaseMm;
  const tyre = d.wheels.rear;
  const half = Math.max(150, Math.abs(resolveSidedVec(d.upright.wheelCentre).right.y));
  const offset = Math.round(tyre.tyreWidthMm / 2 + 30);
  const reach = Math.max(60, half - offset);
  const lowZ = Math.round(0.75 * tyre.rollingRadiusMm);
  const highZ = lowZ + 240;
  const axis = { x: 1, y: 0, z: 0 };
  return {
    kind: 'leaningPair',
    upper: { pivot: { x, y: 0, z: highZ }, pivotAxis: { ...axis }, outerJoint: { x, y: -reach, z: highZ } },
    lower: { pivot: { x, y: 0, z: lowZ }, pivotAxis: { ...axis }, outerJoint: { x, y: -reach, z: lowZ } },
    wheelCentre: { x, y: -(reach + offset), z: tyre.rollingRadiusMm },
  };
}
