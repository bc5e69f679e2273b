/**
 * The viewport's reading of core's drawing layout: the neutral colour of each part class and
 * the condition of a drawn part. Ids all come from the layout; nothing here names a
 * mechanism body, point or constraint.
 */
import { checksShownBy, type DrawingLayout, type PartClass } from '../../core/mechanism/drawingLayout';
import { worse, type Severity } from '../model/severity';
import { VIEW_COLOUR } from './palette';

/** Neutral colour per part class (no check colouring it). */
export const PART_CLASS_COLOUR: Record<PartClass, string> = {
  frame: VIEW_COLOUR.frame,
  wishbone: VIEW_COLOUR.wishbone,
  upright: VIEW_COLOUR.upright,
  steering: VIEW_COLOUR.steering,
  tieRod: VIEW_COLOUR.tieRod,
  spring: VIEW_COLOUR.spring,
  handlebar: VIEW_COLOUR.steering,
  axis: VIEW_COLOUR.axis,
};

/** Per layout, the conditions keys of the loop-closing constraints each part stands for. */
const constraintKeys = new WeakMap<DrawingLayout, Map<string, string[]>>();

function constraintKeysOf(layout: DrawingLayout, partId: string): string[] {
  let byPart = constraintKeys.get(layout);
  if (!byPart) {
    byPart = new Map();
    constraintKeys.set(layout, byPart);
  }
  let keys = byPart.get(partId);
  if (!keys) {
    keys = checksShownBy(layout, partId).flatMap((c) => (c.kind === 'constraint' ? [`constraint.${c.constraint}`] : []));
    byPart.set(partId, keys);
  }
  return keys;
}

/**
 * The condition of a drawn part: what the outcome says of the part itself, or worse, of a
 * loop-closing constraint it stands for (the adapter marks a constraint that would not close
 * as 'constraint.<id>').
 */
export function partCondition(layout: DrawingLayout, parts: Readonly<Record<string, Severity>>, partId: string): Severity {
  let s: Severity = parts[partId] ?? 'none';
  for (const key of constraintKeysOf(layout, partId)) s = worse(s, parts[key] ?? 'none');
  return s;
}

/** Whether a part stands for a loop-closing constraint that the outcome says cannot close. */
export function partBroken(layout: DrawingLayout, parts: Readonly<Record<string, Severity>>, partId: string): boolean {
  return constraintKeysOf(layout, partId).some((key) => parts[key] === 'broken');
}
