/**
 * The workbench's tune form as plain data, and the plan it makes: the same JSON plan the CLI
 * reads (`tiltbench tune --plan`), checked by core's readTunePlan so the workbench and the CLI
 * refuse the same things with the same words.
 */
import type { DesignFile } from '../../core/design/types';
import { readTunePlan, TunePlanError, TUNE_MEASURES, type TuneMeasure, type TunePlan } from '../../core/studies/tunePlan';
import type { TunePick } from '../state/studyStore';

export interface ObjectiveChoice {
  on: boolean;
  weight: number;
  /** Ackermann % or steering ratio; null where the measure takes none (or none typed yet). */
  target: number | null;
}

export interface TuneForm {
  objectives: Record<TuneMeasure, ObjectiveChoice>;
  jointMargin: boolean;
  clearance: boolean;
  transmissionFloorDeg: number;
  /** Also vary the tie-rod length (both sides together), mm either way. */
  tieRodLengthMm: number | null;
  starts: number;
  maxIterations: number;
}

/** Self-steer and slip on, as a designer would start (the first two objectives). */
export function defaultTuneForm(): TuneForm {
  const objectives = Object.fromEntries(TUNE_MEASURES.map((m) => [m, { on: m === 'selfSteer' || m === 'slip', weight: 1, target: m === 'ackermann' ? 100 : null }])) as Record<TuneMeasure, ObjectiveChoice>;
  return { objectives, jointMargin: true, clearance: true, transmissionFloorDeg: 10, tieRodLengthMm: null, starts: 3, maxIterations: 25 };
}

/** The plan as JSON (what `tiltbench tune --plan` reads). */
export function planJson(picks: readonly TunePick[], form: TuneForm): Record<string, unknown> {
  const variables: { id: string; rangeMm: [number, number] }[] = picks.map((p) => ({ id: p.id, rangeMm: p.rangeMm }));
  if (form.tieRodLengthMm !== null) variables.push({ id: 'tieRod.length', rangeMm: [-form.tieRodLengthMm, form.tieRodLengthMm] });
  const objectives = TUNE_MEASURES.filter((m) => form.objectives[m].on).map((m) => {
    const o = form.objectives[m];
    return o.target === null ? { measure: m, weight: o.weight } : { measure: m, weight: o.weight, target: o.target };
  });
  return {
    variables,
    objectives,
    constraints: { jointMargin: form.jointMargin, clearance: form.clearance, transmissionFloorDeg: form.transmissionFloorDeg },
    poses: 'region',
    starts: form.starts,
    maxIterations: form.maxIterations,
  };
}

/** The checked plan, or what is wrong with the form in words. */
export function tunePlanOf(design: DesignFile, picks: readonly TunePick[], form: TuneForm): { plan: TunePlan } | { problem: string } {
  if (picks.length === 0 && form.tieRodLengthMm === null) return { problem: 'Pick points to vary: tick "vary" on rows of the hardpoint table.' };
  try {
    return { plan: readTunePlan(planJson(picks, form), design).plan };
  } catch (e) {
    if (e instanceof TunePlanError) return { problem: e.message };
    throw e;
  }
}
