/**
 * The linkage in 3D from the solved pose. Objects are created once; every pose update
 * writes their matrices and colours through refs (no React render per frame) and asks for
 * one frame (render on demand).
 */
import { useLayoutEffect, useMemo, useRef } from 'react';
import { useThree, type ThreeEvent } from '@react-three/fiber';
import {
  BufferAttribute,
  BufferGeometry,
  CircleGeometry,
  Color,
  CylinderGeometry,
  DynamicDrawUsage,
  IcosahedronGeometry,
  InstancedMesh,
  LineSegments,
  Matrix4,
  Mesh,
  MeshLambertMaterial,
  Object3D,
  Quaternion,
  TorusGeometry,
  Vector3,
} from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import { useWorkbench, useWorkbenchApi } from '../app/workbenchContext';
import { hardpointRows } from '../model/hardpoints';
import { PART_COLOUR, SEVERITY_STYLE, type Severity } from '../model/severity';
import type { WorkbenchState } from '../model/workbenchStore';
import { buildTopology, type PointRef, type Topology } from './sceneTopology';
import { hoverStore, renderStats } from './viewSignals';
import { describeJoint, describeTube, describeTyre } from './hoverText';

const TUBE_CAPACITY = 64;
const JOINT_CAPACITY = 64;
const LINE_CAPACITY = 200;
/** Half the length of each wheel's path arc drawn on the ground, mm. */
const PATH_HALF_MM = 700;
const PATH_SEGMENTS = 14;
const Y = new Vector3(0, 1, 0);
const Z = new Vector3(0, 0, 1);

/** Scratch objects (no allocation per update). */
const va = new Vector3();
const vb = new Vector3();
const vd = new Vector3();
const q = new Quaternion();
const m4 = new Matrix4();
const dummy = new Object3D();
const colour = new Color();

/** World position of a point ref in a snapshot; false when the snapshot lacks it. */
function place(ref: PointRef, snap: PoseSnapshot, bodyIndex: Map<string, number>, out: Vector3): boolean {
  if ('named' in ref) {
    const p = snap.points[ref.named];
    if (!p) return false;
    out.set(p[0], p[1], p[2]);
    return true;
  }
  const i = bodyIndex.get(ref.body);
  if (i === undefined) return false;
  bodyMatrix(snap, i, m4);
  out.set(ref.design[0], ref.design[1], ref.design[2]).applyMatrix4(m4);
  return true;
}

/** A body's pose (column-major rotation, translation) as a Matrix4. */
export function bodyMatrix(snap: PoseSnapshot, i: number, out: Matrix4): Matrix4 {
  const { rotation: r, translation: t } = snap.bodies[i];
  return out.set(r[0], r[3], r[6], t[0], r[1], r[4], r[7], t[1], r[2], r[5], r[8], t[2], 0, 0, 0, 1);
}

function severityColour(s: Severity | undefined, fallback: string): string {
  return s && s !== 'none' ? SEVERITY_STYLE[s].colour : fallback;
}

export function LinkageModel() {
  const wb = useWorkbenchApi();
  const resolved = useWorkbench((s) => s.resolved);
  const invalidate = useThree((s) => s.invalidate);
  const topo: Topology | null = useMemo(() => (resolved ? buildTopology(resolved) : null), [resolved]);

  const tubes = useRef<InstancedMesh>(null);
  const joints = useRef<InstancedMesh>(null);
  const lines = useRef<LineSegments>(null);
  const tyreRefs = useRef<(Mesh | null)[]>([]);
  const patchRefs = useRef<(Mesh | null)[]>([]);
  const rearRefs = useRef<(Mesh | null)[]>([]);

  const geo = useMemo(() => {
    const lineGeo = new BufferGeometry();
    const pos = new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3);
    const col = new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3);
    pos.setUsage(DynamicDrawUsage);
    col.setUsage(DynamicDrawUsage);
    lineGeo.setAttribute('position', pos);
    lineGeo.setAttribute('color', col);
    return {
      tube: new CylinderGeometry(1, 1, 1, 10, 1, false),
      joint: new IcosahedronGeometry(1, 1),
      line: lineGeo,
      patch: new CircleGeometry(1, 20),
    };
  }, []);
  const tyreGeo = useMemo(() => {
    if (!topo) return null;
    const f = topo.front;
    const r = topo.rearWheels[0];
    return {
      front: new TorusGeometry(f.rollingRadius - f.crownRadius, f.crownRadius, 8, 36),
      rear: r ? new TorusGeometry(r.rollingRadius - r.crownRadius, r.crownRadius, 8, 36) : null,
    };
  }, [topo]);
  const tyreMats = useMemo(() => [0, 1, 2, 3].map(() => new MeshLambertMaterial({ color: PART_COLOUR.tyre })), []);
  const patchMats = useMemo(() => [0, 1].map(() => new MeshLambertMaterial({ color: PART_COLOUR.rim })), []);

  useLayoutEffect(() => {
    const apply = (s: WorkbenchState) => {
      updateScene(s, topo, {
        tubes: tubes.current,
        joints: joints.current,
        lines: lines.current,
        tyres: tyreRefs.current,
        patches: patchRefs.current,
        rear: rearRefs.current,
        tyreMats,
        patchMats,
      });
      renderStats.sceneSerial++;
      invalidate();
    };
    apply(wb.store.getState());
    return wb.store.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome || s.selection !== prev.selection || s.design !== prev.design) apply(s);
    });
  }, [wb, topo, invalidate, tyreMats, patchMats]);

  const hover = (e: ThreeEvent<PointerEvent>, title: string, lines: string[]) => {
    e.stopPropagation();
    const rect = (e.target as HTMLElement | null)?.getBoundingClientRect?.();
    const x = e.nativeEvent.offsetX ?? e.clientX - (rect?.left ?? 0);
    const y = e.nativeEvent.offsetY ?? e.clientY - (rect?.top ?? 0);
    hoverStore.setState({ hover: { x, y, title, lines } });
  };
  const unhover = () => hoverStore.setState({ hover: null });

  const jointAt = (e: ThreeEvent<PointerEvent | MouseEvent>) => {
    const s = wb.store.getState();
    const list = s.outcome.snapshot && topo ? topo.joints.map((j) => j.id) : hardpointRows(s.design).map((r) => r.id);
    return e.instanceId === undefined ? undefined : list[e.instanceId];
  };

  return (
    <group>
      <instancedMesh ref={tubes} args={[geo.tube, undefined, TUBE_CAPACITY]} frustumCulled={false}
        onPointerMove={(e) => {
          const t = topo && e.instanceId !== undefined ? topo.tubes[e.instanceId] : undefined;
          if (t) hover(e, ...describeTube(t, wb.store.getState()));
        }}
        onPointerOut={unhover}>
        <meshLambertMaterial />
      </instancedMesh>
      <instancedMesh ref={joints} args={[geo.joint, undefined, JOINT_CAPACITY]} frustumCulled={false}
        onPointerMove={(e) => {
          const id = jointAt(e);
          if (id) hover(e, ...describeJoint(id, wb.store.getState()));
        }}
        onPointerOut={unhover}
        onClick={(e) => {
          e.stopPropagation();
          const id = jointAt(e);
          if (id) wb.actions.select(id);
        }}>
        <meshLambertMaterial />
      </instancedMesh>
      <lineSegments ref={lines} geometry={geo.line} frustumCulled={false} raycast={() => null}>
        <lineBasicMaterial vertexColors />
      </lineSegments>
      {tyreGeo &&
        (['left', 'right'] as const).map((side, i) => (
          <mesh key={side} ref={(m) => { tyreRefs.current[i] = m; }} geometry={tyreGeo.front} material={tyreMats[i]}
            onPointerMove={(e) => hover(e, ...describeTyre(side, wb.store.getState()))} onPointerOut={unhover} />
        ))}
      {(['left', 'right'] as const).map((side, i) => (
        <mesh key={side} ref={(m) => { patchRefs.current[i] = m; }} geometry={geo.patch} material={patchMats[i]}
          onPointerMove={(e) => hover(e, ...describeTyre(side, wb.store.getState()))} onPointerOut={unhover} />
      ))}
      {tyreGeo?.rear &&
        topo?.rearWheels.map((w, i) => (
          <mesh key={w.id} ref={(m) => { rearRefs.current[i] = m; }} geometry={tyreGeo.rear!} material={tyreMats[2 + i]} raycast={() => null} />
        ))}
    </group>
  );
}

interface SceneObjects {
  tubes: InstancedMesh | null;
  joints: InstancedMesh | null;
  lines: LineSegments | null;
  tyres: (Mesh | null)[];
  patches: (Mesh | null)[];
  rear: (Mesh | null)[];
  tyreMats: MeshLambertMaterial[];
  patchMats: MeshLambertMaterial[];
}

const bodyIndexCache = new WeakMap<PoseSnapshot['bodies'], Map<string, number>>();
function bodyIndexOf(snap: PoseSnapshot): Map<string, number> {
  let m = bodyIndexCache.get(snap.bodies);
  if (!m) {
    m = new Map(snap.bodies.map((b, i) => [b.id, i]));
    bodyIndexCache.set(snap.bodies, m);
  }
  return m;
}

function setTube(mesh: InstancedMesh, i: number, a: Vector3, b: Vector3, radius: number, hex: string): void {
  vd.subVectors(b, a);
  const len = vd.length();
  dummy.position.addVectors(a, b).multiplyScalar(0.5);
  if (len > 1e-9) dummy.quaternion.setFromUnitVectors(Y, vd.multiplyScalar(1 / len));
  dummy.scale.set(radius, Math.max(len, 1e-3), radius);
  dummy.updateMatrix();
  mesh.setMatrixAt(i, dummy.matrix);
  mesh.setColorAt(i, colour.set(hex));
}

function setJoint(mesh: InstancedMesh, i: number, p: Vector3, radius: number, hex: string): void {
  dummy.position.copy(p);
  dummy.quaternion.identity();
  dummy.scale.setScalar(radius);
  dummy.updateMatrix();
  mesh.setMatrixAt(i, dummy.matrix);
  mesh.setColorAt(i, colour.set(hex));
}

/** Writes every object of the scene for the state's pose. Exported for tests of the mapping. */
export function updateScene(s: WorkbenchState, topo: Topology | null, o: SceneObjects): void {
  const { tubes, joints, lines } = o;
  if (!tubes || !joints || !lines) return;
  const out = s.outcome;
  const snap = out.snapshot;
  const parts = out.parts;
  const brokenAll = out.shown === 'as-entered';
  let nt = 0;
  let nj = 0;
  let nl = 0;
  const linePos = lines.geometry.getAttribute('position') as BufferAttribute;
  const lineCol = lines.geometry.getAttribute('color') as BufferAttribute;
  const addLine = (a: Vector3, b: Vector3, hex: string) => {
    if (nl >= LINE_CAPACITY) return;
    colour.set(hex);
    linePos.setXYZ(2 * nl, a.x, a.y, a.z);
    linePos.setXYZ(2 * nl + 1, b.x, b.y, b.z);
    lineCol.setXYZ(2 * nl, colour.r, colour.g, colour.b);
    lineCol.setXYZ(2 * nl + 1, colour.r, colour.g, colour.b);
    nl++;
  };

  if (snap && topo) {
    const bi = bodyIndexOf(snap);
    for (const t of topo.tubes) {
      if (nt >= TUBE_CAPACITY) break;
      if (!place(t.a, snap, bi, va) || !place(t.b, snap, bi, vb)) continue;
      const broken = t.constraintId ? parts[`constraint.${t.constraintId}`] : undefined;
      const sev = broken && broken !== 'none' ? broken : parts[`tube.${t.id}`];
      setTube(tubes, nt++, va, vb, t.radius, severityColour(sev, t.colour));
    }
    // Symbolic handlebar: a bar over the steering, turned by the handlebar angle, in the frame.
    const fi = bi.get('frame');
    if (fi !== undefined && nt + 2 <= TUBE_CAPACITY) {
      bodyMatrix(snap, fi, m4);
      const [hx, hy, hz] = topo.handlebarAt;
      const angle = (s.pose.handlebarDeg * Math.PI) / 180;
      va.set(0, 230, 0).applyAxisAngle(Z, angle).add(vd.set(hx, hy, hz));
      vb.set(0, -230, 0).applyAxisAngle(Z, angle).add(vd.set(hx, hy, hz));
      va.applyMatrix4(m4);
      vb.applyMatrix4(m4);
      setTube(tubes, nt++, va, vb, 11, PART_COLOUR.steering);
      va.set(hx, hy, hz).applyMatrix4(m4);
      vb.set(hx, hy, hz - 150).applyMatrix4(m4);
      setTube(tubes, nt++, va, vb, 9, PART_COLOUR.steering);
    }
    for (const j of topo.joints) {
      if (nj >= JOINT_CAPACITY) break;
      if (!place(j.at, snap, bi, va)) continue;
      const selected = s.selection === j.id;
      const sev = parts[`joint.${j.id}`];
      const hex = selected ? PART_COLOUR.selection : brokenAll ? SEVERITY_STYLE.broken.colour : severityColour(sev, PART_COLOUR.joint);
      setJoint(joints, nj++, va, j.radius * (selected ? 1.7 : 1), hex);
    }
    for (const l of topo.axisLines) {
      if (!place(l.a, snap, bi, va) || !place(l.b, snap, bi, vb)) continue;
      if (l.toGround) {
        vd.subVectors(vb, va);
        if (vd.z < -1e-6) {
          const t = -vb.z / vd.z;
          vd.multiplyScalar(t).add(vb);
          addLine(va, vd, l.colour);
          continue;
        }
      }
      addLine(va, vb, l.colour);
    }
    if (fi !== undefined && topo.outline.length > 1) {
      bodyMatrix(snap, fi, m4);
      for (let k = 0; k < topo.outline.length; k++) {
        const p = topo.outline[k];
        const n = topo.outline[(k + 1) % topo.outline.length];
        va.set(p[0], p[1], p[2]).applyMatrix4(m4);
        vb.set(n[0], n[1], n[2]).applyMatrix4(m4);
        addLine(va, vb, PART_COLOUR.frame);
      }
    }
    // The turn centre and each wheel's path about it (from core's slip analysis).
    const tcen = out.analysis?.slip.turnCentreMm;
    if (tcen && out.shown === 'requested') {
      const contacts: [number, number][] = [
        [snap.wheels.left.contactPoint[0], snap.wheels.left.contactPoint[1]],
        [snap.wheels.right.contactPoint[0], snap.wheels.right.contactPoint[1]],
      ];
      if (fi !== undefined) {
        bodyMatrix(snap, fi, m4);
        for (const w of topo.rearWheels) {
          va.set(w.centre[0], w.centre[1], 0).applyMatrix4(m4);
          contacts.push([va.x, va.y]);
        }
      }
      for (const [px, py] of contacts) {
        const radius = Math.hypot(px - tcen.x, py - tcen.y);
        if (!(radius > 1)) continue;
        const a0 = Math.atan2(py - tcen.y, px - tcen.x);
        const half = Math.min(Math.PI / 3, PATH_HALF_MM / radius);
        for (let k = 0; k < PATH_SEGMENTS; k++) {
          const t0 = a0 - half + (2 * half * k) / PATH_SEGMENTS;
          const t1 = a0 - half + (2 * half * (k + 1)) / PATH_SEGMENTS;
          va.set(tcen.x + radius * Math.cos(t0), tcen.y + radius * Math.sin(t0), 1);
          vb.set(tcen.x + radius * Math.cos(t1), tcen.y + radius * Math.sin(t1), 1);
          addLine(va, vb, PART_COLOUR.path);
        }
        if (radius < 30000) {
          va.set(tcen.x, tcen.y, 1);
          vb.set(px, py, 1);
          addLine(va, vb, PART_COLOUR.pathRadius);
        }
      }
      if (Math.hypot(tcen.x, tcen.y) < 30000) {
        for (const [dx, dy] of [[60, 0], [0, 60], [42, 42], [42, -42]] as const) {
          va.set(tcen.x - dx, tcen.y - dy, 1);
          vb.set(tcen.x + dx, tcen.y + dy, 1);
          addLine(va, vb, PART_COLOUR.path);
        }
      }
    }
    // Front wheels and contact patches.
    (['left', 'right'] as const).forEach((side, i) => {
      const w = snap.wheels[side];
      const tyre = o.tyres[i];
      const patch = o.patches[i];
      const sev = brokenAll ? 'broken' : parts[`tyre.${side}`];
      if (tyre) {
        tyre.visible = true;
        tyre.position.set(w.centre[0], w.centre[1], w.centre[2]);
        tyre.quaternion.setFromUnitVectors(Z, vd.set(w.spinAxis[0], w.spinAxis[1], w.spinAxis[2]).normalize());
        // A tyre within tolerance stays tyre-coloured; its contact patch shows the condition.
        o.tyreMats[i].color.set(sev === 'within' ? PART_COLOUR.tyre : severityColour(sev, PART_COLOUR.tyre));
      }
      if (patch && topo) {
        patch.visible = true;
        patch.position.set(w.contactPoint[0], w.contactPoint[1], Math.max(w.contactPoint[2], 0) + 1.5);
        patch.scale.set(topo.front.width * 0.9, topo.front.width * 0.9, 1);
        o.patchMats[i].color.set(severityColour(sev, PART_COLOUR.rim));
      }
    });
    topo.rearWheels.forEach((w, i) => {
      const mesh = o.rear[i];
      if (!mesh || fi === undefined) return;
      bodyMatrix(snap, fi, m4);
      mesh.visible = true;
      mesh.position.set(w.centre[0], w.centre[1], w.centre[2]).applyMatrix4(m4);
      // Spin axis along the frame's y.
      q.setFromRotationMatrix(m4);
      mesh.quaternion.setFromUnitVectors(Z, Y).premultiply(q);
    });
  } else {
    // Invalid design: only the hardpoints as entered, in the "won't assemble" colour.
    for (const r of hardpointRows(s.design)) {
      if (nj >= JOINT_CAPACITY) break;
      const p = r.value;
      if (![p?.x, p?.y, p?.z].every((c) => typeof c === 'number' && Number.isFinite(c))) continue;
      va.set(p.x, p.y, p.z);
      setJoint(joints, nj++, va, 13 * (s.selection === r.id ? 1.7 : 1), s.selection === r.id ? PART_COLOUR.selection : SEVERITY_STYLE.broken.colour);
    }
    for (const m of [...o.tyres, ...o.patches, ...o.rear]) if (m) m.visible = false;
  }
  tubes.count = nt;
  joints.count = nj;
  // Picking tests a bounding sphere first; let three.js recompute it for the new pose.
  tubes.boundingSphere = null;
  joints.boundingSphere = null;
  tubes.instanceMatrix.needsUpdate = true;
  joints.instanceMatrix.needsUpdate = true;
  if (tubes.instanceColor) tubes.instanceColor.needsUpdate = true;
  if (joints.instanceColor) joints.instanceColor.needsUpdate = true;
  lines.geometry.setDrawRange(0, nl * 2);
  linePos.needsUpdate = true;
  lineCol.needsUpdate = true;
}
