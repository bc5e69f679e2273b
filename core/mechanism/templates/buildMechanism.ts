/**
 * Layout templates: turn a resolved design into a mechanism graph for one pose mode, with
 * the drawing of that mechanism (`graph.drawing`).
 *
 * Tree: ground -> heave slide (z) -> frame (roll about the x axis through the origin, the
 * lean) -> wishbones or centre members (revolute) -> uprights (spherical at the lower outer
 * joint; with a kingpin, a yoke on a cross there and the upright on a revolute joint in it,
 * kingpinYoke.ts); the steering body (crank, rack or column) hangs on the frame. Loops are
 * closed by coincident upper joints, tie-rod lengths, a drag link where there is one, and
 * either ground contact or a travel driver per wheel.
 *
 * Each part of the tree is built by its own module (front suspension, uprights, steering,
 * wheels); the order of the calls below is the order of bodies, points and constraints in
 * the graph.
 */

import type { MechanismGraph } from '../MechanismGraph';
import type { DrawingLayout } from '../drawingLayout';
import type { ResolvedDesign } from '../../design/types';
import { addFrontSuspension } from './frontSuspension';
import { DEG, MechanismBuilder } from './mechanismBuilder';
import { addSteering } from './steeringMechanism';
import { addUprights } from './uprights';
import { drawVehicle } from './vehicleDrawing';
import { addFrontWheels } from './wheelContact';
import { addLeanLinkage, addMeanContactRow, LEAN_IDS, onGround } from './leanLinkage';
import { addLeaningRearPair } from './rearPair';

export interface PoseMode {
  /** 'ground': each wheel touches the ground; 'travel': wheel-centre travel is an input. */
  contact: 'ground' | 'travel';
  /** Steer by handlebar angle, or by a target road-wheel angle of one wheel. */
  steerBy: 'handlebar' | 'leftWheel' | 'rightWheel';
  /**
   * 'suspension': the wishbones or centre members are held at their design position, as on a
   * jig (for comparing with bench measurements): no ground contact or travel rows, `contact`
   * is then ignored, and only the steering moves (with lean and heave at zero the frame stays
   * put; they still drive it if given). Left out: the suspension moves.
   */
  hold?: 'suspension';
  /**
   * With a lean linkage (design block `leanLinkage`) on the ground: 'rocker' makes the rocker's
   * angle relative to the carrier the driven input (the tilt lock or lean actuator) and solves
   * the frame's lean, which is reported as the lean. The leanDeg input then carries the rocker
   * angle. Left out: leanDeg drives the frame's roll.
   */
  leanBy?: 'frame' | 'rocker';
}

export const DEFAULT_MODE: PoseMode = { contact: 'ground', steerBy: 'handlebar' };

/** Index of a named body in a graph, for analysis and drawing. */
export function bodyIndex(graph: MechanismGraph, id: string): number {
  const i = graph.bodies.findIndex((b) => b.id === id);
  if (i < 0) throw new Error(`mechanism "${graph.name}" has no body "${id}"`);
  return i;
}

export function buildMechanism(design: ResolvedDesign, mode: PoseMode = DEFAULT_MODE): MechanismGraph & { drawing: DrawingLayout } {
  const b = new MechanismBuilder();
  const held = mode.hold === 'suspension';
  // A centre-pivot parallelogram couples the sides, leaving one travel for two tyres: with
  // both on the ground the heave is solved to put them there; otherwise it is an input.
  const heaveFree = design.frontEnd.kind === 'centrePivot' && mode.contact === 'ground' && !held;
  const lean = design.leanLinkage !== undefined && design.frontEnd.kind === 'splitWishbones';
  if (mode.leanBy === 'rocker' && !(lean && onGround(mode))) {
    throw new Error('the rocker angle can drive the lean only for a design with a lean linkage, tyres on the ground');
  }
  // A lean linkage on the ground: the frame's lateral and vertical place come out of the solve
  // (the spring travel drives the carrier instead, leanLinkage.ts); elsewhere the lateral slide is held.
  const lateral = lean
    ? b.addBody(LEAN_IDS.lateral, 'lateral slide', { kind: 'prismatic', parent: -1, origin: [0, 0, 0], axis: [0, 1, 0], ...(onGround(mode) ? {} : { driver: { input: 'heaveMm', gain: 0 } }) })
    : -1;
  const heave = b.addBody('heave', 'heave slide', {
    kind: 'prismatic',
    parent: lateral,
    origin: [0, 0, 0],
    axis: [0, 0, 1],
    ...(heaveFree || (lean && onGround(mode)) ? {} : { driver: { input: 'heaveMm', gain: 1 } }),
  });
  const frame = b.addBody('frame', 'frame', {
    kind: 'revolute',
    parent: heave,
    origin: [0, 0, 0],
    axis: [1, 0, 0],
    ...(mode.leanBy === 'rocker' ? { reportsInput: { input: 'leanDeg', gain: DEG } } : { driver: { input: 'leanDeg', gain: DEG } }),
  });

  const suspension = addFrontSuspension(b, design, frame, held);
  const uprights = addUprights(b, design, suspension);
  suspension.drawArms(uprights.outerJoints);
  const handlebarAt = addSteering(b, design, frame, uprights, mode);
  addFrontWheels(b, design, frame, uprights, mode);
  if (lean) {
    addLeanLinkage(b, design, frame, suspension, mode);
    addMeanContactRow(b, design, uprights, mode);
  }
  addLeaningRearPair(b, design, frame);
  drawVehicle(b, design, frame, suspension, handlebarAt);
  return b.graph(design.name, frame);
}
