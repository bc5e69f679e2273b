/**
 * Makes the wheel slots' three.js objects for a layout (once per layout): under a group, the
 * solid tyre and the rim-spokes-hub wheel, built about +z; the contact mark; the blob shadow.
 * wheelsUpdate.ts places them for each pose.
 */
import { DoubleSide, Group, Mesh, MeshBasicMaterial, MeshLambertMaterial, type BufferGeometry, type PlaneGeometry, type Texture } from 'three';
import type { DrawingLayout, DrawnFrontWheel, DrawnRearWheel } from '../../core/mechanism/drawingLayout';
import type { Severity } from '../model/severity';
import { VIEW_COLOUR } from './palette';
import { tyreGeometry, wheelGeometry } from './wheelGeometry';
import { FRONT_SLOTS, WHEEL_SLOTS, type WheelSlot } from './wheelsUpdate';

export type DrawnWheel = DrawnFrontWheel | DrawnRearWheel;

export interface MadeSlot extends WheelSlot {
  wheel: DrawnWheel;
  tyreMesh: Mesh;
}

const wheelSize = (w: DrawnWheel) => ({ rollingRadius: w.rollingRadius, crownRadius: w.crownRadius, width: w.width });

/** One slot per wheel the layout draws: its front wheels in the first FRONT_SLOTS, its rear wheels after. */
export function createWheelSlots(layout: DrawingLayout | null, marks: Record<Severity, BufferGeometry>, plane: PlaneGeometry, shadowTex: Texture | null): (MadeSlot | null)[] {
  const drawn: (DrawnWheel | undefined)[] = [
    ...Array.from({ length: FRONT_SLOTS }, (_, i) => layout?.frontWheels[i]),
    ...Array.from({ length: WHEEL_SLOTS - FRONT_SLOTS }, (_, i) => layout?.rearWheels[i]),
  ];
  const geoCache = new Map<string, { tyre: BufferGeometry; wheel: BufferGeometry }>();
  const shadowMat = new MeshBasicMaterial({ map: shadowTex, transparent: true, depthWrite: false, color: VIEW_COLOUR.shadow });
  return drawn.map((w): MadeSlot | null => {
    if (!w) return null;
    const key = `${w.rollingRadius}/${w.crownRadius}/${w.width}`;
    let geo = geoCache.get(key);
    if (!geo) {
      geo = { tyre: tyreGeometry(wheelSize(w)), wheel: wheelGeometry(wheelSize(w)) };
      geoCache.set(key, geo);
    }
    const tyreMat = new MeshLambertMaterial({ color: VIEW_COLOUR.tyre });
    const rimMat = new MeshLambertMaterial({ color: VIEW_COLOUR.rim, side: DoubleSide });
    const group = new Group();
    const tyreMesh = new Mesh(geo.tyre, tyreMat);
    const wheelMesh = new Mesh(geo.wheel, rimMat);
    wheelMesh.raycast = () => {};
    group.add(tyreMesh, wheelMesh);
    group.visible = false;
    const markMat = new MeshBasicMaterial({ color: VIEW_COLOUR.groundMark, side: DoubleSide, polygonOffset: true, polygonOffsetFactor: -2, polygonOffsetUnits: -2 });
    const mark = new Mesh(marks.within, markMat);
    mark.visible = false;
    mark.raycast = () => {};
    const shadow = new Mesh(plane, shadowMat);
    shadow.visible = false;
    shadow.raycast = () => {};
    shadow.renderOrder = -1;
    return { group, tyreMat, rimMat, mark, markMat, shadow, wheel: w, tyreMesh };
  });
}
