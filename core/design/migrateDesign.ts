/**
 * Format versions: a document of an older format is brought up to the current one, one step
 * at a time; a document from a newer Tiltbench is refused with a message saying so.
 */
import type { DesignIssue } from './designIssue';
import { DESIGN_FORMAT_KEY, DESIGN_FORMAT_VERSION } from './types';

/**
 * Turns a document of format N into one of format N + 1. It must not change its argument
 * (build and return a new object) and must set the format key to N + 1.
 */
export type DesignMigration = (document: Record<string, unknown>) => Record<string, unknown>;

/**
 * Migrations keyed by the format they upgrade FROM. Format 1 is the first published format,
 * so there are none yet; when format 2 arrives, format 1 files get an entry here.
 */
export const DESIGN_MIGRATIONS: Readonly<Record<number, DesignMigration>> = {};

export type MigrationResult = { ok: true; json: unknown; migratedFrom?: number } | { ok: false; issues: DesignIssue[] };

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** The refusal of a document made by a newer Tiltbench, or undefined. */
export function newerFormatIssue(json: unknown): DesignIssue | undefined {
  if (!isPlainObject(json)) return undefined;
  const version = json[DESIGN_FORMAT_KEY];
  if (typeof version !== 'number' || !Number.isInteger(version) || version <= DESIGN_FORMAT_VERSION) return undefined;
  return {
    path: DESIGN_FORMAT_KEY,
    message:
      `${DESIGN_FORMAT_KEY}: this design was made by a newer Tiltbench (format ${version}); ` +
      `this build reads format ${DESIGN_FORMAT_VERSION}. Update Tiltbench to open it.`,
    expected: `format ${DESIGN_FORMAT_VERSION} or older`,
    found: String(version),
  };
}

function formatIssue(message: string, found: string): DesignIssue {
  return { path: DESIGN_FORMAT_KEY, message: `${DESIGN_FORMAT_KEY}: ${message}`, expected: String(DESIGN_FORMAT_VERSION), found };
}

/**
 * Brings an older document up to the current format, one step at a time. Documents of the
 * current format, and anything that is not an object, pass through unchanged (the schema
 * check then reports what is wrong with them).
 */
export function migrateDesign(json: unknown, migrations: Readonly<Record<number, DesignMigration>> = DESIGN_MIGRATIONS): MigrationResult {
  if (!isPlainObject(json)) return { ok: true, json };
  const newer = newerFormatIssue(json);
  if (newer) return { ok: false, issues: [newer] };

  if (!Object.prototype.hasOwnProperty.call(json, DESIGN_FORMAT_KEY)) {
    const why = `missing; this is not a Tiltbench design (a design starts with "${DESIGN_FORMAT_KEY}": ${DESIGN_FORMAT_VERSION})`;
    return { ok: false, issues: [formatIssue(why, 'nothing')] };
  }

  const version = json[DESIGN_FORMAT_KEY];
  if (version === DESIGN_FORMAT_VERSION) return { ok: true, json };
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
    // Not a format number at all: let the schema check say so, together with everything else.
    return { ok: true, json };
  }

  let document = json;
  for (let from = version; from < DESIGN_FORMAT_VERSION; from++) {
    const step = migrations[from];
    if (!step) {
      const why = `format ${version} is not supported; this build reads format ${DESIGN_FORMAT_VERSION} and has no conversion from format ${from}`;
      return { ok: false, issues: [formatIssue(why, String(version))] };
    }
    document = step(document);
    if (document[DESIGN_FORMAT_KEY] !== from + 1) {
      // A bug in a migration, not in the user's file: fail loudly.
      throw new Error(`design migration from format ${from} did not produce format ${from + 1}`);
    }
  }
  return { ok: true, json: document, migratedFrom: version };
}
