/** The 3D viewport and the DOM around it: view buttons, legend, status, hover tip. */
import { Canvas } from '@react-three/fiber';
import { useActions, useDocument, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { SEVERITY_STYLE, SEVERITY_ORDER } from '../model/severity';
import { VIEW_COLOUR } from './palette';
import { CameraRig } from './CameraRig';
import { GroundGrid } from './GroundGrid';
import { LinkageModel } from './LinkageModel';
import { ReferenceGhost } from './ReferenceGhost';
import { RenderDriver } from './RenderDriver';
import { HardpointGizmo } from './HardpointGizmo';
import { ViewportBoundary } from './ViewportBoundary';
import { shownView, viewRequests, viewShown, type ShownView, type ViewName } from './viewSignals';
import { setGizmo, type GizmoConstraint } from '../state/uiStore';
import { rowName, hardpointRows } from '../model/hardpoints';
import { useEffect, useSyncExternalStore } from 'react';
import { SNAP_STEPS_MM } from './precision';
import { handleNudgeKey } from './nudgeKeys';
import { halfTrackOf } from './markGeometry';

const FULL_DPR = Math.min(2, typeof window === 'undefined' ? 1 : window.devicePixelRatio || 1);

const VIEWS: { view: ViewName; label: string; title: string }[] = [
  { view: 'threeQuarter', label: '3D', title: 'Perspective from the front left; drag to orbit' },
  { view: 'front', label: 'Front', title: 'Front elevation, true to scale (looking along −x; the vehicle’s left on the right); shows the lean angle' },
  { view: 'side', label: 'Side', title: 'Side elevation from the left, true to scale (looking along −y); the near wheel see-through' },
  { view: 'top', label: 'Top', title: 'Plan, true to scale (looking down along −z; forward to the left as in Side, the left side at the bottom)' },
  { view: 'fit', label: 'Fit', title: 'Fit everything, every wheel included, in this view' },
];

function useShownView(): ShownView {
  return useSyncExternalStore(
    (cb) => viewShown.on(cb),
    () => shownView.current,
  );
}

export function Viewport() {
  const { ui } = useWorkbenchApi();
  const wheelbase = useDocument((s) => s.design.vehicle.wheelbaseMm);
  const rearRadius = useDocument((s) => s.design.wheels.rear.rollingRadiusMm);
  const frontRadius = useDocument((s) => s.design.wheels.front.rollingRadiusMm);
  // Rounded so the ground is not rebuilt as the contact patches move in playback.
  const halfTrack = usePose((s) => halfTrackOf(s.outcome.snapshot?.wheels.left.contactPoint[1]));
  const wb = useWorkbenchApi();
  const view = useShownView();
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => void handleNudgeKey(wb, e);
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [wb]);
  return (
    <div className="viewport" data-testid="viewport">
      <ViewportBoundary>
        <Canvas
          frameloop="demand"
          dpr={FULL_DPR}
          gl={{ antialias: false, alpha: false, stencil: false, powerPreference: 'high-performance', preserveDrawingBuffer: false }}
          camera={{ up: [0, 0, 1], position: [1800, 1400, 1000], fov: 32, near: 10, far: 40000 }}
          onPointerMissed={() => ui.setState({ hover: null })}
        >
          <color attach="background" args={[VIEW_COLOUR.background]} />
          <ambientLight intensity={1.9} />
          <directionalLight position={[1500, 1100, 2600]} intensity={2.3} />
          <GroundGrid
            rearX={-(Number.isFinite(wheelbase) ? wheelbase : 1000) - (Number.isFinite(rearRadius) ? rearRadius : 300)}
            halfTrack={halfTrack}
            frontReach={Number.isFinite(frontRadius) ? frontRadius : 250}
          />
          <LinkageModel />
          <ReferenceGhost />
          <HardpointGizmo />
          <CameraRig />
          <RenderDriver fullDpr={FULL_DPR} />
        </Canvas>
      </ViewportBoundary>
      <div className="view-bar" role="toolbar" aria-label="Views">
        {VIEWS.map((v) => (
          <button
            key={v.view}
            type="button"
            title={v.title}
            aria-pressed={v.view === view}
            className={v.view === view ? 'is-active' : ''}
            data-testid={`view-${v.view}`}
            onClick={() => viewRequests.emit(v.view)}
          >
            {v.label}
          </button>
        ))}
      </div>
      <GizmoBar />
      <StatusOverlay />
      <Legend />
      <HoverTip />
    </div>
  );
}

function StatusOverlay() {
  const shown = usePose((s) => s.outcome.shown);
  const status = usePose((s) => s.outcome.status);
  const message = usePose((s) => s.outcome.message);
  if (shown === 'requested' && status !== 'singular') return null;
  let title: string;
  let text: string;
  if (status === 'invalid-design') {
    title = 'Design has errors — not solved';
    text = `Showing the hardpoints as entered. ${message[0].toUpperCase()}${message.slice(1)}.`;
  } else if (shown === 'as-entered') {
    title = "Won't assemble";
    text = `The linkage cannot close even at the design position: ${message}. Showing the hardpoints as entered.`;
  } else if (shown === 'last-good') {
    title = "Won't reach this pose";
    text = `${message[0].toUpperCase()}${message.slice(1)}. Showing the last pose that closed.`;
  } else {
    title = 'Near a dead centre';
    text = message;
  }
  return (
    <div className={`status-overlay ${status === 'singular' ? 'is-warning' : 'is-broken'}`} role="status" data-testid="viewport-status">
      <strong>
        {SEVERITY_STYLE.broken.glyph} {title}
      </strong>
      <span>{text}</span>
    </div>
  );
}

function Legend() {
  return (
    <div className="legend" role="note" aria-label="Legend" data-testid="legend">
      {SEVERITY_ORDER.filter((s) => s !== 'none').map((s) => (
        <span key={s} className="legend-item" title={SEVERITY_STYLE[s].meaning}>
          <span className="swatch" style={{ background: SEVERITY_STYLE[s].colour }} />
          {SEVERITY_STYLE[s].glyph} {SEVERITY_STYLE[s].word}
        </span>
      ))}
      <span className="legend-item" title="the selected hardpoint: a larger ball inside three rings">
        <span className="swatch" style={{ background: VIEW_COLOUR.selection }} />
        ◎ selected
      </span>
      <span className="legend-item" title="steering axes, drawn through to the ground">
        <span className="swatch line" style={{ background: VIEW_COLOUR.axis }} />
        steering axis
      </span>
      <span className="legend-item" title="the turn centre (star) and the path each wheel should roll on about it (dashed)">
        <span className="swatch line dashed" style={{ color: VIEW_COLOUR.path }} />
        turn centre, paths
      </span>
      <span
        className="legend-item legend-help"
        title="Contact marks under the front tyres (and the tyres when not within): slip and tyre clearance against the design's tolerances; the mark's shape repeats the status: disc within, triangle close, cross over, slashed ring won't assemble. Joints: articulation against rating and required margin. Parts: clearances and dead centre; a part over a tolerance or that will not close is drawn thicker. Grey: no check applies. Hover a part for its numbers."
      >
        (?) what is coloured
      </span>
    </div>
  );
}

function HoverTip() {
  const hover = useUi((s) => s.hover);
  if (!hover) return null;
  return (
    <div className="hover-tip" style={{ left: hover.x + 14, top: hover.y + 14 }} role="tooltip">
      <strong>{hover.title}</strong>
      {hover.lines.map((l, i) => (
        <span key={i}>{l}</span>
      ))}
    </div>
  );
}

const CONSTRAINTS: { id: GizmoConstraint; label: string; title: string }[] = [
  { id: 'free', label: 'free', title: 'all three arrows and planes' },
  { id: 'x', label: 'x', title: 'along x only (forward)' },
  { id: 'y', label: 'y', title: 'along y only (left)' },
  { id: 'z', label: 'z', title: 'along z only (up)' },
  { id: 'xy', label: 'xy', title: 'in the x-y plane (plan view)' },
  { id: 'yz', label: 'yz', title: 'in the y-z plane (front view)' },
  { id: 'xz', label: 'xz', title: 'in the x-z plane (side view)' },
];

function GizmoBar() {
  const { ui } = useWorkbenchApi();
  const selection = useUi((s) => s.selection);
  const design = useDocument((s) => s.design);
  const actions = useActions();
  const g = useUi((s) => s.gizmo);
  if (!selection) return null;
  const row = hardpointRows(design).find((r) => r.id === selection);
  if (!row) return null;
  return (
    <div className="gizmo-bar" role="toolbar" aria-label="Move the selected hardpoint" data-testid="gizmo-bar">
      <strong title={row.linked ? 'mirrored: the other side moves too' : undefined}>
        {rowName(row)}
        {row.linked ? ' ⇋' : ''}
      </strong>
      <span>move</span>
      {CONSTRAINTS.map((c) => (
        <button key={c.id} type="button" title={c.title} aria-pressed={g.constraint === c.id} className={g.constraint === c.id ? 'is-active' : ''} onClick={() => setGizmo(ui, { constraint: c.id })}>
          {c.label}
        </button>
      ))}
      <label title="snap step while dragging; arrow keys nudge 1 mm, with Shift 0.1 mm (↑↓ x, ←→ y, PgUp/PgDn z)">
        snap{' '}
        <select value={g.snapMm} onChange={(e) => setGizmo(ui, { snapMm: Number(e.target.value) })}>
          {SNAP_STEPS_MM.map((step) => (
            <option key={step} value={step}>
              {step === 0 ? 'off' : `${step} mm`}
            </option>
          ))}
        </select>
      </label>
      <button type="button" title="deselect (Esc)" onClick={() => actions.select(null)}>
        ✕
      </button>
    </div>
  );
}
