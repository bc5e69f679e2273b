import type { DesignIssue } from '../design/validateDesign';

/** One line per problem: the message already names the file and field. */
export function formatIssue(issue: DesignIssue): string {
  return issue.message;
}
