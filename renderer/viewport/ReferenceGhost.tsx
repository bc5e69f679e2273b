/**
 * The reference design (the design before an applied tune or proposal, a pinned copy, another
 * file) as a ghost in the viewport: solved at the same pose as the design on screen (in ride
 * mode, at the lean the design on screen rides at) and drawn as thin dashed grey lines, so a
 * change shows as two outlines side by side. Solved again whenever the pose is.
 */
import { useLayoutEffect, useMemo, useRef } from 'react';
import { useThree } from '@react-three/fiber';
import { BufferAttribute, BufferGeometry, DynamicDrawUsage, type LineSegments } from 'three';
import { resolveDesign } from '../../core/design/resolveDesign';
import { useStudies, useWorkbenchApi } from '../app/workbenchContext';
import { PoseSession } from '../model/analysisAdapter';
import { ghostSegments } from './ghostSegments';

const CAPACITY = 600;
export const GHOST_COLOUR = '#7d8790';

export function ReferenceGhost() {
  const wb = useWorkbenchApi();
  const reference = useStudies((s) => s.reference);
  const invalidate = useThree((s) => s.invalidate);
  const lines = useRef<LineSegments>(null);
  const geometry = useMemo(() => {
    const g = new BufferGeometry();
    const pos = new BufferAttribute(new Float32Array(CAPACITY * 6), 3);
    pos.setUsage(DynamicDrawUsage);
    g.setAttribute('position', pos);
    g.setDrawRange(0, 0);
    return g;
  }, []);

  useLayoutEffect(() => {
    const obj = lines.current;
    if (!obj) return;
    if (!reference) {
      obj.visible = false;
      invalidate();
      return;
    }
    let session: PoseSession | null = null;
    let resolved: ReturnType<typeof resolveDesign> | null = null;
    try {
      resolved = resolveDesign(reference.design);
    } catch {
      resolved = null;
    }
    const apply = () => {
      const { pose, outcome } = wb.pose.getState();
      if (!resolved) return;
      if (!session || session.contact !== pose.contact) session = new PoseSession(resolved, pose.contact);
      const asked = outcome.ride ? { ...pose, leanDeg: outcome.ride.leanDeg } : pose;
      const o = session.solve(asked, false);
      const layout = session.engine.graph.drawing;
      const pos = geometry.getAttribute('position') as BufferAttribute;
      const n = o.snapshot && layout ? ghostSegments(layout, o.snapshot, resolved.wheels.front.rollingRadiusMm, pos.array as Float32Array) : 0;
      pos.needsUpdate = true;
      geometry.setDrawRange(0, 2 * n);
      geometry.computeBoundingSphere();
      obj.computeLineDistances();
      obj.visible = n > 0;
      invalidate();
    };
    apply();
    return wb.pose.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome) apply();
    });
  }, [reference, wb, geometry, invalidate]);

  return (
    <lineSegments ref={lines} geometry={geometry} frustumCulled={false} renderOrder={-1} visible={false}>
      <lineDashedMaterial color={GHOST_COLOUR} dashSize={14} gapSize={8} transparent opacity={0.85} depthWrite={false} />
    </lineSegments>
  );
}
