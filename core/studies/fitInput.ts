/**
 * What a fit starts from, checked once for the CLI and the workbench alike: the measurement
 * sheet read (errors by line and column), the coordinates named resolved against the design
 * (hardpoint coordinates only), and the measured poses inside what the design can be asked for.
 */
import { resolveDesign } from '../design/resolveDesign';
import type { DesignFile } from '../design/types';
import { FitInputError } from './fit';
import { readMeasurementCsv, type Measurement } from './measurementCsv';
import { checkStudyPoses, StudyInputError } from './studyPoses';
import { resolveVariable, TunePlanError, type ResolvedVariable } from './tunePlan';

/** A fit's ready input, or every problem found (each naming the file's line and column, or the id). */
export type FitInput = { ok: true; measurements: Measurement[]; variables: ResolvedVariable[] } | { ok: false; problems: string[] };

export function prepareFit(file: DesignFile, csv: string, csvName: string, ids: readonly string[], idField = '--vary'): FitInput {
  const measured = readMeasurementCsv(csv, csvName);
  if (!measured.ok) return { ok: false, problems: measured.errors };
  try {
    const variables = ids.map((id) => resolveVariable(file, { id, rangeMm: [-1, 1] }, `${idField} ${id}`));
    if (variables.some((v) => v.kind !== 'coordinate')) throw new FitInputError(`${idField}: a fit moves hardpoint coordinates only (not tie-rod lengths)`);
    checkStudyPoses(resolveDesign(file), measured.measurements.map((x) => x.pose));
    return { ok: true, measurements: measured.measurements, variables };
  } catch (e) {
    if (e instanceof StudyInputError) return { ok: false, problems: [`${csvName}: ${e.message}`] };
    if (e instanceof TunePlanError || e instanceof FitInputError) return { ok: false, problems: [e.message] };
    throw e;
  }
}
