/** Words and numbers for the viewport's hover tip: colour is never the only signal. */
import { hardpointRows, rowName } from '../model/hardpoints';
import { SEVERITY_STYLE } from '../model/severity';
import type { WorkbenchState } from '../model/workbenchStore';
import type { TubeSpec } from './sceneTopology';
import { fmt } from '../model/format';
import { readout } from '../model/analysisAdapter';

const JOINT_POINTS: Record<string, (side: string) => string> = {
  upperOuter: (side) => `frontEnd.upper.outerJoint.${side}`,
  lowerOuter: (side) => `frontEnd.lower.outerJoint.${side}`,
  tieRodOuter: (side) => `upright.steeringArmJoint.${side}`,
  tieRodInner: (side) => `steering.tieRodJoint.${side}`,
};

export function describeJoint(id: string, s: WorkbenchState): [string, string[]] {
  const row = hardpointRows(s.design).find((r) => r.id === id);
  const title = row ? rowName(row) : id;
  const lines: string[] = [];
  const p = s.outcome.snapshot?.points[id];
  if (p && s.outcome.shown === 'requested') lines.push(`now at x ${fmt(p[0], 1)}, y ${fmt(p[1], 1)}, z ${fmt(p[2], 1)} mm`);
  if (row) lines.push(`design x ${fmt(row.value.x, 1)}, y ${fmt(row.value.y, 1)}, z ${fmt(row.value.z, 1)} mm${row.side ? (row.linked ? ' (mirrored)' : ' (unlinked)') : ''}`);
  const sev = s.outcome.parts[`joint.${id}`];
  if (sev && sev !== 'none') lines.push(`${SEVERITY_STYLE[sev].glyph} ${SEVERITY_STYLE[sev].word}`);
  const j = s.outcome.analysis?.joints.find((x) => JOINT_POINTS[x.joint]?.(x.side) === id);
  if (j) lines.push(`articulation ${fmt(j.articulationDeg, 1)} deg of ${j.ratedDeg} rated (margin ${fmt(j.marginDeg, 1)} deg)`);
  lines.push('click to select; drag the arrows to move');
  return [title, lines];
}

export function describeTube(t: TubeSpec, s: WorkbenchState): [string, string[]] {
  const lines: string[] = [];
  const broken = t.constraintId ? s.outcome.parts[`constraint.${t.constraintId}`] : undefined;
  if (broken && broken !== 'none') lines.push(`${SEVERITY_STYLE[broken].glyph} ${SEVERITY_STYLE[broken].word}: ${s.outcome.message}`);
  const sev = s.outcome.parts[`tube.${t.id}`];
  if (sev && sev !== 'none') {
    lines.push(`${SEVERITY_STYLE[sev].glyph} ${SEVERITY_STYLE[sev].word}: see the clearances and transmission readings`);
  }
  if (t.part === 'tieRod') lines.push(`radius ${fmt(t.radius, 0)} mm`);
  return [t.label, lines];
}

export function describeTyre(side: 'left' | 'right', s: WorkbenchState): [string, string[]] {
  const out = s.outcome;
  const lines: string[] = [];
  if (out.shown === 'requested') {
    const col = side === 'left' ? 0 : 1;
    lines.push(`toe ${fmt(readout(out, 'toe', col), 3)} deg (toe-in +), toe error ${fmt(readout(out, 'toeError', col), 3)} deg`);
    lines.push(`slip ${fmt(readout(out, 'slip', col), 2)} deg, camber ${fmt(readout(out, 'camberGround', col), 2)} deg`);
  } else {
    lines.push('not at the requested pose');
  }
  const sev = out.parts[`tyre.${side}`];
  if (sev && sev !== 'none') lines.push(`${SEVERITY_STYLE[sev].glyph} ${SEVERITY_STYLE[sev].word} (slip and tyre clearances)`);
  return [`${side} front tyre`, lines];
}
