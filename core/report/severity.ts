/**
 * The one place core's verdicts (core/analysis/tolerance.ts) become colours, glyphs and words,
 * on screen and in the report (renderer/model/severity.ts re-exports these). Colour is never
 * the only signal: each level has a word and a glyph, and every coloured thing has a readout. 'none' marks a part or value no check applies to.
 */
import type { Verdict } from '../analysis/tolerance';

export type Severity = Verdict | 'none';

export interface SeverityStyle {
  word: string;
  glyph: string;
  colour: string;
  /** What the level means, for the legend. */
  meaning: string;
  /** The level said of a whole pose ("This pose: ..."). */
  pose: string;
}

/**
 * Our palette: teal, amber, vermilion and plum; every pair of the four verdicts stays at least
 * 15 CIEDE2000 apart under normal vision and simulated protanopia, deuteranopia and tritanopia
 * (test/core/report/statusColours.test.ts), and each has its glyph and word besides. 'none' is
 * slate; nothing is drawn in it (an unchecked part keeps its own colour, renderer/viewport/palette.ts).
 */
export const SEVERITY_STYLE: Record<Severity, SeverityStyle> = {
  none: { word: 'not checked', glyph: '·', colour: '#7d8791', meaning: 'no tolerance applies, or the analysis has not run', pose: 'not checked' },
  within: { word: 'within', glyph: '✓', colour: '#1f9e89', meaning: 'inside the design tolerance', pose: 'within every tolerance' },
  close: { word: 'close', glyph: '!', colour: '#e8b830', meaning: 'inside, but within the last fifth of the tolerance', pose: 'close to a tolerance' },
  over: { word: 'over', glyph: '✕', colour: '#d8453b', meaning: 'outside the design tolerance', pose: 'over a tolerance' },
  broken: { word: "won't assemble", glyph: '⊘', colour: '#7b3fa0', meaning: 'the linkage cannot close in this pose', pose: 'cannot assemble' },
};

export const SEVERITY_ORDER: readonly Severity[] = ['none', 'within', 'close', 'over', 'broken'];

export function worse(a: Severity, b: Severity): Severity {
  return SEVERITY_ORDER.indexOf(a) >= SEVERITY_ORDER.indexOf(b) ? a : b;
}
