/** Number formatting for readouts: fixed digits, a true minus sign, no "-0". */
export function fmt(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  let text = value.toFixed(digits);
  if (/^-0\.?0*$/.test(text)) text = text.slice(1);
  return text.replace(/^-/, '−');
}
