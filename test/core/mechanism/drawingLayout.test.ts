// The drawing a layout template emits with its graph: every point, body and constraint it
// names exists in the graph, every hardpoint it draws sits where the design puts it, and every
// check core's analysis makes has parts to colour. Structural checks against the graph and
// the design themselves (no outside numbers involved), each with a negative control.
import { describe, expect, it } from 'vitest';
import { buildMechanism, type PoseMode } from '../../../core/mechanism/templates/buildMechanism';
import { checksShownBy, drawingPartsFor, drawingProblems, type DrawingPointRef } from '../../../core/mechanism/drawingLayout';
import type { MechanismGraph, Vec3 } from '../../../core/mechanism/MechanismGraph';
import type { ResolvedDesign, Side } from '../../../core/design/types';
import { clearancePairs } from '../../../core/analysis/clearance';
import { layoutVariants } from './layoutVariants';

const MODES: PoseMode[] = [
  { contact: 'ground', steerBy: 'handlebar' },
  { contact: 'travel', steerBy: 'handlebar' },
  { contact: 'ground', steerBy: 'leftWheel' },
  { contact: 'travel', steerBy: 'rightWheel' },
];
const SIDES: Side[] = ['left', 'right'];
const JOINTS = ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const;
const variants = layoutVariants();

/** A point's position at design: a named point's design coordinates, or the fixed design point. */
function designPosition(graph: MechanismGraph, ref: DrawingPointRef): Vec3 {
  if ('point' in ref) return graph.points.find((p) => p.id === ref.point)!.design;
  return ref.design;
}

/** The value at a dotted path of the resolved design (`steering.tieRodJoint.left`). */
function atPath(design: ResolvedDesign, path: string): { x: number; y: number; z: number } {
  return path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], design) as { x: number; y: number; z: number };
}

function renamedPoint(graph: MechanismGraph, from: string, to: string): MechanismGraph {
  return { ...graph, points: graph.points.map((p) => (p.id === from ? { ...p, id: to } : p)) };
}

describe('the drawing layout of every template variant', () => {
  it('covers each front-end kind and each steering kind', () => {
    const sub = (s: ResolvedDesign['steering']) => (s.kind === 'bellCrank' ? s.input.kind : s.kind === 'trackRod' ? s.drive.kind : '');
    const kinds = new Set(variants.map((v) => `${v.design.frontEnd.kind}/${v.design.steering.kind}/${sub(v.design.steering)}`));
    expect(kinds.size).toBe(16);
  });

  for (const mode of MODES) {
    it(`refers only to what the graph has (${mode.contact} contact, steered by ${mode.steerBy})`, () => {
      for (const v of variants) {
        const graph = buildMechanism(v.design, mode);
        expect(drawingProblems(graph), v.name).toEqual([]);
        // Every loop-closing constraint has a part to show that it will not close.
        for (const c of graph.constraints) expect(drawingPartsFor(graph.drawing, { kind: 'constraint', constraint: c.id }).length, `${v.name}: ${c.id}`).toBeGreaterThan(0);
      }
    });
  }

  it('draws every named point of the graph as a joint, where the design puts its hardpoint', () => {
    for (const v of variants) {
      const graph = buildMechanism(v.design);
      const drawn = new Set(graph.drawing.joints.flatMap((j) => ('point' in j.at ? [j.at.point] : [])));
      for (const p of graph.points) expect(drawn.has(p.id), `${v.name}: ${p.id}`).toBe(true);
      for (const j of graph.drawing.joints) {
        const want = atPath(v.design, j.hardpoint);
        expect(designPosition(graph, j.at), `${v.name}: ${j.id}`).toEqual([want.x, want.y, want.z]);
      }
    }
  });

  it("has parts for every joint check and for every clearance part core's analysis models", () => {
    for (const v of variants) {
      const { drawing } = buildMechanism(v.design);
      for (const side of SIDES) {
        for (const joint of JOINTS) {
          const parts = drawingPartsFor(drawing, { kind: 'joint', joint, side });
          expect(parts, `${v.name}: ${joint} ${side}`).toHaveLength(1);
          expect(checksShownBy(drawing, parts[0])).toContainEqual({ kind: 'joint', joint, side });
        }
        expect(drawingPartsFor(drawing, { kind: 'transmission', link: 'steeringArm', side })).toHaveLength(1);
      }
      for (const pair of clearancePairs(v.design)) {
        for (const part of [pair.a, pair.b]) {
          expect(drawingPartsFor(drawing, { kind: 'clearance', part, side: pair.side }).length, `${v.name}: ${part} ${pair.side}`).toBeGreaterThan(0);
        }
      }
    }
  });

  it('gives tubes and joints labels in words', () => {
    const { drawing } = buildMechanism(variants[0].design);
    const labels = [...drawing.tubes, ...drawing.joints].map((p) => p.label);
    expect(labels).toContain('left tie rod');
    expect(labels).toContain('upper outer joint, left');
    for (const l of labels) expect(l).toMatch(/^[a-z][a-z ,]+$/);
    // and so do the track-rod layouts' own parts, every drive
    for (const v of variants.filter((x) => x.design.steering.kind === 'trackRod')) {
      const d = buildMechanism(v.design).drawing;
      for (const p of [...d.tubes, ...d.joints]) expect(p.label, v.name).toMatch(/^[a-z][a-z ,]+$/);
    }
  });
});

describe('negative controls: a broken reference is reported', () => {
  const graph = buildMechanism(variants[0].design);

  it('a renamed point', () => {
    const problems = drawingProblems(renamedPoint(graph, 'steering.tieRodJoint.left', 'steering.innerJoint.left'));
    expect(problems.some((p) => p.includes('"steering.tieRodJoint.left"'))).toBe(true);
  });

  it('a renamed body', () => {
    const bodies = graph.bodies.map((b) => (b.id === 'frame' ? { ...b, id: 'chassis' } : b));
    expect(drawingProblems({ ...graph, bodies }).some((p) => p.includes('body "frame"'))).toBe(true);
  });

  it('a constraint that is gone', () => {
    const constraints = graph.constraints.filter((c) => c.id !== 'left.tieRod');
    expect(drawingProblems({ ...graph, constraints }).some((p) => p.includes('left.tieRod'))).toBe(true);
  });

  it('a joint said to ride on the wrong body', () => {
    const joints = graph.drawing.joints.map((j, i) => (i === 0 ? { ...j, body: 'frame' } : j));
    expect(drawingProblems({ ...graph, drawing: { ...graph.drawing, joints } })).toHaveLength(1);
  });

  it('an unknown check has no parts', () => {
    expect(drawingPartsFor(graph.drawing, { kind: 'constraint', constraint: 'no.such.loop' })).toEqual([]);
  });
});
