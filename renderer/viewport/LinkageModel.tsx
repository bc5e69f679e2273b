/**
 * The linkage in 3D from the solved pose, drawn from the drawing layout core's template
 * emitted with the mechanism. Objects are created once; every pose update writes their
 * matrices and colours through refs (no React render per frame, see sceneUpdate.ts) and
 * asks for one frame (render on demand).
 */
import { useLayoutEffect, useMemo, useRef, type RefObject } from 'react';
import { useThree, type ThreeEvent } from '@react-three/fiber';
import {
  BufferAttribute,
  BufferGeometry,
  CircleGeometry,
  CylinderGeometry,
  DynamicDrawUsage,
  IcosahedronGeometry,
  type InstancedMesh,
  type LineSegments,
  type Mesh,
  MeshLambertMaterial,
  TorusGeometry,
} from 'three';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { usePose, useWorkbenchApi } from '../app/workbenchContext';
import { hardpointRows } from '../model/hardpoints';
import { PART_COLOUR } from '../model/severity';
import { JOINT_CAPACITY, LINE_CAPACITY, TUBE_CAPACITY, updateScene } from './sceneUpdate';
import { renderStats } from './viewSignals';
import { describeJoint, describeTube, describeTyre, type HoverSource } from './hoverText';

/** Tyre materials: the front wheels first, then the rear ones. */
const TYRE_SLOTS = 4;
const FRONT_SLOTS = 2;

function useGeometries() {
  return useMemo(() => {
    const line = new BufferGeometry();
    const pos = new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3);
    const col = new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3);
    pos.setUsage(DynamicDrawUsage);
    col.setUsage(DynamicDrawUsage);
    line.setAttribute('position', pos);
    line.setAttribute('color', col);
    return {
      tube: new CylinderGeometry(1, 1, 1, 10, 1, false),
      joint: new IcosahedronGeometry(1, 1),
      line,
      patch: new CircleGeometry(1, 20),
    };
  }, []);
}

/** Torus geometries for the layout's front and rear tyres. */
function useTyreGeometries(layout: DrawingLayout | null) {
  return useMemo(() => {
    const f = layout?.frontWheels[0];
    const r = layout?.rearWheels[0];
    return {
      front: f ? new TorusGeometry(f.rollingRadius - f.crownRadius, f.crownRadius, 8, 36) : null,
      rear: r ? new TorusGeometry(r.rollingRadius - r.crownRadius, r.crownRadius, 8, 36) : null,
    };
  }, [layout]);
}

/** Refs to the scene's objects, filled as they mount. */
interface SceneRefs {
  tubes: RefObject<InstancedMesh | null>;
  joints: RefObject<InstancedMesh | null>;
  lines: RefObject<LineSegments | null>;
  tyres: RefObject<(Mesh | null)[]>;
  patches: RefObject<(Mesh | null)[]>;
  rear: RefObject<(Mesh | null)[]>;
}

/** Writes the scene now and whenever the solved pose or the selection changes, then asks for a frame. */
function useSceneFollowsPose(layout: DrawingLayout | null, refs: SceneRefs, tyreMats: MeshLambertMaterial[], patchMats: MeshLambertMaterial[]): void {
  const wb = useWorkbenchApi();
  const invalidate = useThree((s) => s.invalidate);
  useLayoutEffect(() => {
    const apply = () => {
      const input = { outcome: wb.pose.getState().outcome, selection: wb.ui.getState().selection, design: wb.document.getState().design };
      updateScene(input, layout, {
        tubes: refs.tubes.current,
        joints: refs.joints.current,
        lines: refs.lines.current,
        tyres: refs.tyres.current,
        patches: refs.patches.current,
        rear: refs.rear.current,
        tyreMats,
        patchMats,
      });
      renderStats.sceneSerial++;
      invalidate();
    };
    apply();
    // A change of the design is solved again, so the pose store hears of every change that matters.
    const offPose = wb.pose.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome) apply();
    });
    const offUi = wb.ui.subscribe((s, prev) => {
      if (s.selection !== prev.selection) apply();
    });
    return () => {
      offPose();
      offUi();
    };
  }, [wb, layout, refs, invalidate, tyreMats, patchMats]);
}

/** Shows and hides the hover tip; `source` is what the tip's words are read from. */
function useHoverTip() {
  const wb = useWorkbenchApi();
  return useMemo(
    () => ({
      source: (): HoverSource => ({ design: wb.document.getState().design, outcome: wb.pose.getState().outcome }),
      show(e: ThreeEvent<PointerEvent>, [title, text]: [string, string[]]) {
        e.stopPropagation();
        const rect = (e.target as HTMLElement | null)?.getBoundingClientRect?.();
        const x = e.nativeEvent.offsetX ?? e.clientX - (rect?.left ?? 0);
        const y = e.nativeEvent.offsetY ?? e.clientY - (rect?.top ?? 0);
        wb.ui.setState({ hover: { x, y, title, lines: text } });
      },
      hide: () => wb.ui.setState({ hover: null }),
    }),
    [wb],
  );
}

export function LinkageModel() {
  const wb = useWorkbenchApi();
  const layout = usePose((s) => s.drawing);
  const tubes = useRef<InstancedMesh>(null);
  const joints = useRef<InstancedMesh>(null);
  const lines = useRef<LineSegments>(null);
  const tyreRefs = useRef<(Mesh | null)[]>([]);
  const patchRefs = useRef<(Mesh | null)[]>([]);
  const rearRefs = useRef<(Mesh | null)[]>([]);
  const refs = useMemo<SceneRefs>(() => ({ tubes, joints, lines, tyres: tyreRefs, patches: patchRefs, rear: rearRefs }), []);

  const geo = useGeometries();
  const tyreGeo = useTyreGeometries(layout);
  const tyreMats = useMemo(() => Array.from({ length: TYRE_SLOTS }, () => new MeshLambertMaterial({ color: PART_COLOUR.tyre })), []);
  const patchMats = useMemo(() => Array.from({ length: FRONT_SLOTS }, () => new MeshLambertMaterial({ color: PART_COLOUR.rim })), []);
  useSceneFollowsPose(layout, refs, tyreMats, patchMats);
  const { source, show: hover, hide: unhover } = useHoverTip();

  /** The hardpoint under the pointer: a drawn joint, or a hardpoint drawn as entered. */
  const hardpointAt = (e: ThreeEvent<PointerEvent | MouseEvent>): string | undefined => {
    if (e.instanceId === undefined) return undefined;
    if (wb.pose.getState().outcome.snapshot && layout) return layout.joints[e.instanceId]?.hardpoint;
    return hardpointRows(wb.document.getState().design)[e.instanceId]?.id;
  };

  return (
    <group>
      <instancedMesh ref={tubes} args={[geo.tube, undefined, TUBE_CAPACITY]} frustumCulled={false}
        onPointerMove={(e) => {
          const t = layout && e.instanceId !== undefined ? layout.tubes[e.instanceId] : undefined;
          if (t && layout) hover(e, describeTube(t, layout, source()));
        }}
        onPointerOut={unhover}>
        <meshLambertMaterial />
      </instancedMesh>
      <instancedMesh ref={joints} args={[geo.joint, undefined, JOINT_CAPACITY]} frustumCulled={false}
        onPointerMove={(e) => {
          const id = hardpointAt(e);
          if (id) hover(e, describeJoint(id, layout, source()));
        }}
        onPointerOut={unhover}
        onClick={(e) => {
          e.stopPropagation();
          const id = hardpointAt(e);
          if (id) wb.actions.select(id);
        }}>
        <meshLambertMaterial />
      </instancedMesh>
      <lineSegments ref={lines} geometry={geo.line} frustumCulled={false} raycast={() => null}>
        <lineBasicMaterial vertexColors />
      </lineSegments>
      {tyreGeo.front &&
        layout?.frontWheels.slice(0, FRONT_SLOTS).map((w, i) => (
          <mesh key={w.id} ref={(m) => { tyreRefs.current[i] = m; }} geometry={tyreGeo.front!} material={tyreMats[i]}
            onPointerMove={(e) => hover(e, describeTyre(w, source()))} onPointerOut={unhover} />
        ))}
      {layout?.frontWheels.slice(0, FRONT_SLOTS).map((w, i) => (
        <mesh key={w.id} ref={(m) => { patchRefs.current[i] = m; }} geometry={geo.patch} material={patchMats[i]}
          onPointerMove={(e) => hover(e, describeTyre(w, source()))} onPointerOut={unhover} />
      ))}
      {tyreGeo.rear &&
        layout?.rearWheels.slice(0, TYRE_SLOTS - FRONT_SLOTS).map((w, i) => (
          <mesh key={w.id} ref={(m) => { rearRefs.current[i] = m; }} geometry={tyreGeo.rear!} material={tyreMats[FRONT_SLOTS + i]} raycast={() => null} />
        ))}
    </group>
  );
}
