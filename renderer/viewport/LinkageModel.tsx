/**
 * The linkage in 3D from the solved pose, drawn from the drawing layout core's template
 * emitted with the mechanism. Objects are created once; every pose update writes their
 * matrices and colours through refs (no React render per frame, see sceneUpdate.ts) and
 * asks for one frame (render on demand).
 */
import { useLayoutEffect, useMemo, useRef, type RefObject } from 'react';
import { useThree, type ThreeEvent } from '@react-three/fiber';
import { BufferAttribute, BufferGeometry, CylinderGeometry, DynamicDrawUsage, IcosahedronGeometry, type InstancedMesh, type LineSegments, PlaneGeometry } from 'three';
import type { DrawingLayout, DrawnFrontWheel } from '../../core/mechanism/drawingLayout';
import { usePose, useWorkbenchApi } from '../app/workbenchContext';
import { hardpointRows } from '../model/hardpoints';
import { JOINT_CAPACITY, LINE_CAPACITY, TUBE_CAPACITY, updateScene, type SceneObjects } from './sceneUpdate';
import { renderStats, shownView, viewShown } from './viewSignals';
import { describeJoint, describeTube, describeTyre, type HoverSource } from './hoverText';
import { FRONT_SLOTS, type WheelSlot } from './wheelsUpdate';
import { createWheelSlots } from './wheelSlots';
import { blobTexture, markGeometries } from './markGeometry';
import { VIEW_COLOUR } from './palette';
import { TextLabel } from './textLabel';

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
      marks: markGeometries(),
      unitPlane: new PlaneGeometry(1, 1),
    };
  }, []);
}

/** The wheel slots' objects, made once per layout (wheelSlots.ts). */
function useWheelSlots(layout: DrawingLayout | null, marks: SceneObjects['markGeo'], plane: PlaneGeometry) {
  const shadowTex = useMemo(() => blobTexture(), []);
  return useMemo(() => createWheelSlots(layout, marks, plane, shadowTex), [layout, marks, plane, shadowTex]);
}

/** Refs to the scene's objects, filled as they mount. */
interface SceneRefs {
  tubes: RefObject<InstancedMesh | null>;
  joints: RefObject<InstancedMesh | null>;
  lines: RefObject<LineSegments | null>;
}

/** Writes the scene now and whenever the solved pose, the selection or the view changes, then asks for a frame. */
function useSceneFollowsPose(layout: DrawingLayout | null, refs: SceneRefs, wheels: (WheelSlot | null)[], markGeo: SceneObjects['markGeo'], leanLabel: TextLabel): void {
  const wb = useWorkbenchApi();
  const invalidate = useThree((s) => s.invalidate);
  useLayoutEffect(() => {
    const apply = () => {
      const input = { outcome: wb.pose.getState().outcome, selection: wb.ui.getState().selection, design: wb.document.getState().design, view: shownView.current };
      updateScene(input, layout, {
        tubes: refs.tubes.current,
        joints: refs.joints.current,
        lines: refs.lines.current,
        wheels,
        markGeo,
        leanLabel: { object: leanLabel.sprite, set: (t) => leanLabel.set(t) },
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
    const offView = viewShown.on(apply);
    return () => {
      offPose();
      offUi();
      offView();
    };
  }, [wb, layout, refs, invalidate, wheels, markGeo, leanLabel]);
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
  const refs = useMemo<SceneRefs>(() => ({ tubes, joints, lines }), []);

  const geo = useGeometries();
  const slots = useWheelSlots(layout, geo.marks, geo.unitPlane);
  const leanLabel = useMemo(() => new TextLabel('', { colour: '#ffffff', backdrop: VIEW_COLOUR.lean, height: 55, bold: true }), []);
  useSceneFollowsPose(layout, refs, slots, geo.marks, leanLabel);
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
      <primitive object={leanLabel.sprite} />
      {slots.map((slot, i) =>
        slot ? (
          <group key={`${i}-${slot.wheel.id}`}>
            <primitive object={slot.shadow} />
            <primitive object={slot.mark} />
            <primitive
              object={slot.group}
              onPointerMove={i < FRONT_SLOTS ? (e: ThreeEvent<PointerEvent>) => hover(e, describeTyre(slot.wheel as DrawnFrontWheel, source())) : undefined}
              onPointerOut={i < FRONT_SLOTS ? unhover : undefined}
            />
          </group>
        ) : null,
      )}
    </group>
  );
}
