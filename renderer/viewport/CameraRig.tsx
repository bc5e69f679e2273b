/**
 * Orbit, pan and zoom; the named views; fit to view. Front, Side and Top are true elevations
 * (each its own orthographic camera: pan and zoom, no orbit); the three-quarter view is the
 * perspective camera, free to orbit. Every view is framed on everything drawn, every wheel
 * included (framing.ts).
 */
import { useEffect, useLayoutEffect, useMemo, useRef, useState, type ComponentRef } from 'react';
import { useThree } from '@react-three/fiber';
import { OrbitControls } from '@react-three/drei';
import { OrthographicCamera, PerspectiveCamera, Vector3 } from 'three';
import { useWorkbenchApi } from '../app/workbenchContext';
import { applyFraming, defaultPoints, framingFor, perspectiveFraming, scenePoints, type ElevationName, type Framing, type Insets } from './framing';
import { motion, renderStats, setShownView, shownView, viewRequests, type ViewName } from './viewSignals';
import { groundMarkPlaces, halfTrackOf } from './markGeometry';
import { TRIAD_PX } from './AxisTriad';
import { leanGaugeRadius } from './sceneUpdate';

/** An orthographic frustum of the canvas's size in pixels (its zoom gives pixels per mm). */
function pixelFrustum(cam: OrthographicCamera, width: number, height: number): void {
  cam.left = -width / 2;
  cam.right = width / 2;
  cam.top = height / 2;
  cam.bottom = -height / 2;
  cam.updateProjectionMatrix();
}

/** How far the view buttons, the legend and the triad reach into the canvas (CSS pixels), so framing keeps clear of them. */
function controlInsets(canvas: HTMLCanvasElement): Insets {
  const c = canvas.getBoundingClientRect();
  const host = canvas.closest('[data-testid=viewport]');
  const bar = host?.querySelector('.view-bar')?.getBoundingClientRect();
  const legend = host?.querySelector('[data-testid=legend]')?.getBoundingClientRect();
  return {
    top: Math.max(bar ? bar.bottom - c.top + 4 : 0, TRIAD_PX * 0.6),
    bottom: legend && legend.height > 0 ? Math.max(0, c.bottom - legend.top + 4) : 0,
    left: 0,
    right: 0,
  };
}

export function CameraRig() {
  const controls = useRef<ComponentRef<typeof OrbitControls>>(null);
  const shownOnce = useRef(false);
  const perspective = useThree((s) => s.camera) as PerspectiveCamera;
  const size = useThree((s) => s.size);
  const set = useThree((s) => s.set);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const wb = useWorkbenchApi();
  // The Canvas's own camera is the perspective one; the elevations get one orthographic camera each (each keeps its own up).
  const persp = useRef(perspective);
  const elevations = useMemo<Record<ElevationName, OrthographicCamera>>(() => ({ front: new OrthographicCamera(), side: new OrthographicCamera(), top: new OrthographicCamera() }), []);
  const [active, setActive] = useState<PerspectiveCamera | OrthographicCamera>(perspective);
  const pendingTarget = useRef<Vector3 | null>(null);
  const isOrtho = active instanceof OrthographicCamera;

  useEffect(() => {
    const v = new Vector3();
    renderStats.camera = active instanceof OrthographicCamera ? 'orthographic' : 'perspective';
    renderStats.project = (x, y, z) => {
      v.set(x, y, z).project(active);
      return [((v.x + 1) / 2) * size.width, ((1 - v.y) / 2) * size.height];
    };
  }, [active, size.width, size.height]);

  // An elevation keeps its scale across a resize; its frustum follows the canvas in pixels.
  useEffect(() => {
    if (!(active instanceof OrthographicCamera)) return;
    pixelFrustum(active, size.width, size.height);
    invalidate();
  }, [active, size.width, size.height, invalidate]);

  // After a camera switch the controls are new: give them the framed target.
  useLayoutEffect(() => {
    const c = controls.current;
    const t = pendingTarget.current;
    if (!c || !t) return;
    pendingTarget.current = null;
    c.target.copy(t);
    c.update();
    invalidate();
  }, [active, invalidate]);

  useEffect(() => {
    const show = (view: ViewName) => {
      const { outcome, drawing } = wb.pose.getState();
      const shown = view === 'fit' ? shownView.current : view;
      let pts = scenePoints(outcome.snapshot, drawing);
      if (shown === 'front' && drawing) {
        // The lean gauge and its label reach above the frame.
        const r = leanGaugeRadius(drawing);
        const lean = Math.abs(wb.pose.getState().pose.leanDeg * (Math.PI / 180));
        for (const sgn of [-1, 1]) pts.push(new Vector3(0, sgn * (Math.sin(lean) * r * 1.18 + 150), Math.cos(lean) * r * 1.18 + 60));
      }
      if (pts.length === 0) pts = defaultPoints();
      // The ground's letters and arrow, as GroundGrid places them.
      const marks = groundMarkPlaces(halfTrackOf(outcome.snapshot?.wheels.left.contactPoint[1]), wb.document.getState().design.wheels.front.rollingRadiusMm || 250);
      for (const at of [marks.left, marks.right]) for (const dz of [-1, 1]) pts.push(new Vector3(at[0], at[1] + Math.sign(at[1]) * marks.halfSize, at[2] + dz * marks.halfSize));
      pts.push(new Vector3(marks.arrowX + marks.arrowLen / 2, 0, 0));
      if (shown !== 'front') pts.push(new Vector3(marks.front[0] + 2 * marks.halfSize, 0, marks.front[2]));
      const insets = controlInsets(gl.domElement);
      const w = Math.max(1, size.width);
      const h = Math.max(1, size.height);
      let framing: Framing;
      if (view === 'fit' && shown === 'threeQuarter') {
        // Fit keeps the direction the perspective camera looks from.
        const c = controls.current;
        const dir = c ? new Vector3().subVectors(persp.current.position, c.target) : new Vector3(1, 0.85, 0.62);
        framing = perspectiveFraming(pts, dir.lengthSq() > 0 ? dir : new Vector3(1, 0.85, 0.62), new Vector3(0, 0, 1), persp.current.fov, w, h, insets);
      } else {
        framing = framingFor(shown, pts, w, h, persp.current.fov, insets);
      }
      const cam = shown === 'threeQuarter' ? persp.current : elevations[shown];
      applyFraming(cam, framing, w, h);
      setShownView(shown);
      pendingTarget.current = framing.target.clone();
      if (cam !== active) {
        set({ camera: cam });
        setActive(cam);
      } else {
        const c = controls.current;
        if (c) {
          pendingTarget.current = null;
          c.target.copy(framing.target);
          c.update();
        }
      }
      invalidate();
    };
    const off = viewRequests.on(show);
    // Another design (opened, new, restored): frame it in the view shown, once it is solved.
    // Edits of the same design keep the camera where the user put it.
    const key = () => {
      const d = wb.document.getState();
      return `${d.doc.fileName}|${d.design.name}|${d.design.vehicle.wheelbaseMm}|${d.design.frontEnd.kind}`;
    };
    let framedFor = key();
    const offPose = wb.pose.subscribe((s, prev) => {
      if (s.outcome === prev.outcome || key() === framedFor) return;
      framedFor = key();
      show(shownView.current);
    });
    // First view once the canvas has a size (later resizes keep the user's view).
    let t: ReturnType<typeof setTimeout> | undefined;
    if (!shownOnce.current && size.width > 0 && size.height > 0) {
      shownOnce.current = true;
      t = setTimeout(() => show('threeQuarter'), 0);
    }
    return () => {
      off();
      offPose();
      clearTimeout(t);
    };
  }, [active, size.width, size.height, invalidate, wb, set, elevations, gl]);

  return (
    <OrbitControls
      ref={controls}
      camera={active}
      makeDefault
      enableDamping={false}
      enableRotate={!isOrtho}
      screenSpacePanning
      onChange={() => motion.emit()}
    />
  );
}
