/**
 * What reading a design reports: issues (the design is refused) and warnings (it loads, but
 * something will not behave as written). Every message is a full sentence that names the
 * file, the field path or line:column, what was expected and what was found.
 */
import type { SchemaIssue } from './schemaDsl';
import type { DesignFile } from './types';

export interface DesignIssue extends SchemaIssue {
  /** 1-based position in the file, for JSON syntax errors and repeated keys. */
  line?: number;
  column?: number;
}

/**
 * `warnings` lists what loads but will not behave as written (it never refuses a design);
 * callers that only need the design can ignore it.
 */
export type DesignResult = { ok: true; design: DesignFile; warnings: DesignIssue[] } | { ok: false; issues: DesignIssue[] };

/** Issues with `source` (a file name, say) before every message; unchanged without a source. */
export function prefixIssues(issues: DesignIssue[], source: string | undefined): DesignIssue[] {
  if (source === undefined) return issues;
  return issues.map((issue) => ({ ...issue, message: `${source}: ${issue.message}` }));
}

export function refuse(issues: DesignIssue[], source: string | undefined): { ok: false; issues: DesignIssue[] } {
  return { ok: false, issues: prefixIssues(issues, source) };
}
