/**
 * The hardpoint catalogue: which named points a design has, in table order, with the path of
 * each in the file, its words (group and label, as the workbench's hardpoint table and the
 * studies name it) and whether it is a per-side point. One list for every caller.
 */
import type { DesignFile } from './types';

export interface HardpointEntry {
  /** Path of the field in the design file, dotted. */
  key: string;
  label: string;
  group: string;
  /** A per-side point (mirrored or given for both sides) or a single centre point. */
  sided: boolean;
}

export function hardpointEntries(d: DesignFile): HardpointEntry[] {
  const out: HardpointEntry[] = [];
  const add = (key: string, label: string, group: string, sided = true) => out.push({ key, label, group, sided });
  if (d.frontEnd.kind === 'splitWishbones') {
    for (const level of ['upper', 'lower'] as const) {
      const g = `${level === 'upper' ? 'Upper' : 'Lower'} wishbone`;
      add(`frontEnd.${level}.frontPivot`, 'front pivot', g);
      add(`frontEnd.${level}.rearPivot`, 'rear pivot', g);
      add(`frontEnd.${level}.outerJoint`, 'outer joint', g);
    }
  } else {
    for (const level of ['upper', 'lower'] as const) {
      const g = `${level === 'upper' ? 'Upper' : 'Lower'} centre member`;
      add(`frontEnd.${level}.pivot`, 'centre pivot', g, false);
      add(`frontEnd.${level}.outerJoint`, 'outer joint', g);
    }
  }
  add('upright.steeringArmJoint', 'steering arm joint', 'Upright');
  add('upright.wheelCentre', 'wheel centre', 'Upright');
  const s = d.steering;
  if (s.kind === 'trackRod') {
    // The track rod's ends are the steering-arm joints above; a handlebar on an upright adds no point.
    if (s.drive.kind === 'centreLever') {
      add('steering.drive.pivot', 'lever pivot', 'Centre lever', false);
      add('steering.drive.leverJoint', 'lever joint', 'Centre lever', false);
      add('steering.drive.trackRodJoint', 'track rod joint', 'Centre lever', false);
    }
    if (s.drive.kind === 'dragLink') {
      add('steering.drive.columnPivot', 'column pivot', 'Drag link', false);
      add('steering.drive.columnArmJoint', 'column arm joint', 'Drag link', false);
      add('steering.drive.uprightArmJoint', 'upright arm joint', 'Drag link', false);
    }
  } else if (s.kind === 'bellCrank') {
    add('steering.pivot', 'pivot', 'Bell crank', false);
    add('steering.tieRodJoint', 'tie rod joint', 'Bell crank');
    if (s.input.kind === 'dragLink') {
      add('steering.input.columnPivot', 'column pivot', 'Drag link input', false);
      add('steering.input.columnArmJoint', 'column arm joint', 'Drag link input', false);
      add('steering.input.crankArmJoint', 'crank arm joint', 'Drag link input', false);
    }
  } else if (s.kind === 'rack') {
    add('steering.tieRodJoint', 'rack end joint', 'Rack');
  } else {
    add('steering.pivot', 'column pivot', 'Steering lever', false);
    add('steering.tieRodJoint', 'tie rod joint', 'Steering lever');
  }
  if (d.vehicle.rear.kind === 'leaningPair') {
    for (const level of ['upper', 'lower'] as const) {
      const g = `${level === 'upper' ? 'Upper' : 'Lower'} rear member`;
      add(`vehicle.rear.${level}.pivot`, 'centre pivot', g, false);
      add(`vehicle.rear.${level}.outerJoint`, 'outer joint', g);
    }
    add('vehicle.rear.wheelCentre', 'wheel centre', 'Rear upright');
  }
  if (d.spring) {
    add('spring.frameMount', 'frame mount', 'Spring');
    add('spring.armMount', 'arm mount', 'Spring');
  }
  const l = d.leanLinkage;
  if (l) {
    add('leanLinkage.carrier.frameMount', 'spring frame mount', 'Lean linkage', false);
    add('leanLinkage.carrier.carrierMount', 'spring carrier mount', 'Lean linkage', false);
    add('leanLinkage.rocker.pivot', 'rocker pivot', 'Lean linkage', false);
    add('leanLinkage.rocker.linkJoint', 'rocker link joint', 'Lean linkage');
    add('leanLinkage.pushLinks.armJoint', 'push link wishbone joint', 'Lean linkage');
    if (l.actuator) {
      add('leanLinkage.actuator.frameMount', 'actuator frame mount', 'Lean linkage', false);
      add('leanLinkage.actuator.rockerMount', 'actuator rocker mount', 'Lean linkage', false);
    }
  }
  return out;
}

