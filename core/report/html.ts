/** Small text helpers of the report: escaping and the number formats it prints. */

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text made safe for HTML and SVG content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESCAPES[c]);
}

/** A number with `digits` decimals, "-0.00" shown as "0.00"; null as an en dash. */
export function fixed(x: number | null | undefined, digits: number): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '\u2013';
  const t = x.toFixed(digits);
  return Number(t) === 0 ? (0).toFixed(digits) : t;
}

/** Millimetres to 0.1 mm. */
export const mm1 = (x: number | null | undefined) => fixed(x, 1);
/** Degrees to 0.01 deg. */
export const deg2 = (x: number | null | undefined) => fixed(x, 2);

/** An HTML table: header cells and rows of cells already escaped (or built) by the caller. */
export function htmlTable(head: string[], rows: string[][], cls = ''): string {
  return (
    `<table${cls ? ` class="${cls}"` : ''}><thead><tr>${head.map((h) => `<th>${h}</th>`).join('')}</tr></thead><tbody>` +
    rows.map((r) => `<tr>${r.join('')}</tr>`).join('') +
    `</tbody></table>`
  );
}

/** A cell: text escaped, with optional attributes (already safe) such as a data-value. */
export function td(text: string, attrs = ''): string {
  return `<td${attrs ? ' ' + attrs : ''}>${escapeHtml(text)}</td>`;
}

/** A numeric cell carrying the exact value it shows rounded. */
export function num(x: number | null | undefined, digits: number, field = ''): string {
  const exact = x === null || x === undefined || !Number.isFinite(x) ? '' : ` data-value="${String(x)}"`;
  return `<td class="num"${field ? ` data-field="${escapeHtml(field)}"` : ''}${exact}>${fixed(x, digits)}</td>`;
}
