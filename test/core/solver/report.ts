/**
 * Measured agreement figures, printed only when TILTBENCH_REPORT is set
 * (TILTBENCH_REPORT=1 npx vitest run test/core/solver test/core/math).
 */
export function report(what: string, value: number | string): void {
  if (process.env.TILTBENCH_REPORT) console.log(`[agreement] ${what}: ${typeof value === 'number' ? value.toExponential(2) : value}`);
}
