/**
 * Drag the selected hardpoint with a transform gizmo, along an axis or in a plane of the body
 * that carries it (vehicle axes at the design position); the linkage re-solves on every move
 * and the whole drag is one undo step. While dragging, the gizmo's frame is held where the
 * drag began, so the point does not run away as the linkage moves under it.
 */
import { useLayoutEffect, useMemo, useRef } from 'react';
import { TransformControls } from '@react-three/drei';
import { useThree } from '@react-three/fiber';
import { Group, Matrix4, Object3D } from 'three';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { useDocument, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { hardpointRows } from '../model/hardpoints';
import { bodyIndexOf, bodyPose } from './scenePlacement';
import { motion } from './viewSignals';
import { snapDrag } from './precision';
import type { Vec3Mm } from '../../core/design/types';

const m4 = new Matrix4();

/** Id of the body carrying a hardpoint, from the mechanism's drawing. */
function carrierOf(drawing: DrawingLayout | null, hardpoint: string): string | null {
  return drawing?.joints.find((j) => j.hardpoint === hardpoint)?.body ?? null;
}

export function HardpointGizmo() {
  const wb = useWorkbenchApi();
  const selection = useUi((s) => s.selection);
  const constraint = useUi((s) => s.gizmo.constraint);
  const snap = useUi((s) => s.gizmo.snapMm);
  const enabled = useUi((s) => s.gizmo.enabled);
  const rowExists = useDocument((s) => selection !== null && hardpointRows(s.design).some((r) => r.id === selection));
  const invalidate = useThree((s) => s.invalidate);
  const frame = useRef<Group>(null);
  const target = useMemo(() => new Object3D(), []);
  const dragging = useRef(false);
  /** The point's design value when the drag began: axes the drag does not move keep it exactly. */
  const dragStart = useRef<Vec3Mm | null>(null);

  useLayoutEffect(() => {
    if (!selection) return;
    const place = () => {
      const g = frame.current;
      if (!g || dragging.current) return;
      const row = hardpointRows(wb.document.getState().design).find((r) => r.id === selection);
      if (!row) return;
      const { outcome, drawing } = wb.pose.getState();
      const snapShot = outcome.snapshot;
      const body = carrierOf(drawing, selection);
      if (!snapShot || !body || !bodyPose(body, snapShot, bodyIndexOf(snapShot), m4)) m4.identity();
      g.matrixAutoUpdate = false;
      g.matrix.copy(m4);
      g.updateMatrixWorld(true);
      target.position.set(row.value.x, row.value.y, row.value.z);
      target.updateMatrixWorld(true);
      invalidate();
    };
    place();
    // Every change of the design is solved again, so the pose store hears of it too.
    return wb.pose.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome) place();
    });
  }, [wb, selection, target, invalidate]);
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
          dragStart.current = hardpointRows(wb.document.getState().design).find((r) => r.id === selection)?.value ?? null;
          wb.actions.beginDrag();
        }}
        onObjectChange={() => {
          if (!dragging.current || !selection) return;
          motion.emit();
          const p = target.position;
          const proposed = { x: p.x, y: p.y, z: p.z };
          wb.actions.dragPoint(selection, snapDrag(dragStart.current ?? proposed, proposed, snap));
        }}
        onMouseUp={() => {
          dragging.current = false;
          dragStart.current = null;
          wb.actions.endDrag();
        }}
      />
    </>
  );
}
