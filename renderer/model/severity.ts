/**
 * Colours, glyphs and words of core's verdicts: the one source is core/report/severity.ts
 * (shared with the report); the parts' neutral colours below are the viewport's own.
 */
export { SEVERITY_ORDER, SEVERITY_STYLE, worse, type Severity, type SeverityStyle } from '../../core/report/severity';

/** Neutral colours of the parts (no check attached). */
export const PART_COLOUR = {
  frame: '#8d979e',
  wishbone: '#55799a',
  upright: '#6b7b88',
  steering: '#8f7252',
  tieRod: '#a2845c',
  spring: '#84967a',
  joint: '#2b3137',
  tyre: '#3a3f45',
  rim: '#9aa3ab',
  axis: '#a0588c',
  ground: '#c9cdc6',
  groundMajor: '#aeb4ab',
  selection: '#0f62c9',
  path: '#2f86b3',
  pathRadius: '#a9c9da',
} as const;
