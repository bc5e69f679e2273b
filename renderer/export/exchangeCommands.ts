/**
 * The file menu's exchange commands: the hardpoint table out and in (CSV), the mechanism at
 * the pose on screen and a sweep of lean (or handlebar) as glTF binary. Each explains itself
 * in a notice when it cannot run; none changes the design (an import only returns the plan
 * the dialog shows).
 */
import type { Workbench } from '../state/workbench';
import { exportName, type ExchangeFiles } from '../files/exchangeFiles';
import { hardpointTableText, planHardpointImport, type ImportPlan } from './hardpointImport';

/** Poses solved for the sweep animation. */
export const SWEEP_POSES = 25;
const GLB = 'model/gltf-binary';

const designBase = (wb: Workbench) => wb.document.getState().doc.fileName;

function fail(wb: Workbench, title: string, lines: string[]): void {
  wb.actions.showNotice({ kind: 'error', title, lines });
}

export function exportHardpointTable(wb: Workbench, files: ExchangeFiles): void {
  files.offer(hardpointTableText(wb.document.getState().design), exportName(designBase(wb), '.hardpoints.csv'), 'text/csv');
}

/** Asks for a table and reads it against the design on screen; null when cancelled or unreadable (said in a notice). */
export async function readHardpointTable(wb: Workbench, files: ExchangeFiles): Promise<ImportPlan | null> {
  let picked;
  try {
    picked = await files.pickTable();
  } catch (e) {
    fail(wb, 'Could not read the table', [(e as Error).message, 'Nothing was changed.']);
    return null;
  }
  if (!picked) return null;
  return planHardpointImport(wb.document.getState().design, picked.text, picked.fileName);
}

/** The pose on screen, when it was solved as asked; otherwise why not (in a notice). */
function solvedPose(wb: Workbench, what: string) {
  const s = wb.pose.getState();
  if (!s.drawing || !s.resolved || !s.outcome.snapshot) {
    fail(wb, `Could not export ${what}`, ['The design has errors, so no pose is solved. Fix the marked fields first.']);
    return null;
  }
  return s;
}

export async function exportPoseGlb(wb: Workbench, files: ExchangeFiles): Promise<void> {
  const s = solvedPose(wb, 'the 3D pose');
  if (!s) return;
  if (s.outcome.shown !== 'requested') {
    fail(wb, 'Could not export the 3D pose', [`The pose asked for does not close (${s.outcome.message}); the drawing shows another pose. Move back to a pose that closes and export again.`]);
    return;
  }
  // The exporter is loaded on first use (its own chunk), not with the workbench.
  const { poseGlb } = await import('./glbExport');
  const r = await poseGlb(s.drawing!, s.outcome.snapshot!, wb.document.getState().design.name);
  files.offer(r.bytes, exportName(designBase(wb), '.pose.glb'), GLB);
  if (r.missing.length > 0) wb.actions.showNotice({ kind: 'info', title: 'Exported, with parts left out', lines: [`Not placed in this pose: ${r.missing.join(', ')}.`] });
}

export async function exportSweepGlb(wb: Workbench, files: ExchangeFiles): Promise<void> {
  const s = solvedPose(wb, 'the sweep animation');
  if (!s) return;
  const { sweepGlb, sweepPoses } = await import('./glbExport');
  const sweep = sweepPoses(s.resolved!, s.pose, SWEEP_POSES);
  let r;
  try {
    r = await sweepGlb(s.drawing!, sweep, wb.document.getState().design.name);
  } catch (e) {
    fail(wb, 'Could not export the sweep animation', [(e as Error).message]);
    return;
  }
  files.offer(r.bytes, exportName(designBase(wb), `.${sweep.swept}-sweep.glb`), GLB);
  const notes = [
    ...(sweep.skipped.length > 0 ? [`Poses that do not close were left out: ${sweep.swept} ${sweep.skipped.map((v) => `${Math.round(v * 10) / 10}`).join(', ')} deg.`] : []),
    ...(r.missing.length > 0 ? [`Parts not placed in every pose: ${r.missing.join(', ')}.`] : []),
  ];
  if (notes.length > 0) wb.actions.showNotice({ kind: 'info', title: 'Exported, with gaps', lines: notes });
}
