/** Words and numbers for the viewport's hover tip: colour is never the only signal. */
import { checksShownBy, type DrawingLayout, type DrawnFrontWheel, type DrawnTube } from '../../core/mechanism/drawingLayout';
import { hardpointRows, rowName } from '../model/hardpoints';
import { SEVERITY_STYLE, type Severity } from '../model/severity';
import type { DesignFile } from '../../core/design/types';
import type { PoseOutcome } from '../model/analysisAdapter';
import { fmt } from '../model/format';
import { readout } from '../model/analysisAdapter';
import { partBroken } from './drawingParts';

/** What the tip reads: the design (hardpoints as entered) and the outcome of the pose. */
export interface HoverSource {
  design: DesignFile;
  outcome: PoseOutcome;
}

const said = (sev: Severity | undefined, what: string): string | null =>
  sev && sev !== 'none' ? `${SEVERITY_STYLE[sev].glyph} ${SEVERITY_STYLE[sev].word}${what}` : null;

/** A hardpoint (selection id) under the pointer: where it is, its condition, its joint's articulation. */
export function describeJoint(hardpoint: string, layout: DrawingLayout | null, s: HoverSource): [string, string[]] {
  const row = hardpointRows(s.design).find((r) => r.id === hardpoint);
  const drawn = layout?.joints.find((j) => j.hardpoint === hardpoint);
  const title = row ? rowName(row) : (drawn?.label ?? hardpoint);
  const lines: string[] = [];
  const p = drawn && 'point' in drawn.at ? s.outcome.snapshot?.points[drawn.at.point] : undefined;
  if (p && s.outcome.shown === 'requested') lines.push(`now at x ${fmt(p[0], 1)}, y ${fmt(p[1], 1)}, z ${fmt(p[2], 1)} mm`);
  if (row) lines.push(`design x ${fmt(row.value.x, 1)}, y ${fmt(row.value.y, 1)}, z ${fmt(row.value.z, 1)} mm${row.side ? (row.linked ? ' (mirrored)' : ' (unlinked)') : ''}`);
  if (drawn) {
    const condition = said(s.outcome.parts[drawn.id], '');
    if (condition) lines.push(condition);
    for (const check of checksShownBy(layout!, drawn.id)) {
      if (check.kind !== 'joint') continue;
      const j = s.outcome.analysis?.joints.find((x) => x.joint === check.joint && x.side === check.side);
      if (j) lines.push(`articulation ${fmt(j.articulationDeg, 1)} deg of ${j.ratedDeg} rated (margin ${fmt(j.marginDeg, 1)} deg)`);
    }
  }
  lines.push('click to select; drag the arrows to move');
  return [title, lines];
}

export function describeTube(t: DrawnTube, layout: DrawingLayout, s: HoverSource): [string, string[]] {
  const lines: string[] = [];
  if (partBroken(layout, s.outcome.parts, t.id)) lines.push(`${said('broken', '')}: ${s.outcome.message}`);
  const condition = said(s.outcome.parts[t.id], ': see the clearances and transmission readings');
  if (condition) lines.push(condition);
  if (t.part === 'tieRod') lines.push(`radius ${fmt(t.radius, 0)} mm`);
  return [t.label, lines];
}

export function describeTyre(w: DrawnFrontWheel, s: HoverSource): [string, string[]] {
  const out = s.outcome;
  const lines: string[] = [];
  if (out.shown === 'requested') {
    const col = w.side === 'left' ? 0 : 1;
    lines.push(`toe ${fmt(readout(out, 'toe', col), 3)} deg (toe-in +), self-steer ${fmt(readout(out, 'selfSteer', col), 3)} deg`);
    lines.push(`slip ${fmt(readout(out, 'slip', col), 2)} deg, camber ${fmt(readout(out, 'camberGround', col), 2)} deg`);
  } else {
    lines.push('not at the requested pose');
  }
  const condition = said(out.parts[w.id], ' (slip and tyre clearances)');
  if (condition) lines.push(condition);
  return [w.label, lines];
}
