/**
 * Drag the selected hardpoint with a transform gizmo, along an axis or in a plane of the body
 * that carries it (vehicle axes at the design position); the linkage re-solves on every move
 * and the whole drag is one undo step. While dragging, the gizmo's frame is held where the
 * drag began, so the point does not run away as the linkage moves under it.
 */
import { useLayoutEffect, useMemo, useRef } from 'react';
import { TransformControls } from '@react-three/drei';
import { useThree } from '@react-three/fiber';
import { useStore } from 'zustand';
import { Group, Matrix4, Object3D } from 'three';
import { useWorkbench, useWorkbenchApi } from '../app/workbenchContext';
import { hardpointRows } from '../model/hardpoints';
import type { WorkbenchState } from '../model/workbenchStore';
import { bodyIndexOf, bodyPose } from './scenePlacement';
import { gizmoStore } from './gizmoStore';
import { motion } from './viewSignals';

const m4 = new Matrix4();

/** Id of the body carrying a hardpoint, from the mechanism's drawing. */
function carrierOf(s: WorkbenchState, hardpoint: string): string | null {
  return s.drawing?.joints.find((j) => j.hardpoint === hardpoint)?.body ?? null;
}

export function HardpointGizmo() {
  const wb = useWorkbenchApi();
  const selection = useWorkbench((s) => s.selection);
  const constraint = useStore(gizmoStore, (s) => s.constraint);
  const snap = useStore(gizmoStore, (s) => s.snapMm);
  const enabled = useStore(gizmoStore, (s) => s.enabled);
  const invalidate = useThree((s) => s.invalidate);
  const frame = useRef<Group>(null);
  const target = useMemo(() => new Object3D(), []);
  const dragging = useRef(false);

  useLayoutEffect(() => {
    if (!selection) return;
    const place = (s: WorkbenchState) => {
      const g = frame.current;
      if (!g || dragging.current) return;
      const row = hardpointRows(s.design).find((r) => r.id === selection);
      if (!row) return;
      const snapShot = s.outcome.snapshot;
      const body = carrierOf(s, selection);
      if (!snapShot || !body || !bodyPose(body, snapShot, bodyIndexOf(snapShot), m4)) m4.identity();
      g.matrixAutoUpdate = false;
      g.matrix.copy(m4);
      g.updateMatrixWorld(true);
      target.position.set(row.value.x, row.value.y, row.value.z);
      target.updateMatrixWorld(true);
      invalidate();
    };
    place(wb.store.getState());
    return wb.store.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome || s.design !== prev.design) place(s);
    });
  }, [wb, selection, target, invalidate]);

  const rowExists = selection !== null && hardpointRows(wb.store.getState().design).some((r) => r.id === selection);
  if (!rowExists || !enabled) return null;
  const show = { x: constraint === 'free' || constraint.includes('x'), y: constraint === 'free' || constraint.includes('y'), z: constraint === 'free' || constraint.includes('z') };
  return (
    <>
      <group ref={frame}>
        <primitive object={target} />
      </group>
      {/* Outside the carrier's group: the gizmo places itself at the target's world pose. */}
      <TransformControls
        object={target}
        mode="translate"
        space="local"
        size={0.75}
        showX={show.x}
        showY={show.y}
        showZ={show.z}
        translationSnap={snap > 0 ? snap : null}
        onMouseDown={() => {
          dragging.current = true;
          wb.actions.beginDrag();
        }}
        onObjectChange={() => {
          if (!dragging.current || !selection) return;
          motion.emit();
          const p = target.position;
          const r = (v: number) => Math.round(v * 10) / 10;
          wb.actions.dragPoint(selection, { x: r(p.x), y: r(p.y), z: r(p.z) });
        }}
        onMouseUp={() => {
          dragging.current = false;
          wb.actions.endDrag();
        }}
      />
    </>
  );
}
