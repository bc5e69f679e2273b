/**
 * Measurements taken on a built vehicle, as CSV (RFC 4180), for the fit (fit.ts):
 *
 *     lean_deg,handlebar_deg,travel_mm,side,quantity,value,weight
 *     0,0,0,left,toe_deg,0.12,1
 *     0,10,0,right,road_wheel_angle_deg,7.95,
 *
 * One measurement a row, at the pose it was taken (lean, handlebar and both wheels' travel,
 * tyres on the ground as in the studies). Quantities, with the signs of README's conventions:
 * `toe_deg` (toe-in positive), `camber_deg` (top outward positive, to the ground normal) and
 * `road_wheel_angle_deg` (ISO 8855 heading, positive left). `weight` is optional (default 1):
 * the inverse of the measurement's variance up to a common factor. Lines starting with `#` are
 * comments. Every error names line and column; a file with any error gives no measurements.
 */
import type { StudyPose } from './studyPoses';

export type MeasuredQuantity = 'toe_deg' | 'camber_deg' | 'road_wheel_angle_deg';
export const MEASURED_QUANTITIES: readonly MeasuredQuantity[] = ['toe_deg', 'camber_deg', 'road_wheel_angle_deg'];
export const MEASUREMENT_COLUMNS = ['lean_deg', 'handlebar_deg', 'travel_mm', 'side', 'quantity', 'value', 'weight'] as const;
const REQUIRED = MEASUREMENT_COLUMNS.slice(0, 6);
/** A fit from more rows than this is not a workshop's measurements. */
export const MAX_MEASUREMENTS = 2000;

export interface Measurement {
  /** 1-based line of the file. */
  line: number;
  pose: StudyPose;
  side: 'left' | 'right';
  quantity: MeasuredQuantity;
  value: number;
  weight: number;
}

export type MeasurementRead = { ok: true; measurements: Measurement[] } | { ok: false; errors: string[] };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Fields of one CSV line with the 1-based column each starts at; null when a quote is unclosed. */
function splitLine(text: string): { value: string; column: number }[] | null {
  const out: { value: string; column: number }[] = [];
  let i = 0;
  for (;;) {
    const column = i + 1;
    let value = '';
    if (text[i] === '"') {
      i++;
      for (;;) {
        if (i >= text.length) return null;
        if (text[i] === '"') {
          if (text[i + 1] === '"') {
            value += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        value += text[i++];
      }
      while (i < text.length && text[i] !== ',') value += text[i++];
    } else {
      while (i < text.length && text[i] !== ',') value += text[i++];
    }
    out.push({ value: value.trim(), column });
    if (i >= text.length) return out;
    i++; // the comma
  }
}

const RANGES: Record<string, [number, number, string]> = {
  lean_deg: [-90, 90, 'deg'],
  handlebar_deg: [-180, 180, 'deg'],
  travel_mm: [-500, 500, 'mm'],
  value: [-90, 90, 'deg'],
  weight: [0, 1e6, ''],
};

export function readMeasurementCsv(csv: string, fileName: string): MeasurementRead {
  const errors: string[] = [];
  const at = (line: number, column: number, message: string) => errors.push(`${fileName}:${line}:${column}: ${message}`);
  const text = csv.startsWith('\uFEFF') ? csv.slice(1) : csv;
  const lines = text.split(/\r\n|\n|\r/);
  let header: string[] | null = null;
  const measurements: Measurement[] = [];
  for (let k = 0; k < lines.length && errors.length < 50; k++) {
    const line = k + 1;
    const raw = lines[k];
    if (raw.trim() === '' || raw.trimStart().startsWith('#')) continue;
    const fields = splitLine(raw);
    if (!fields) {
      at(line, raw.indexOf('"') + 1, 'a quoted field is not closed');
      continue;
    }
    if (!header) {
      header = fields.map((f) => f.value.toLowerCase());
      fields.forEach((f, i) => {
        if (!(MEASUREMENT_COLUMNS as readonly string[]).includes(header![i])) at(line, f.column, `unknown column "${f.value.slice(0, 40)}"; the columns are ${MEASUREMENT_COLUMNS.join(', ')} (weight optional)`);
        else if (header!.indexOf(header![i]) !== i) at(line, f.column, `column "${header![i]}" is given twice`);
      });
      for (const c of REQUIRED) if (!header.includes(c)) at(line, 1, `the header has no column "${c}"`);
      if (errors.length > 0) return { ok: false, errors };
      continue;
    }
    if (fields.length !== header.length) {
      at(line, raw.length + 1, `expected ${header.length} fields as in the header, found ${fields.length}`);
      continue;
    }
    const get = (name: string) => {
      const i = header!.indexOf(name);
      return i < 0 ? undefined : fields[i];
    };
    const numberOf = (name: string, fallback?: number): number | undefined => {
      const f = get(name);
      if (!f || (f.value === '' && fallback !== undefined)) return fallback;
      const [lo, hi, unit] = RANGES[name];
      if (!NUMBER.test(f.value)) return void at(line, f.column, `${name}: expected a number${unit ? ` in ${unit}` : ''}, found "${f.value.slice(0, 40)}"`);
      const x = Number(f.value);
      if (!(x >= lo && x <= hi)) return void at(line, f.column, `${name}: ${f.value.slice(0, 40)} is outside ${lo}..${hi}${unit ? ' ' + unit : ''}`);
      return x;
    };
    const leanDeg = numberOf('lean_deg');
    const handlebarDeg = numberOf('handlebar_deg');
    const travelMm = numberOf('travel_mm');
    const value = numberOf('value');
    const weight = numberOf('weight', 1);
    const sideField = get('side')!;
    const side = sideField.value.toLowerCase();
    if (side !== 'left' && side !== 'right') at(line, sideField.column, `side: expected left or right, found "${sideField.value.slice(0, 40)}"`);
    const qField = get('quantity')!;
    const quantity = qField.value.toLowerCase() as MeasuredQuantity;
    if (!MEASURED_QUANTITIES.includes(quantity)) at(line, qField.column, `quantity: expected one of ${MEASURED_QUANTITIES.join(', ')}, found "${qField.value.slice(0, 40)}"`);
    if (weight === 0) at(line, get('weight')!.column, 'weight: a measurement of weight 0 says nothing; leave the row out');
    if (leanDeg === undefined || handlebarDeg === undefined || travelMm === undefined || value === undefined || weight === undefined) continue;
    if (errors.length > 0) continue;
    measurements.push({ line, pose: { leanDeg, handlebarDeg, travelMm }, side: side as 'left' | 'right', quantity, value, weight });
    if (measurements.length > MAX_MEASUREMENTS) {
      at(line, 1, `more than ${MAX_MEASUREMENTS} measurements`);
      break;
    }
  }
  if (!header) errors.push(`${fileName}: no header line; expected ${MEASUREMENT_COLUMNS.join(',')}`);
  else if (errors.length === 0 && measurements.length === 0) errors.push(`${fileName}: no measurements after the header`);
  return errors.length > 0 ? { ok: false, errors } : { ok: true, measurements };
}
