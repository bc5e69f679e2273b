/**
 * Ride mode's readings: the speed, the balanced lean core found for it (ridePose.ts), how far
 * the pose is from balance and the lateral acceleration, as one readout table. Core's notes
 * (lean limit, grip, straight ahead, a vehicle that does not lean) become the rows' hints and
 * the reason shown where a figure is missing. Pure reshaping; nothing is judged here.
 */
import type { Riding } from '../../core/design/types';
import type { ReadoutRow, ReadoutTable } from './analysisAdapter';
import type { RideFigures as CoreRideFigures } from '../../core/analysis/ridePose';

/** What core's ride solve found (ridePose.ts), and whether the vehicle leans at all. */
export type RideFigures = CoreRideFigures & { tilting: boolean };

export const RIDE_TABLE_ID = 'ride';

export function rideTable(r: RideFigures, riding: Riding): ReadoutTable {
  const notes = r.notes.join('; ');
  const withNotes = (hint: string) => (notes ? `${hint}. ${notes}` : hint);
  const missing = (fallback: string) => notes || fallback;
  const rows: ReadoutRow[] = [
    {
      id: 'rideSpeed',
      label: 'Speed',
      unit: 'km/h',
      digits: 1,
      cells: [{ value: r.speedKmh }],
      hint: `the riding range is ${riding.minKmh} to ${riding.maxKmh} km/h`,
    },
    {
      id: 'rideBalancedLean',
      label: 'Balanced lean',
      unit: 'deg',
      digits: 2,
      cells: [{ value: r.balancedLeanDeg }],
      missing: missing('not found'),
      hint: withNotes('right side down +; tan(lean) = v² / (g R), R the turn radius, g = 9.80665 m/s²'),
    },
    {
      id: 'rideResidual',
      label: 'Balance residual',
      unit: 'deg',
      digits: 4,
      cells: [{ value: r.balanceResidualDeg }],
      missing: missing('not found'),
      hint: withNotes(`lean − balanced lean; ${r.steps} lean-and-solve step${r.steps === 1 ? '' : 's'}`),
    },
    {
      id: 'rideLateralG',
      label: 'Lateral acceleration',
      unit: 'g',
      digits: 3,
      cells: [{ value: r.lateralG }],
      missing: missing('straight ahead'),
      hint: withNotes(`v² / (g R); the grip limit is ${riding.gripG} g`),
    },
  ];
  return { id: RIDE_TABLE_ID, title: r.tilting ? 'Ride (balanced turn)' : 'Ride (upright: the vehicle does not lean)', columns: ['Value'], rows };
}
