// The bundled demos are good designs by the project's own check (issue "design studies"): each
// tilting demo passes in its operating region and the upright one over its whole envelope, at
// the check's default grid; the teaching example fails, as its notes say it does. The checks'
// own correctness is tested elsewhere against outside references; this test guards the demos
// against an edit (or a change in the analysis) that quietly makes them fail.
import { describe, it, expect } from 'vitest';
import { demo } from '../analysis/helpers';
import { checkDesign } from '../../../core/analysis/designCheck';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { demo as demoFile } from '../reliability/demoDesigns';

const failing = (c: ReturnType<typeof checkDesign>['operating']) => c.items.filter((i) => i.verdict === 'over' || i.verdict === 'broken').map((i) => i.label);

describe('the bundled demos pass their own check', () => {
  it('the tilting parallelogram demo passes in its operating region', () => {
    const c = checkDesign(demo('swift-parallelogram-trike'));
    expect(failing(c.operating)).toEqual([]);
    expect(c.passed).toBe(true);
  }, 60_000);

  it('the upright rack demo passes over its whole envelope', () => {
    const c = checkDesign(demo('wren-rack-trike'), { judged: 'full' });
    expect(failing(c.full)).toEqual([]);
    expect(failing(c.operating)).toEqual([]);
  }, 60_000);

  it('the teaching example fails where its notes say: joints, slip and lean steer', () => {
    const d = demo('heron-tilting-velomobile');
    expect(d.name).toMatch(/teaching example/);
    const labels = failing(checkDesign(d).operating).join('\n');
    expect(labels).toMatch(/upper outer joint/);
    expect(labels).toMatch(/slip angle/);
    expect(d.notes).toMatch(/Fault 1/);
  }, 60_000);

  it('the upright track-rod demo passes over its whole envelope', () => {
    const c = checkDesign(resolveDesign(demoFile('linnet').design), { judged: 'full' });
    expect(failing(c.full)).toEqual([]);
    expect(failing(c.operating)).toEqual([]);
  }, 60_000);

  it('the knuckle-steered teaching example fails where its notes say: slip only, no lean steer', () => {
    const d = resolveDesign(demoFile('finch').design);
    expect(d.name).toMatch(/teaching example/);
    const labels = failing(checkDesign(d).operating);
    expect(labels.length).toBeGreaterThan(0);
    for (const l of labels) expect(l).toMatch(/slip angle/);
    expect(d.notes).toMatch(/no Ackermann/);
  }, 60_000);
});
