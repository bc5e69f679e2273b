/**
 * The report's drawings of the front end: each hardpoint drawn where the view's projection puts
 * it, checked by hand from the design file (the Wren writes its right-side points once; the
 * left side is the mirror in y). Projections, ISO 8855 axes (x forward, y left, z up), SVG y down:
 * front elevation (seen from ahead) u = y, v = z; side elevation (seen from the left) u = -x,
 * v = z; plan view (from above, forward up) u = -y, v = x; drawn at cx = u, cy = -v (mm).
 */
import { readFileSync } from 'node:fs';
import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { parseDesignText } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile } from '../../../core/design/types';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { drawView, VIEWS, type DrawingFigures, type KeyedPoint, type ViewId } from '../../../core/report/drawings';
import { hardpointTable } from '../../../core/design/hardpointCsv';
import { WREN } from '../../cli/cliHarness';

const text = readFileSync(WREN, 'utf8');
const raw = JSON.parse(text);

function load(file: DesignFile) {
  const design = resolveDesign(file);
  const graph = buildMechanism(design, { contact: 'travel', steerBy: 'handlebar' });
  const points: KeyedPoint[] = hardpointTable(file).map((h, i) => ({ id: h.id, key: i + 1, label: h.id, side: h.side, at: [h.at.x, h.at.y, h.at.z] }));
  // Figures as the report takes them from the design pose (any plausible numbers do here; the
  // dimension test below uses the pose's own).
  const figures: DrawingFigures = {
    contactLeft: [0, 376.3, 0],
    contactRight: [0, -376.3, 0],
    axisGroundLeft: [28.1, 367.2, 0],
    kpiDeg: 9.02,
    casterDeg: 7.37,
    trailMm: 28.2,
    scrubRadiusMm: 9.0,
    wheelbaseMm: design.vehicle.wheelbaseMm,
  };
  return { graph, points, figures };
}

function svgOf(view: ViewId, file: DesignFile): Document {
  const { graph, points, figures } = load(file);
  const spec = VIEWS.find((v) => v.id === view)!;
  return new JSDOM(drawView(spec, graph, points, figures), { contentType: 'image/svg+xml' }).window.document;
}

function dot(doc: Document, id: string): { cx: number; cy: number } {
  const c = doc.querySelector(`g.hardpoint[data-id="${id}"] circle`);
  expect(c, id).not.toBeNull();
  return { cx: Number(c!.getAttribute('cx')), cy: Number(c!.getAttribute('cy')) };
}

const parsed = parseDesignText(text, WREN);
if (!parsed.ok) throw new Error('the Wren demo must load');
const wren = parsed.design;

// By hand from the file: upright.wheelCentre is written for the right side as (0, -380, 230);
// the left one is its mirror (0, 380, 230). steering.tieRodJoint right: (-94.4, -125.1, 197.1).
const wc = raw.upright.wheelCentre;
const tr = raw.steering.tieRodJoint;

describe('the front-end drawings', () => {
  it('front elevation: the left wheel centre at (y, -z), the right tie-rod joint at (y, -z)', () => {
    expect(wc).toEqual({ x: 0, y: -380, z: 230 });
    const doc = svgOf('front', wren);
    expect(dot(doc, 'upright.wheelCentre.left')).toEqual({ cx: 380, cy: -230 });
    expect(dot(doc, 'steering.tieRodJoint.right')).toEqual({ cx: tr.y, cy: -tr.z });
    expect(dot(doc, 'steering.tieRodJoint.right')).toEqual({ cx: -125.1, cy: -197.1 });
  });

  it('side elevation: (-x, -z); plan view: (-y, -x)', () => {
    const side = svgOf('side', wren);
    expect(dot(side, 'upright.wheelCentre.left')).toEqual({ cx: 0, cy: -230 });
    expect(dot(side, 'steering.tieRodJoint.right')).toEqual({ cx: 94.4, cy: -197.1 });
    const plan = svgOf('plan', wren);
    expect(dot(plan, 'upright.wheelCentre.left')).toEqual({ cx: -380, cy: 0 });
    expect(dot(plan, 'steering.tieRodJoint.right')).toEqual({ cx: 125.1, cy: 94.4 });
  });

  it('every hardpoint is drawn in every view, numbered, and the key points carry their coordinates', () => {
    const n = hardpointTable(wren).length;
    for (const v of VIEWS) {
      const doc = svgOf(v.id, wren);
      expect(doc.querySelectorAll('g.hardpoint').length, v.id).toBe(n);
      // Each visible point has its number written within two font sizes of it.
      const keys = [...doc.querySelectorAll('text.key')].map((t) => ({ x: Number(t.getAttribute('x')), y: Number(t.getAttribute('y')), keys: t.textContent!.split(', ').map(Number), size: Number(t.getAttribute('font-size')) }));
      const { cx, cy } = dot(doc, 'upright.wheelCentre.left');
      const key = Number(doc.querySelector('g.hardpoint[data-id="upright.wheelCentre.left"]')!.getAttribute('data-key'));
      expect(keys.some((k) => k.keys.includes(key) && Math.hypot(k.x - cx, k.y - cy) < 2.5 * k.size), `${v.id}: number ${key} beside the wheel centre`).toBe(true);
    }
    const front = svgOf('front', wren);
    expect(front.querySelector('text.coords[data-id="upright.wheelCentre.left"]')?.textContent).toBe('(0, 380, 230)');
    expect(front.querySelector('text.coords[data-id="frontEnd.lower.outerJoint.left"]')?.textContent).toBe('(10, 345, 140)');
  });

  it('negative control: a hardpoint moved in the file moves its dot', () => {
    const moved = structuredClone(wren) as DesignFile & { upright: { wheelCentre: { x: number; y: number; z: number } } };
    moved.upright.wheelCentre = { x: 5, y: -380, z: 240 };
    expect(dot(svgOf('front', moved), 'upright.wheelCentre.left')).toEqual({ cx: 380, cy: -240 });
    expect(dot(svgOf('side', moved), 'upright.wheelCentre.left')).toEqual({ cx: -5, cy: -240 });
  });

  it('dimensions print the figures given (the report passes the design pose; test/cli/report.test.ts checks them against pose --json) and the wheelbase from the design', () => {
    const front = svgOf('front', wren);
    expect(front.querySelector('[data-dim="track"] text')?.textContent).toBe('track 752.6 mm (contact patch centres)');
    const plan = svgOf('plan', wren);
    expect(plan.querySelector('[data-dim="wheelbase"]')?.textContent).toContain(`wheelbase ${raw.vehicle.wheelbaseMm.toFixed(1)} mm`);
    expect(front.querySelector('[data-dim="kpi"]')?.textContent).toContain('KPI 9.02');
  });
});
