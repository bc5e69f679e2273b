// The viewport draws the linkage from the drawing layout core's template emits: one tube and
// one joint ball per drawn part, at the solved positions, coloured by the checks the layout
// ties to them; and the viewport's source spells no mechanism id.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  BufferAttribute,
  BufferGeometry,
  Color,
  CylinderGeometry,
  IcosahedronGeometry,
  InstancedMesh,
  LineSegments,
  Matrix4,
  Vector3,
} from 'three';
import { markGeometries } from '../../renderer/viewport/markGeometry';
import { buildMechanism } from '../../core/mechanism/templates/buildMechanism';
import { drawingPartsFor } from '../../core/mechanism/drawingLayout';
import { resolveDesign } from '../../core/design/resolveDesign';
import { SEVERITY_STYLE } from '../../renderer/model/severity';
import { JOINT_CAPACITY, LINE_CAPACITY, TUBE_CAPACITY, updateScene, type SceneObjects } from '../../renderer/viewport/sceneUpdate';
import { PART_CLASS_COLOUR } from '../../renderer/viewport/drawingParts';
import { demoDesign, demoWorkbench } from './helpers';

function sceneObjects(): SceneObjects {
  const line = new BufferGeometry();
  line.setAttribute('position', new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3));
  line.setAttribute('color', new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3));
  return {
    tubes: new InstancedMesh(new CylinderGeometry(), undefined, TUBE_CAPACITY),
    joints: new InstancedMesh(new IcosahedronGeometry(), undefined, JOINT_CAPACITY),
    lines: new LineSegments(line),
    wheels: [],
    markGeo: markGeometries(),
  };
}

const instanceColour = (mesh: InstancedMesh, i: number) => {
  const c = new Color();
  mesh.getColorAt(i, c);
  return `#${c.getHexString()}`;
};
const instancePosition = (mesh: InstancedMesh, i: number) => {
  const m = new Matrix4();
  mesh.getMatrixAt(i, m);
  return new Vector3().setFromMatrixPosition(m);
};

describe('the linkage drawing', () => {
  for (const demo of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike']) {
    it(`draws every part of the layout at the solved pose (${demo})`, () => {
      const wb = demoWorkbench(demo);
      wb.actions.setPose({ leanDeg: 12, handlebarDeg: 6 });
      const s = wb.pose.getState();
      const layout = s.drawing!;
      const o = sceneObjects();
      updateScene({ outcome: s.outcome, selection: null, design: wb.document.getState().design }, layout, o);
      // Every tube of the layout, plus the handlebar's bar and stem.
      expect(o.tubes!.count).toBe(layout.tubes.length + 2);
      expect(o.joints!.count).toBe(layout.joints.length);
      layout.joints.forEach((j, i) => {
        if (!('point' in j.at)) return;
        const p = s.outcome.snapshot!.points[j.at.point];
        // Instance matrices are float32: about 1e-7 relative, so 1e-4 mm at a metre.
        expect(instancePosition(o.joints!, i).distanceTo(new Vector3(...p))).toBeLessThan(1e-3);
      });
      // Two steering axes at least, and the turn-centre paths.
      expect(o.lines!.geometry.drawRange.count).toBeGreaterThan(4);
    });
  }

  it('colours the parts that stand for a loop that will not close, and only those', () => {
    const wb = demoWorkbench();
    const s = { ...wb.pose.getState(), design: wb.document.getState().design };
    const layout = s.drawing!;
    const constraint = buildMechanism(resolveDesign(demoDesign())).constraints.find((c) => c.kind === 'distance')!;
    const broken = drawingPartsFor(layout, { kind: 'constraint', constraint: constraint.id });
    expect(broken.length).toBeGreaterThan(0);
    const outcome = { ...s.outcome, parts: { [`constraint.${constraint.id}`]: 'broken' as const } };
    const o = sceneObjects();
    updateScene({ outcome, selection: null, design: s.design }, layout, o);
    layout.tubes.forEach((t, i) => {
      const want = broken.includes(t.id) ? SEVERITY_STYLE.broken.colour : PART_CLASS_COLOUR[t.part];
      expect(instanceColour(o.tubes!, i), t.label).toBe(want);
    });
  });

  it('marks the selected hardpoint', () => {
    const wb = demoWorkbench();
    const s = { ...wb.pose.getState(), design: wb.document.getState().design };
    const layout = s.drawing!;
    const o = sceneObjects();
    const chosen = layout.joints[3];
    updateScene({ outcome: s.outcome, selection: chosen.hardpoint, design: s.design }, layout, o);
    const colours = layout.joints.map((_j, i) => instanceColour(o.joints!, i));
    expect(colours.filter((c) => c === colours[3])).toHaveLength(1);
  });

  it('the viewport source spells no mechanism body, point, constraint or part id', () => {
    const ids = new Set<string>();
    for (const demo of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike']) {
      const g = buildMechanism(resolveDesign(demoDesign(demo)));
      for (const x of [...g.bodies, ...g.constraints, ...g.points, ...g.drawing.tubes, ...g.drawing.joints]) ids.add(x.id);
    }
    const dir = path.join(process.cwd(), 'renderer', 'viewport');
    const found: string[] = [];
    for (const file of readdirSync(dir)) {
      const src = readFileSync(path.join(dir, file), 'utf8');
      for (const m of src.matchAll(/'([^'\n]+)'|"([^"\n]+)"|`([^`\n]+)`/g)) {
        const lit = m[1] ?? m[2] ?? m[3];
        if (ids.has(lit)) found.push(`${file}: ${lit}`);
      }
    }
    expect(found).toEqual([]);
    // Negative control: the scan finds an id when one is written.
    expect([..."const fi = bi.get('frame');".matchAll(/'([^'\n]+)'/g)].some((m) => ids.has(m[1]))).toBe(true);
  });
});
