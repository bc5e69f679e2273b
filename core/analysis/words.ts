/**
 * The words a person reads for the model's parts, joints and clearance pairs. Every label
 * that leaves core (CLI text, JSON `label` fields, findings, chart legends, alerts) takes its
 * words from here, so no internal identifier (`upperOuter`, `tieRod-lowerArm`) reaches a person.
 */

import type { Side } from '../design/types';
import type { JointName } from './analysisTypes';
import type { PartName } from './clearance';

export const JOINT_WORDS: Record<JointName, string> = {
  upperOuter: 'upper outer joint',
  lowerOuter: 'lower outer joint',
  tieRodOuter: 'tie rod, outer end',
  tieRodInner: 'tie rod, inner end',
};

export const PART_WORDS: Record<PartName, string> = {
  upperArm: 'upper arm',
  lowerArm: 'lower arm',
  upperRail: 'upper frame rail',
  lowerRail: 'lower frame rail',
  tieRod: 'tie rod',
  steeringArm: 'steering arm',
  crankArm: 'crank arm',
  rack: 'rack',
  tyre: 'tyre',
};

/** 'tieRod-lowerArm' -> 'tie rod to lower arm'. */
export function clearancePairWords(pair: string): string {
  const [a, b] = pair.split('-') as [PartName, PartName];
  return `${PART_WORDS[a] ?? a} to ${PART_WORDS[b] ?? b}`;
}

/** 'upperOuter', 'left' -> 'upper outer joint, left'. */
export const jointWords = (joint: JointName, side: Side): string => `${JOINT_WORDS[joint]}, ${side}`;
