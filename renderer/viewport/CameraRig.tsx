/** Orbit, pan and zoom; the named views; fit to view. */
import { useEffect, useRef, type ComponentRef } from 'react';
import { useThree } from '@react-three/fiber';
import { OrbitControls } from '@react-three/drei';
import { Box3, PerspectiveCamera, Sphere, Vector3 } from 'three';
import { useWorkbenchApi } from '../app/workbenchContext';
import { motion, renderStats, viewRequests, type ViewName } from './viewSignals';

/** Direction from the target to the camera for each view (x forward, y left, z up). */
const VIEW_DIRECTION: Record<Exclude<ViewName, 'fit'>, [number, number, number]> = {
  front: [1, 0, 0.12],
  side: [0, 1, 0.08],
  top: [-0.002, 0, 1],
  threeQuarter: [1, 0.85, 0.62],
};

export function CameraRig() {
  const controls = useRef<ComponentRef<typeof OrbitControls>>(null);
  const shownOnce = useRef(false);
  const camera = useThree((s) => s.camera) as PerspectiveCamera;
  const size = useThree((s) => s.size);
  const invalidate = useThree((s) => s.invalidate);
  const wb = useWorkbenchApi();

  useEffect(() => {
    const v = new Vector3();
    renderStats.project = (x, y, z) => {
      v.set(x, y, z).project(camera);
      return [((v.x + 1) / 2) * size.width, ((1 - v.y) / 2) * size.height];
    };
  }, [camera, size.width, size.height]);

  useEffect(() => {
    const show = (view: ViewName) => {
      const c = controls.current;
      if (!c) return;
      const box = new Box3();
      const { outcome, resolved: rs } = wb.pose.getState();
      const snap = outcome.snapshot;
      const pts = snap ? Object.values(snap.points) : [];
      for (const p of pts) box.expandByPoint(new Vector3(p[0], p[1], p[2]));
      if (snap) {
        for (const w of [snap.wheels.left, snap.wheels.right]) {
          const r = rs?.wheels.front.rollingRadiusMm ?? 250;
          box.expandByPoint(new Vector3(w.centre[0] + r, w.centre[1], w.centre[2] + r));
          box.expandByPoint(new Vector3(w.centre[0] - r, w.centre[1], 0));
        }
      }
      if (rs && view === 'fit') box.expandByPoint(new Vector3(-rs.vehicle.wheelbaseMm - rs.wheels.rear.rollingRadiusMm, 0, 0));
      if (box.isEmpty()) box.set(new Vector3(-400, -500, 0), new Vector3(400, 500, 500));
      const sphere = box.getBoundingSphere(new Sphere());
      const dir =
        view === 'fit' ? new Vector3().subVectors(camera.position, c.target).normalize() : new Vector3(...VIEW_DIRECTION[view]).normalize();
      const vFov = (camera.fov * Math.PI) / 180;
      const hFov = 2 * Math.atan(Math.tan(vFov / 2) * (size.width / Math.max(1, size.height)));
      const dist = (sphere.radius / Math.sin(Math.min(vFov, hFov) / 2)) * 1.02;
      c.target.copy(sphere.center);
      camera.position.copy(sphere.center).addScaledVector(dir, dist);
      camera.near = Math.max(1, dist / 100);
      camera.far = dist * 20;
      camera.updateProjectionMatrix();
      c.update();
      invalidate();
    };
    const off = viewRequests.on(show);
    // First view once the canvas has a size (later resizes keep the user's view).
    let t: ReturnType<typeof setTimeout> | undefined;
    if (!shownOnce.current && size.width > 0 && size.height > 0) {
      shownOnce.current = true;
      t = setTimeout(() => show('threeQuarter'), 0);
    }
    return () => {
      off();
      clearTimeout(t);
    };
  }, [camera, size.width, size.height, invalidate, wb]);

  return (
    <OrbitControls
      ref={controls}
      makeDefault
      enableDamping={false}
      screenSpacePanning
      onChange={() => motion.emit()}
    />
  );
}
