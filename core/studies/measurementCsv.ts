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
import { readCsvRecords } from '../design/csvRecords';

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

/** Comment lines (starting with #) blanked, so line numbers stay those of the file. */
function withoutComments(text: string): string {
  return text
    .split(/\r\n|\n|\r/)
    .map((l) => (l.trimStart().startsWith('#') ? '' : l))
    .join('\n');
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
  const read = readCsvRecords(withoutComments(csv.startsWith('\uFEFF') ? csv.slice(1) : csv));
  if (!read.ok) return { ok: false, errors: [`${fileName}:${read.line}:${read.column}: ${read.reason}`] };
  let header: string[] | null = null;
  const measurements: Measurement[] = [];
  for (const record of read.records) {
    if (errors.length >= 50) break;
    const line = record.fields[0].line;
    const fields = record.fields.map((f) => ({ value: f.text.trim(), column: f.column }));
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
      at(record.end.line, record.end.column, `expected ${header.length} fields as in the header, found ${fields.length}`);
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
