import type { DesignIssue } from '../design/validateDesign';
import { problemLines } from './safeText';

/** One line per problem: the message already names the file and field. */
export function formatIssue(issue: DesignIssue): string {
  return issue.message;
}

/**
 * The lines for a file's problems, as every command prints them: at most a stated number,
 * each cut to a stated length (a 5,000-character key is echoed by its ends), then "and N more".
 */
export function formatIssues(issues: readonly DesignIssue[]): string[] {
  return problemLines(issues.map(formatIssue));
}
