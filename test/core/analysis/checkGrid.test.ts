/**
 * The pose count `check` refuses a grid by (checkGridPoses) is the grid checkDesign sweeps:
 * counted without building the axes, it must equal the product of envelopeAxes's lengths.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkGridPoses } from '../../../core/analysis/designCheck';
import { envelopeAxes, type SweepContact } from '../../../core/analysis/sweep';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile } from '../../../core/design/types';

const NAMES = ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike'];

describe('checkGridPoses', () => {
  it('equals the product of the envelope axes for every demo, contact and a spread of steps', () => {
    for (const name of NAMES) {
      const file = JSON.parse(readFileSync(new URL(`../../../assets/designs/${name}.tiltsheet`, import.meta.url), 'utf8')) as DesignFile;
      const design = resolveDesign(file);
      for (const contact of ['ground', 'travel'] as SweepContact[]) {
        for (const steps of [{}, { leanDeg: 0.7, handlebarDeg: 3, travelMm: 7 }, { leanDeg: 100, handlebarDeg: 100, travelMm: 1000 }, { leanDeg: 0.1, handlebarDeg: 0.25, travelMm: 1 }]) {
          const a = envelopeAxes(design, steps, contact);
          expect(checkGridPoses(design, steps, contact), `${name} ${contact} ${JSON.stringify(steps)}`).toBe(a.leanDeg.length * a.handlebarDeg.length * a.travelMm.length);
        }
      }
    }
  });
});
