/**
 * The analysis modules' vector helpers now live in core/math/vec3.ts (one home for core);
 * this file re-exports them so the analysis files keep their imports.
 */
export {
  DEG,
  RAD,
  add,
  addScaled,
  angleBetween,
  clamp,
  cross,
  dist,
  dot,
  footOnLine,
  norm,
  normalize,
  scale,
  sub,
  wrapPi,
  xyz,
  type XyzMm,
} from '../math/vec3';
