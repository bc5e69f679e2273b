/**
 * Solid wheels: a tyre turned from its section (a crown arc of the design's crown radius,
 * so the drawn tread touches the ground where core puts the contact point, then sidewalls down
 * to the bead), and a wheel of rim ring, spokes and hub. Every geometry has its spin axis on
 * +z and its centre at the origin, the frame today's tyre transform (wheel centre, z to the
 * solved spin axis) places it in.
 */
import { BoxGeometry, BufferGeometry, CylinderGeometry, LatheGeometry, Vector2 } from 'three';
import { mergeGeometries } from 'three/examples/jsm/utils/BufferGeometryUtils.js';

export interface WheelSize {
  rollingRadius: number;
  crownRadius: number;
  width: number;
}

/** Radial height of the drawn tyre section, mm: about its width, at most 30 % of the radius (common practice, no source). */
export function sectionHeight(w: WheelSize): number {
  return Math.max(8, Math.min(w.width, 0.3 * w.rollingRadius));
}

/** Segments round the wheel (a modest count: the picture is drawn on the CPU). */
export const TYRE_SEGMENTS = 32;
const AROUND = TYRE_SEGMENTS;
const CROWN_STEPS = 6;

/**
 * The tyre's section in (radius, axial) and turned about the spin axis. The tread is the arc of
 * the crown radius about the point (rolling radius - crown radius, 0): the torus core's contact
 * model rolls on.
 */
export function tyreGeometry(w: WheelSize): BufferGeometry {
  const R = w.rollingRadius;
  const half = w.width / 2;
  const c = Math.max(1, Math.min(w.crownRadius, R / 2));
  const h = sectionHeight(w);
  const bead = R - h;
  // How far round the crown arc reaches on each side (a flat-ish crown wider than the tyre stops at its width).
  const reach = Math.asin(Math.min(1, half / c));
  const pts: Vector2[] = [new Vector2(bead, -0.38 * w.width)];
  pts.push(new Vector2(bead + 0.45 * h, -half * 0.98));
  for (let k = 0; k <= CROWN_STEPS; k++) {
    const t = -reach + (2 * reach * k) / CROWN_STEPS;
    pts.push(new Vector2(R - c + c * Math.cos(t), c * Math.sin(t)));
  }
  pts.push(new Vector2(bead + 0.45 * h, half * 0.98));
  pts.push(new Vector2(bead, 0.38 * w.width));
  // Keep the section's points in order of strictly rising axial position (the lathe's normals face out).
  const g = new LatheGeometry(pts, AROUND);
  g.rotateX(Math.PI / 2); // the lathe's axis (y) onto z
  return g;
}

/** Rim ring, six spokes and the hub, merged into one geometry (one draw call). */
export function wheelGeometry(w: WheelSize): BufferGeometry {
  const rimR = w.rollingRadius - sectionHeight(w);
  const hubR = Math.max(12, 0.1 * w.rollingRadius);
  const rimWidth = Math.max(10, 0.8 * w.width);
  const parts: BufferGeometry[] = [];
  // Rim: an open ring.
  parts.push(new CylinderGeometry(rimR, rimR, rimWidth, AROUND, 1, true).toNonIndexed());
  const hub = new CylinderGeometry(hubR, hubR, Math.max(rimWidth * 1.6, 30), 16, 1, false).toNonIndexed();
  parts.push(hub);
  const spokeLen = rimR - hubR;
  for (let k = 0; k < 6; k++) {
    const spoke = new BoxGeometry(Math.max(5, 0.022 * w.rollingRadius), 4, spokeLen).toNonIndexed();
    spoke.translate(0, 0, hubR + spokeLen / 2);
    spoke.rotateY((k * Math.PI) / 3);
    parts.push(spoke);
  }
  // Cylinders and boxes are built about y: the spin axis. Uvs differ in layout but not in kind.
  const merged = mergeGeometries(parts, false);
  for (const p of parts) p.dispose();
  if (!merged) throw new Error('wheel parts could not be merged');
  merged.rotateX(Math.PI / 2);
  return merged;
}
