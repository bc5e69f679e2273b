/**
 * Flat shapes on the ground: the contact-patch mark of each status (its shape repeats the
 * status glyph, so the status does not rest on colour alone), the soft blob shadow's texture,
 * the forward arrow. All lie in the x-y plane at z = 0, unit size, pointing along +x.
 */
import { BufferGeometry, CircleGeometry, DataTexture, LinearFilter, RGBAFormat, RingGeometry, Shape, ShapeGeometry } from 'three';
import { mergeGeometries } from 'three/examples/jsm/utils/BufferGeometryUtils.js';
import type { Severity } from '../model/severity';

function bar(length: number, width: number, angle: number): BufferGeometry {
  const s = new Shape();
  s.moveTo(-length / 2, -width / 2);
  s.lineTo(length / 2, -width / 2);
  s.lineTo(length / 2, width / 2);
  s.lineTo(-length / 2, width / 2);
  s.closePath();
  const g = new ShapeGeometry(s);
  g.rotateZ(angle);
  return g;
}

const merge = (parts: BufferGeometry[]): BufferGeometry => {
  const g = mergeGeometries(parts.map((p) => (p.index ? p.toNonIndexed() : p)), false);
  if (!g) throw new Error('mark parts could not be merged');
  return g;
};

/** One mark geometry per status, diameter 1: within a disc (✓ "fine"), close a triangle (!), over a cross (✕), won't assemble a slashed ring (⊘), not checked a thin ring. */
export function markGeometries(): Record<Severity, BufferGeometry> {
  const tri = new Shape();
  tri.moveTo(0.55, 0);
  tri.lineTo(-0.35, 0.5);
  tri.lineTo(-0.35, -0.5);
  tri.closePath();
  return {
    within: new CircleGeometry(0.5, 24),
    close: new ShapeGeometry(tri),
    over: merge([bar(1.15, 0.26, Math.PI / 4), bar(1.15, 0.26, -Math.PI / 4)]),
    broken: merge([new RingGeometry(0.36, 0.52, 28), bar(1.0, 0.16, Math.PI / 4)]),
    none: new RingGeometry(0.4, 0.5, 28),
  };
}

/** An arrow pointing along +x, 1 long. */
export function arrowGeometry(): BufferGeometry {
  const s = new Shape();
  s.moveTo(0.5, 0);
  s.lineTo(0.1, 0.22);
  s.lineTo(0.1, 0.08);
  s.lineTo(-0.5, 0.08);
  s.lineTo(-0.5, -0.08);
  s.lineTo(0.1, -0.08);
  s.lineTo(0.1, -0.22);
  s.closePath();
  return new ShapeGeometry(s);
}

/** A radial fall-off for the blob shadow: alpha 0.45 in the middle to 0 at the edge (smoothstep). */
export function blobTexture(size = 64): DataTexture {
  const data = new Uint8Array(size * size * 4);
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      const x = (2 * (i + 0.5)) / size - 1;
      const y = (2 * (j + 0.5)) / size - 1;
      const r = Math.min(1, Math.hypot(x, y));
      const t = 1 - r;
      const a = t * t * (3 - 2 * t);
      const k = 4 * (j * size + i);
      data[k] = data[k + 1] = data[k + 2] = 0;
      data[k + 3] = Math.round(255 * 0.45 * a);
    }
  }
  const tex = new DataTexture(data, size, size, RGBAFormat);
  tex.minFilter = LinearFilter;
  tex.magFilter = LinearFilter;
  tex.needsUpdate = true;
  return tex;
}

/** |y| of the front contact patches, rounded to 50 mm so the ground marks do not follow every small move. */
export function halfTrackOf(leftContactY: number | undefined): number {
  return Math.round(Math.abs(leftContactY ?? 400) / 50) * 50;
}

/** Where the ground's L and R letters, forward arrow and its word sit (the view framing includes them). */
export function groundMarkPlaces(halfTrack: number, frontReach: number) {
  const arrowLen = 420;
  const arrowX = frontReach + 120 + arrowLen / 2;
  return {
    // Beside and just behind the front wheels, so in the Side view they do not cover the wheel.
    left: [-frontReach - 220, halfTrack + 240, 60] as [number, number, number],
    right: [-frontReach - 220, -halfTrack - 240, 60] as [number, number, number],
    arrowX,
    arrowLen,
    front: [arrowX + arrowLen / 2 + 140, 0, 60] as [number, number, number],
    /** Half the letters' drawn size, mm (the framing keeps that much room around them). */
    halfSize: 60,
  };
}
