/**
 * The sensitivity behind the hardpoint table's rate column: core's runSensitivity over the
 * operating-region sample (mirrored pairs together), reshaped into plain rows per point and axis.
 * Runs in the sweep worker (or on the main thread where workers are unavailable).
 */
import { runSensitivity } from '../../core/studies/sensitivity';
import type { DesignFile } from '../../core/design/types';
import type { Progress } from './sweepJobs';

export interface SensitivityRequest {
  design: DesignFile;
}

export interface SensitivityRow {
  /** Field path of the point (as the hardpoint table's rows). */
  key: string;
  axis: 'x' | 'y' | 'z';
  /** The positive direction in words (forward, outward, up, to the left). */
  direction: string;
  /** Rate per mm by objective id; null where not measured. */
  perMm: Record<string, number | null>;
  /** Core's sentence: "move the ... 1 mm up: worst self-steer +0.041 deg, ...". */
  sentence: string;
  /** Rank by share of tolerance used per mm (1 = matters most). */
  rank: number;
}

export interface SensitivityData {
  design: string;
  objectives: { id: string; label: string; unit: string }[];
  rows: SensitivityRow[];
  poses: number;
  failures: string[];
  elapsedMs: number;
}

export function computeSensitivity(req: SensitivityRequest, progress?: Progress): SensitivityData {
  const t0 = Date.now();
  const r = runSensitivity(req.design, { linearityCheck: false, onProgress: progress });
  return {
    design: r.design,
    objectives: r.objectives.map((o) => ({ id: o.id, label: o.label, unit: o.unit })),
    rows: r.coordinates.map((c, i) => ({
      key: c.coordinate.key,
      axis: c.coordinate.axis,
      direction: c.coordinate.direction,
      perMm: Object.fromEntries(Object.entries(c.objectives).map(([id, rate]) => [id, rate.perMm])),
      sentence: c.sentence,
      rank: i + 1,
    })),
    poses: r.poses.length,
    failures: [...r.notAssembled, ...r.coordinates.flatMap((c) => c.failures.slice(0, 1))].slice(0, 5),
    elapsedMs: Date.now() - t0,
  };
}
