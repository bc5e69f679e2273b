/**
 * Reading a design: text -> JSON (readJsonText) -> format migration (migrateDesign) -> schema
 * check (designSchema) -> checks across fields (crossFieldChecks) -> warnings (designWarnings).
 *
 * Every stage collects all its issues instead of stopping at the first. The checks across
 * fields need a structurally valid design, so they run only once the schema check has passed.
 * The stages' own exports are re-exported here, where callers have always found them.
 */
import { checkAcrossFields } from './crossFieldChecks';
import { refuse, prefixIssues, type DesignResult } from './designIssue';
import { designFileSchema } from './designSchema';
import { designWarnings } from './designWarnings';
import { migrateDesign, newerFormatIssue } from './migrateDesign';
import { readJsonText } from './readJsonText';
import { validateAgainst } from './schemaDsl';
import type { DesignFile } from './types';

export type { DesignIssue, DesignResult } from './designIssue';
export { DESIGN_MIGRATIONS, migrateDesign, type DesignMigration, type MigrationResult } from './migrateDesign';
export { findDuplicateKeys, findJsonSyntaxError, lineAndColumn } from './readJsonText';
export {
  CENTRE_LINE_TOLERANCE_MM,
  MIN_DISTINCT_MM,
  MIN_STEER_TO_SPIN_AXIS_DEG,
  checkAcrossFields,
  spinAxis,
} from './crossFieldChecks';
export { designWarnings } from './designWarnings';

/**
 * Checks a parsed document against format 1 and the rules across fields. `source` (a file
 * name, say) prefixes every message.
 */
export function validateDesign(json: unknown, source?: string): DesignResult {
  const newer = newerFormatIssue(json);
  if (newer) return refuse([newer], source);

  const checked = validateAgainst(designFileSchema, json);
  if (!checked.ok) return refuse(checked.issues, source);

  const design = checked.value as DesignFile;
  const issues = checkAcrossFields(design);
  if (issues.length > 0) return refuse(issues, source);
  return { ok: true, design, warnings: prefixIssues(designWarnings(design), source) };
}

/** Reads a `.tiltsheet` file's text: JSON syntax (with line:column), repeated keys, format version, then validation. */
export function parseDesignText(text: string, fileName: string): DesignResult {
  const read = readJsonText(text, fileName);
  if (!read.ok) return read;
  const migrated = migrateDesign(read.json);
  if (!migrated.ok) return refuse(migrated.issues, fileName);
  return validateDesign(migrated.json, fileName);
}
