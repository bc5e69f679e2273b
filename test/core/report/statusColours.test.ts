// @vitest-environment node
// The verdict colours stay apart for everyone. Outside reference: the culori colour library's
// CIEDE2000 (differenceCiede2000; the CIE 142-2001 formula, G. Sharma, W. Wu and E. N. Dalal,
// Color Research & Application 30(1), 2005) and its colour-vision-deficiency filters, which
// implement G. M. Machado, M. M. Oliveira and L. A. F. Fernandes, "A physiologically-based model
// for simulation of color vision deficiency", IEEE TVCG 15(6), 2009 (severity 1: dichromacy).
// The 3D view's own colours against these are checked in test/renderer/viewportColours.test.ts
// with an implementation of the same formulas written out there.
import { differenceCiede2000, filterDeficiencyDeuter, filterDeficiencyProt, filterDeficiencyTrit, parse, type Color } from 'culori';
import { describe, expect, it } from 'vitest';
import { SEVERITY_STYLE } from '../../../core/report/severity';

const dE = differenceCiede2000();
const SIMULATIONS: Record<string, (c: Color) => Color> = {
  'normal vision': (c) => c,
  protanopia: filterDeficiencyProt(1),
  deuteranopia: filterDeficiencyDeuter(1),
  tritanopia: filterDeficiencyTrit(1),
};
/** The least CIEDE2000 difference kept between two verdict colours (our own bar: a clearly visible step, about 3x a just-noticeable difference of roughly 5 in practice, from memory). */
const LEAST_DIFFERENCE = 15;
const VERDICTS = ['within', 'close', 'over', 'broken'] as const;

function difference(a: string, b: string, simulate: (c: Color) => Color): number {
  return dE(simulate(parse(a)!), simulate(parse(b)!));
}

describe('verdict colours under colour-vision deficiency', () => {
  for (const [name, simulate] of Object.entries(SIMULATIONS)) {
    it(`every pair of verdict colours is at least ${LEAST_DIFFERENCE} apart under ${name}`, () => {
      for (let i = 0; i < VERDICTS.length; i++) {
        for (let j = i + 1; j < VERDICTS.length; j++) {
          const [a, b] = [VERDICTS[i], VERDICTS[j]];
          expect(difference(SEVERITY_STYLE[a].colour, SEVERITY_STYLE[b].colour, simulate), `${a} and ${b}`).toBeGreaterThanOrEqual(LEAST_DIFFERENCE);
        }
      }
    });
  }

  it('negative control: a red and a green of equal lightness collapse under deuteranopia', () => {
    expect(difference('#c0504d', '#5a9a3c', SIMULATIONS['normal vision'])).toBeGreaterThan(30);
    expect(difference('#c0504d', '#5a9a3c', SIMULATIONS.deuteranopia)).toBeLessThan(LEAST_DIFFERENCE);
  });

  it('the earlier amber came within 15 of over under tritanopia (why close is a lighter amber now)', () => {
    expect(difference('#e0a526', SEVERITY_STYLE.over.colour, SIMULATIONS.tritanopia)).toBeLessThan(LEAST_DIFFERENCE);
  });

  it('every verdict has a glyph and a word of its own (colour is never the only channel)', () => {
    expect(new Set(VERDICTS.map((v) => SEVERITY_STYLE[v].glyph)).size).toBe(VERDICTS.length);
    expect(new Set(VERDICTS.map((v) => SEVERITY_STYLE[v].word)).size).toBe(VERDICTS.length);
  });
});
