/**
 * A pose's measures as text for a terminal (the `pose` command): alignment per wheel,
 * steering, Ackermann and scrub, turning circle, suspension, joints, clearances, status.
 * Nulls print as "-" with their reasons listed under the table they belong to.
 */

import type { ResolvedDesign } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { ANALYSIS_DEFINITIONS } from './definitions';
import { JOINT_WORDS, clearancePairWords } from './words';

const num = (x: number | null, d = 2, w = 10): string => (x === null ? '-' : x.toFixed(d)).padStart(w);

const rowText = (label: string, l: number | null, r: number | null, d = 2): string => `  ${label.padEnd(34)}${num(l, d)}${num(r, d)}`;

/** Joint articulation and clearance tables. */
function jointAndClearanceLines(a: PoseAnalysis, design: ResolvedDesign): string[] {
  const out: string[] = [];
  out.push('', 'joint                 side   kind        articulation  rated  margin (deg)');
  for (const j of a.joints) {
    out.push(
      `  ${JOINT_WORDS[j.joint].padEnd(19)} ${j.side.padEnd(6)} ${(j.kind === 'rodEnd' ? 'rod end' : 'ball joint').padEnd(10)} ${num(j.articulationDeg, 2, 12)} ${num(j.ratedDeg, 0, 6)} ${num(j.marginDeg, 2, 7)}`,
    );
  }
  out.push(`  tie-rod spin L/R ${a.tieRodSpinDeg.left.toFixed(1)} / ${a.tieRodSpinDeg.right.toFixed(1)} deg (${ANALYSIS_DEFINITIONS.tieRodSpin})`);
  out.push('', `clearance (mm, required ${design.tolerances.clearanceMm})        left     right`);
  const pairs = [...new Set(a.clearances.map((c) => c.pair))];
  for (const p of pairs) {
    const l = a.clearances.find((c) => c.pair === p && c.side === 'left');
    const r = a.clearances.find((c) => c.pair === p && c.side === 'right');
    out.push(rowText(clearancePairWords(p), l?.distanceMm ?? null, r?.distanceMm ?? null, 1));
  }
  return out;
}

export function formatPoseAnalysis(a: PoseAnalysis, design: ResolvedDesign): string {
  const L = a.wheels.left;
  const R = a.wheels.right;
  const lines: string[] = [];
  const row = (label: string, l: number | null, r: number | null, d = 2) => lines.push(rowText(label, l, r, d));
  lines.push('alignment                                 left     right');
  row('road-wheel angle (deg, left +)', L.steerDeg, R.steerDeg, 3);
  row('toe (deg, toe-in +)', L.toeDeg, R.toeDeg, 3);
  row('self-steer (deg, left +)', a.selfSteer.leftDeg, a.selfSteer.rightDeg, 3);
  row('camber to ground (deg, top out +)', L.camberDeg, R.camberDeg, 3);
  row('camber to frame (deg)', L.camberToFrameDeg, R.camberToFrameDeg, 3);
  row('camber, front-view projection (deg)', L.camberFrontViewDeg, R.camberFrontViewDeg, 3);
  row('caster (deg, top rearward +)', L.casterDeg, R.casterDeg);
  row('KPI (deg, top inward +)', L.kpiDeg, R.kpiDeg);
  row('caster / KPI to frame (deg)', L.casterToFrameDeg, R.casterToFrameDeg);
  row('', L.kpiToFrameDeg, R.kpiToFrameDeg);
  row('trail (mm, patch behind axis +)', L.trailMm, R.trailMm, 1);
  row('scrub radius (mm, axis inboard +)', L.scrubRadiusMm, R.scrubRadiusMm, 1);
  row('caster offset at centre (mm)', L.casterOffsetMm, R.casterOffsetMm, 1);
  row('kingpin offset at centre (mm)', L.kingpinOffsetAtCentreMm, R.kingpinOffsetAtCentreMm, 1);
  row('spindle length (mm)', L.spindleLengthMm, R.spindleLengthMm, 1);
  row('wheel travel (mm, bump +)', L.travelMm, R.travelMm, 1);
  row('contact patch x (mm)', L.contactPatchMm.x, R.contactPatchMm.x, 1);
  row('contact patch y (mm)', L.contactPatchMm.y, R.contactPatchMm.y, 1);
  row('slip angle (deg, ISO 8855)', a.slip.left.slipDeg, a.slip.right.slipDeg, 3);
  row('sideways scrub (m/km)', a.slip.left.scrubMPerKm, a.slip.right.scrubMPerKm, 1);
  for (const w of [L, R]) if (w.reason) lines.push(`  (${w.side}: ${w.reason})`);
  if (a.selfSteer.reason) lines.push(`  (self-steer: ${a.selfSteer.reason})`);

  const s = a.steering;
  lines.push(
    '',
    `steering: handlebar ${s.handlebarDeg.toFixed(2)} deg, mean road wheel ${s.meanWheelDeg.toFixed(3)} deg, ` +
      `ratio overall ${s.overallRatio === null ? '-' : s.overallRatio.toFixed(3)}, local ${s.localRatio === null ? '-' : s.localRatio.toFixed(3)}`,
    `  steering-ratio change from upright ${s.ratioChangePct === null ? `- (${s.ratioChangeReason})` : `${s.ratioChangePct.toFixed(2)} %`}`,
    `  transmission (deg; 90 ideal, 0 dead centre): steering arm L/R ${s.steeringArmTransmissionDeg.left.toFixed(1)} / ${s.steeringArmTransmissionDeg.right.toFixed(1)}, ` +
      `${design.steering.kind === 'rack' ? 'rack' : design.steering.kind === 'trackRod' ? 'track rod far end' : 'crank'} L/R ${s.linkageTransmissionDeg.left.toFixed(1)} / ${s.linkageTransmissionDeg.right.toFixed(1)}` +
      (s.dragLinkTransmissionDeg === null ? '' : `, drag link ${s.dragLinkTransmissionDeg.toFixed(1)}`),
  );
  const k = a.ackermann;
  if (k.innerDeg === null) lines.push(`Ackermann: - (${k.reason})`);
  else {
    lines.push(
      `Ackermann (${k.turn} turn, inner ${k.innerSide}): inner ${k.innerDeg.toFixed(3)}, outer ${num(k.outerDeg, 3, 0)}, ideal outer ${num(k.idealOuterDeg, 3, 0)}, ` +
        `error ${num(k.errorDeg, 3, 0)} deg`,
      `  ${num(k.percent, 1, 0)} % Ackermann (adopted: difference at the same inner angle); ${num(k.percentCot, 1, 0)} % in the cotangent form`,
    );
  }
  const sl = a.slip;
  lines.push(
    sl.turnCentreMm
      ? `turn centre (front slip balanced): x ${sl.turnCentreMm.x.toFixed(0)}, y ${sl.turnCentreMm.y.toFixed(0)} mm; radius ${sl.turnRadiusMm!.toFixed(0)} mm`
      : `turn centre: - (${sl.reason})`,
  );
  if (a.rear) {
    const r = a.rear;
    // fixed digits, never "-0.000" for a value that rounds to zero
    const fx = (v: number, d: number) => {
      const t = v.toFixed(d);
      return /^-0\.?0*$/.test(t) ? t.slice(1) : t;
    };
    const xyzText = (p: { x: number; y: number; z: number }) => `${fx(p.x, 1)}, ${fx(p.y, 1)}, ${fx(p.z, 1)}`;
    lines.push(
      'leaning rear pair                        left     right',
      `  road-wheel angle (deg, left +)     ${fx(r.left.steerDeg, 3).padStart(9)} ${fx(r.right.steerDeg, 3).padStart(9)}`,
      `  toe (deg, toe-in +)                ${fx(r.left.toeDeg, 3).padStart(9)} ${fx(r.right.toeDeg, 3).padStart(9)}`,
      `  camber to ground (deg, top out +)  ${fx(r.left.camberDeg, 3).padStart(9)} ${fx(r.right.camberDeg, 3).padStart(9)}`,
      `  camber to frame (deg)              ${fx(r.left.camberToFrameDeg, 3).padStart(9)} ${fx(r.right.camberToFrameDeg, 3).padStart(9)}`,
      `  contact patch x, y, z (mm): left ${xyzText(r.left.contactPatchMm)}; right ${xyzText(r.right.contactPatchMm)}`,
    );
    const t = r.turnCentre;
    if (t.centreMm && t.slipDeg) {
      const s = t.slipDeg;
      lines.push(
        `four-wheel turn centre (least squares of the four axis lines): x ${t.centreMm.x.toFixed(0)}, y ${t.centreMm.y.toFixed(0)} mm; lines ${num(t.lineSpreadMm, 1, 0)} mm rms from it`,
        `  slip to it (deg, ISO 8855): front L/R ${fx(s.frontLeftDeg, 3)} / ${fx(s.frontRightDeg, 3)}, rear L/R ${fx(s.rearLeftDeg, 3)} / ${fx(s.rearRightDeg, 3)}`,
      );
    } else {
      lines.push(`four-wheel turn centre: - (${t.reason})`);
    }
  }
  const tc = a.turningCircle;
  lines.push(
    tc.turningDiameterMm === null
      ? `turning circle: - (${tc.reason})`
      : `turning circle (SAE J695): diameter ${(tc.turningDiameterMm / 1000).toFixed(3)} m, kerb to kerb ${(tc.kerbToKerbMm! / 1000).toFixed(3)} m, ` +
          `wall to wall ${(tc.wallToWallMm! / 1000).toFixed(3)} m (${tc.wallToWallFrom})`,
  );
  const su = a.suspension;
  const ic = (x: { y: number; z: number } | null) => (x ? `y ${x.y.toFixed(0)}, z ${x.z.toFixed(0)}` : '-');
  lines.push(
    '',
    `suspension: instant centre L (${ic(su.left.instantCentreMm)}) R (${ic(su.right.instantCentreMm)}) mm; roll centre ${ic(su.rollCentreMm)} mm`,
    `  motion ratio L/R ${num(su.left.motionRatio, 3, 0)} / ${num(su.right.motionRatio, 3, 0)}; front lift with steer ${num(su.frontLiftMm, 2, 0)} mm`,
  );
  for (const why of new Set([su.left.reason, su.right.reason, su.reason, su.frontLiftReason])) if (why) lines.push(`  (${why})`);

  lines.push(...jointAndClearanceLines(a, design));
  lines.push('', `verdict: ${a.status}`);
  for (const f of a.findings) lines.push(`  ${f}`);
  return lines.join('\n') + '\n';
}
