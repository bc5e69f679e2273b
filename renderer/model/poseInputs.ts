/**
 * The pose the user sets with the sliders, and the ranges the sliders span (from the design's
 * envelope). Pure reshaping into core's `PoseInputs`.
 */
import type { DesignFile, Riding } from '../../core/design/types';
import { zeroInputs, type PoseInputs } from '../../core/mechanism/MechanismGraph';

export type Contact = 'ground' | 'travel';

export interface PoseUi {
  leanDeg: number;
  handlebarDeg: number;
  /** Frame height change with the tyres on the ground, mm (split wishbones only). */
  heaveMm: number;
  travelRightMm: number;
  travelLeftMm: number;
  /** 'ground': tyres touch the ground; 'travel': wheel travel is set directly. */
  contact: Contact;
}

export type PoseField = 'leanDeg' | 'handlebarDeg' | 'heaveMm' | 'travelRightMm' | 'travelLeftMm';

export const DESIGN_POSE: PoseUi = { leanDeg: 0, handlebarDeg: 0, heaveMm: 0, travelRightMm: 0, travelLeftMm: 0, contact: 'ground' };

export function toCoreInputs(p: PoseUi): PoseInputs {
  const inputs = zeroInputs();
  inputs.leanDeg = p.leanDeg;
  inputs.handlebarDeg = p.handlebarDeg;
  inputs.heaveMm = p.contact === 'ground' ? p.heaveMm : 0;
  inputs.travelRightMm = p.contact === 'travel' ? p.travelRightMm : 0;
  inputs.travelLeftMm = p.contact === 'travel' ? p.travelLeftMm : 0;
  return inputs;
}

export interface SliderRange {
  min: number;
  max: number;
  step: number;
  /** The design's envelope on this input (marked on the slider). */
  envelopeMin: number;
  envelopeMax: number;
  enabled: boolean;
  /** Why the slider is disabled, in words. */
  disabledReason?: string;
}

/** Slider spans: half as much again as the envelope, so the edge of it can be explored. */
export function sliderRanges(d: DesignFile, contact: Contact): Record<PoseField, SliderRange> {
  const e = d.envelope;
  const span = (limitLow: number, limitHigh: number, step: number, min = 5): SliderRange => {
    const lo = Math.max(min, Math.ceil(limitLow * 1.5));
    const hi = Math.max(min, Math.ceil(limitHigh * 1.5));
    return { min: -lo, max: hi, step, envelopeMin: -limitLow, envelopeMax: limitHigh, enabled: true };
  };
  const lean = span(e.leanDeg, e.leanDeg, 0.5);
  if (!d.vehicle.tilting) Object.assign(lean, { enabled: false, disabledReason: 'this vehicle does not lean (vehicle.tilting is off)' });
  const heave = span(e.reboundMm, e.bumpMm, 1);
  const centre = d.frontEnd.kind === 'centrePivot';
  if (contact !== 'ground') Object.assign(heave, { enabled: false, disabledReason: 'heave applies with the tyres on the ground' });
  else if (centre) Object.assign(heave, { enabled: false, disabledReason: 'a centre-pivot front end finds its own height on the ground' });
  const travelR = span(e.reboundMm, e.bumpMm, 1);
  const travelL = span(e.reboundMm, e.bumpMm, 1);
  if (contact !== 'travel') {
    for (const r of [travelR, travelL]) Object.assign(r, { enabled: false, disabledReason: 'switch to "set wheel travel" to move each wheel' });
  } else if (centre) {
    Object.assign(travelL, { enabled: false, disabledReason: 'the centre members couple the sides: the right wheel sets both' });
  }
  return { leanDeg: lean, handlebarDeg: span(e.handlebarDeg, e.handlebarDeg, 0.5), heaveMm: heave, travelRightMm: travelR, travelLeftMm: travelL };
}

/**
 * The ride mode's speed slider: 0 to a fifth past the riding range's top (at least 10 km/h),
 * the riding range marked on the track. Disabled while the design is invalid (no riding block
 * resolved).
 */
export function rideSpeedRange(riding: Riding | null): SliderRange {
  if (!riding) return { min: 0, max: 10, step: 0.5, envelopeMin: 0, envelopeMax: 0, enabled: false, disabledReason: 'the design has errors; fix them to ride' };
  return { min: 0, max: Math.max(riding.maxKmh * 1.2, 10), step: 0.5, envelopeMin: riding.minKmh, envelopeMax: riding.maxKmh, enabled: true };
}

export const POSE_LABELS: Record<PoseField, { label: string; unit: 'deg' | 'mm'; hint: string }> = {
  leanDeg: { label: 'Lean', unit: 'deg', hint: 'roll of the frame; positive lowers the right side (a right turn)' },
  handlebarDeg: { label: 'Steer (handlebar)', unit: 'deg', hint: 'handlebar angle; positive turns left' },
  heaveMm: { label: 'Heave', unit: 'mm', hint: 'frame height change with the tyres on the ground; positive up' },
  travelRightMm: { label: 'Travel right', unit: 'mm', hint: 'right wheel-centre travel relative to the frame; positive up (bump)' },
  travelLeftMm: { label: 'Travel left', unit: 'mm', hint: 'left wheel-centre travel relative to the frame; positive up (bump)' },
};

/** With a lean linkage on the ground the heave input drives the spring (core's leanLinkage template), not the frame. */
export const SPRING_TRAVEL_LABEL: (typeof POSE_LABELS)[PoseField] = {
  label: 'Spring travel',
  unit: 'mm',
  hint: "lean linkage: the spring's extension with the tyres on the ground, positive longer; lean holds it, and the frame's height and sideways place come out of the solve",
};

/** The label of a pose input for this design. */
export function poseLabel(field: PoseField, d: DesignFile): (typeof POSE_LABELS)[PoseField] {
  return field === 'heaveMm' && d.leanLinkage && d.frontEnd.kind === 'splitWishbones' ? SPRING_TRAVEL_LABEL : POSE_LABELS[field];
}
