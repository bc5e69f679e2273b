/**
 * Variants: two or more designs side by side. What differs between them (hardpoints, with how
 * far each moved from the first design; other settings such as joint ratings, envelope and
 * tolerances) and what that does (the study objectives over the same poses, and optionally
 * each design's `check` verdict in its operating region).
 *
 * The poses are the first design's operating-region sample (studyPoses.ts), or given ones, so
 * every variant is measured at the same lean and handlebar; a variant that cannot be assembled
 * at one of them has no value for the objectives over the poses, and the poses are named.
 */

import type { DesignFile } from '../design/types';
import { resolveDesign } from '../design/resolveDesign';
import { hardpointTable } from '../design/hardpointCsv';
import { checkDesign } from '../analysis/designCheck';
import { checkStudyPoses, measureAtPoses, poseWords, regionSamplePoses, type StudyPose } from './studyPoses';
import { activeEntry, studyObjectives, studyQuantities } from './studyQuantities';
import { pointWords } from './studyCoordinates';

export interface Variant {
  /** How the variant is named in the tables (its file name, or "A", "B"). */
  label: string;
  file: DesignFile;
}

export interface HardpointRow {
  /** Hardpoint id as the hardpoint table writes it ('upright.steeringArmJoint.right'). */
  id: string;
  point: string;
  /** Per variant, mm; null where the variant has no such point (another layout). */
  values: ({ x: number; y: number; z: number } | null)[];
  /** Largest distance from the first variant's point, mm; null when a variant lacks it. */
  movedMm: number | null;
}

export interface SettingRow {
  /** Field path in the design file ('joints.tieRodInner.ratedDeg'). */
  path: string;
  /** Per variant, as written (JSON text); null where absent. */
  values: (string | null)[];
}

export interface ResultRow {
  id: string;
  label: string;
  unit: string;
  kind: 'worst' | 'least';
  /** Per variant: the value over the poses (null when not measured) and where it is found. */
  values: (number | null)[];
  where: (string | null)[];
  /** Per variant: its own design's limit (null when none). */
  limits: (number | null)[];
}

export interface VariantsReport {
  labels: string[];
  poses: StudyPose[];
  posesFrom: 'given' | 'region sample of the first variant';
  /** Hardpoints that differ by more than 0.005 mm (or all, when asked). */
  hardpoints: HardpointRow[];
  settings: SettingRow[];
  results: ResultRow[];
  /** Per variant: poses it cannot be assembled at. */
  notAssembled: string[][];
  /** Per variant: its check verdict in its operating region (null when not run). */
  check: ({ passed: boolean; over: string[] } | null)[];
}

export interface VariantsOptions {
  poses?: StudyPose[];
  /** List every hardpoint, not only those that differ. */
  allHardpoints?: boolean;
  /** Run each variant's `check` (about a second each). */
  check?: boolean;
}

/** Hardpoint id -> point, from the hardpoint table (the rows the CSV writes, point and side). */
function pointsOf(file: DesignFile): Map<string, { x: number; y: number; z: number }> {
  return new Map(hardpointTable(file).map((row) => [row.id, row.at]));
}

function hardpointRows(variants: readonly Variant[], all: boolean): HardpointRow[] {
  const maps = variants.map((v) => pointsOf(v.file));
  const ids: string[] = [];
  for (const m of maps) for (const id of m.keys()) if (!ids.includes(id)) ids.push(id);
  const rows: HardpointRow[] = [];
  for (const id of ids) {
    const values = maps.map((m) => m.get(id) ?? null);
    const first = values[0];
    const movedMm = first && values.every((p) => p !== null) ? Math.max(...values.map((p) => Math.hypot(p!.x - first.x, p!.y - first.y, p!.z - first.z))) : null;
    if (!all && movedMm !== null && movedMm <= 0.005) continue;
    const m = /^(.*)\.(right|left)$/.exec(id);
    const owner = variants[values.findIndex((p) => p !== null)].file;
    rows.push({ id, point: pointWords(owner, m ? m[1] : id, m ? (m[2] as 'right' | 'left') : null), values, movedMm });
  }
  return rows;
}

const isPoint = (x: unknown): boolean => typeof x === 'object' && x !== null && !Array.isArray(x) && ['x', 'y', 'z'].every((k) => typeof (x as Record<string, unknown>)[k] === 'number');

/** Leaf values of a design other than its hardpoints, its name and its notes, by field path. */
function settingsOf(file: DesignFile): Map<string, string> {
  const out = new Map<string, string>();
  const walk = (value: unknown, path: string) => {
    if (path === 'name' || path === 'notes') return;
    if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
      // Points are compared as hardpoints; directions (axes) are settings.
      if (isPoint(value) && !/axis|Axis/.test(path)) return;
      for (const [k, v] of Object.entries(value)) walk(v, path ? `${path}.${k}` : k);
      return;
    }
    out.set(path, JSON.stringify(value));
  };
  walk(file, '');
  // A sided point written as { right, left } is still hardpoints, not settings.
  for (const k of [...out.keys()]) if (/\.(right|left)\.[xyz]$/.test(k) && !/axis|Axis/.test(k)) out.delete(k);
  return out;
}

function settingRows(variants: readonly Variant[]): SettingRow[] {
  const maps = variants.map((v) => settingsOf(v.file));
  const paths: string[] = [];
  for (const m of maps) for (const p of m.keys()) if (!paths.includes(p)) paths.push(p);
  return paths.flatMap((path) => {
    const values = maps.map((m) => m.get(path) ?? null);
    return values.every((v) => v === values[0]) ? [] : [{ path, values }];
  });
}

const RESULT_IDS = ['selfSteer', 'slip', 'ratioChange', 'ackermannError', 'jointMargin'];

/** Compare the variants; the first is the reference the others are measured against. */
export function compareVariants(variants: readonly Variant[], options: VariantsOptions = {}): VariantsReport {
  if (variants.length < 2) throw new RangeError('compare needs at least two designs');
  const designs = variants.map((v) => resolveDesign(v.file));
  let poses: StudyPose[];
  if (options.poses) {
    for (const d of designs) checkStudyPoses(d, options.poses);
    poses = options.poses;
  } else {
    poses = regionSamplePoses(designs[0]).poses;
    // A vehicle that does not tilt cannot be asked for lean: compare at the upright poses then.
    if (designs.some((d) => !d.vehicle.tilting)) poses = poses.filter((p) => p.leanDeg === 0);
  }
  const results: ResultRow[] = [];
  const notAssembled: string[][] = [];
  designs.forEach((d, i) => {
    const quantities = studyQuantities(d);
    const objectives = studyObjectives(quantities, d.tolerances).filter((o) => RESULT_IDS.includes(o.id));
    const m = measureAtPoses(d, poses, quantities);
    notAssembled.push(m.failed.map((f) => f.message));
    for (const o of objectives) {
      let row = results.find((r) => r.id === o.id);
      if (!row) {
        row = { id: o.id, label: o.label, unit: o.unit, kind: o.kind, values: designs.map(() => null), where: designs.map(() => null), limits: designs.map(() => null) };
        results.push(row);
      }
      row.limits[i] = o.tolerance;
      // Over fewer poses than asked it would be another objective: absent instead.
      if (m.failed.length > 0) continue;
      const a = activeEntry(o, m.values, poses.length, quantities.length);
      if (!a) continue;
      row.values[i] = o.kind === 'worst' ? Math.abs(a.value) : a.value;
      row.where[i] = `${quantities[a.quantity].label} at ${poseWords(poses[a.pose])}`;
    }
  });
  const check = designs.map((d) => {
    if (!options.check) return null;
    const c = checkDesign(d);
    return { passed: c.passed, over: c.operating.items.filter((x) => x.verdict === 'over' || x.verdict === 'broken').map((x) => x.label) };
  });
  return {
    labels: variants.map((v) => v.label),
    poses,
    posesFrom: options.poses ? 'given' : 'region sample of the first variant',
    hardpoints: hardpointRows(variants, options.allHardpoints ?? false),
    settings: settingRows(variants),
    results,
    notAssembled,
    check,
  };
}
