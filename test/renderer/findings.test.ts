// Which points a finding's fix lists, and which proposals: from core's sensitivity (central
// differences of the full solve) and core's proposals. The fix's own logic (ranking, and which
// way improves a worst |value| or a least margin) is checked against a direct measurement:
// moving the first listed point half a mm the way the fix says, the objective re-measured by a
// full solve of the moved design at the same poses must improve, by about the rate shown.
import { describe, expect, it } from 'vitest';
import { computeSensitivity, type SensitivityData } from '../../renderer/workers/sensitivityJob';
import { fixPoints, objectiveKind, objectiveOfCheckItem, objectiveOfPoseFinding, proposalsFor, regionFinding, usableObjective, worstFirst } from '../../renderer/model/findings';
import { setUpStudy } from '../../core/studies/sensitivity';
import { objectiveValue } from '../../core/studies/studyQuantities';
import { measureAtPoses } from '../../core/studies/studyPoses';
import { resolveDesign } from '../../core/design/resolveDesign';
import { offsetDesignFile, oppositeDirection, studyCoordinates } from '../../core/studies/studyCoordinates';
import type { Proposal } from '../../core/studies/geometricSuggestion';
import type { CheckItem } from '../../core/analysis/designCheck';
import type { DesignFile } from '../../core/design/types';
import { demoDesign } from './helpers';

const fake = (rows: [string, 'x' | 'y' | 'z', number | null][]): SensitivityData => ({
  design: 'test',
  objectives: [{ id: 'selfSteer', label: 'worst self-steer', unit: 'deg' }],
  rows: rows.map(([key, axis, v], i) => ({ key, axis, direction: { x: 'forward', y: 'outward', z: 'up' }[axis], perMm: { selfSteer: v }, sentence: '', rank: i + 1 })),
  poses: 1,
  failures: [],
  elapsedMs: 0,
});

describe('what a finding is about', () => {
  it("maps core's check items and pose findings to the study objectives", () => {
    expect(objectiveOfCheckItem('selfSteer.left')).toBe('selfSteer');
    expect(objectiveOfCheckItem('slip.right')).toBe('slip');
    expect(objectiveOfCheckItem('ratioChange')).toBe('ratioChange');
    expect(objectiveOfCheckItem('joint.tieRodOuter.left')).toBe('joint.tieRodOuter.left');
    expect(objectiveOfCheckItem('clearance.tyre-body.left')).toBeNull();
    expect(objectiveOfCheckItem('deadCentre')).toBeNull();
    expect(objectiveOfCheckItem('assembly')).toBeNull();
    expect(objectiveOfPoseFinding({ kind: 'wheel', side: 'left' }, 'over: left slip 1.43 deg (tolerance 1 deg)')).toBe('slip');
    expect(objectiveOfPoseFinding({ kind: 'wheel', side: 'left' }, 'over: left self-steer -0.278 deg (tolerance 0.25 deg)')).toBe('selfSteer');
    expect(objectiveOfPoseFinding({ kind: 'steering' }, 'close: steering-ratio change 12.0 % (tolerance 15 %)')).toBe('ratioChange');
    expect(objectiveOfPoseFinding({ kind: 'joint', joint: 'upperOuter', side: 'right' }, 'x')).toBe('joint.upperOuter.right');
    expect(objectiveOfPoseFinding({ kind: 'deadCentre' }, 'x')).toBeNull();
    expect(usableObjective('joint.upperOuter.right', ['jointMargin'])).toBe('jointMargin');
    expect(usableObjective('joint.upperOuter.right', ['jointMargin', 'joint.upperOuter.right'])).toBe('joint.upperOuter.right');
    expect(usableObjective('selfSteer', ['jointMargin'])).toBeNull();
    expect(objectiveKind('jointMargin')).toBe('least');
    expect(objectiveKind('slip')).toBe('worst');
  });

  it('puts the worst first, the pose before the region within a severity, and leaves items within their limit out', () => {
    const list = worstFirst([
      { id: 'a', severity: 'close' as const, source: 'pose' as const },
      { id: 'b', severity: 'over' as const, source: 'region' as const },
      { id: 'c', severity: 'over' as const, source: 'pose' as const },
      { id: 'd', severity: 'broken' as const, source: 'region' as const },
    ]);
    expect(list.map((f) => f.id)).toEqual(['d', 'c', 'b', 'a']);
    const item = { id: 'slip.left', verdict: 'within', label: 'slip', where: null, firstOver: null } as unknown as CheckItem;
    expect(regionFinding(item, null)).toBeNull();
    const over = { ...item, verdict: 'over', where: { leanDeg: 1, handlebarDeg: 2, travelMm: 0 }, firstOver: { leanDeg: 3, handlebarDeg: 4, travelMm: 0 } } as CheckItem;
    expect(regionFinding(over, 'x.right')).toMatchObject({ id: 'region:slip.left', objective: 'slip', hardpoint: 'x.right', where: { leanDeg: 3 } });
  });
});

describe("a finding's fix", () => {
  it('lists points by their largest rate, with the way that improves a worst value and a least margin', () => {
    const data = fake([
      ['a', 'x', 0.01], ['a', 'y', -0.2], ['a', 'z', 0.05],
      ['b', 'x', 0.5], ['b', 'y', null], ['b', 'z', 0],
      ['c', 'x', 0], ['c', 'y', 0], ['c', 'z', 0],
      ['d', 'x', null], ['d', 'y', null], ['d', 'z', null],
    ]);
    const pts = fixPoints(data, 'selfSteer');
    expect(pts.map((p) => p.key)).toEqual(['b', 'a']);
    expect(pts[1].best).toMatchObject({ axis: 'y', perMm: -0.2, improveSign: 1 }); // a worst |value| with a negative rate falls moving along +y
    expect(pts[0].best).toMatchObject({ axis: 'x', improveSign: -1 });
    expect(fixPoints(data, 'selfSteer', 1)).toHaveLength(1);
    const margin = { ...data, rows: data.rows.map((r) => ({ ...r, perMm: { jointMargin: r.perMm.selfSteer } })) };
    expect(fixPoints(margin, 'jointMargin')[0].best.improveSign).toBe(1); // a margin grows moving with a positive rate
  });

  it('on the Heron: moving the first point half a mm the way the fix says changes the objective as its rate says (re-measured by a full solve)', () => {
    const design = demoDesign('heron-tilting-velomobile');
    const data = computeSensitivity({ design });
    const setup = setUpStudy(design, undefined);
    // Each design measured afresh at the nominal's poses by core's study measurement (a full solve per pose).
    const measure = (file: DesignFile, objective: string) => {
      const o = setup.objectives.find((x) => x.id === objective)!;
      const values = measureAtPoses(resolveDesign(file), setup.poses, setup.quantities).values;
      return objectiveValue(o, values, setup.poses.length, setup.quantities.length);
    };
    const coords = studyCoordinates(design);
    for (const objective of ['selfSteer', 'slip', 'jointMargin']) {
      const [top] = fixPoints(data, objective, 1);
      expect(top).toBeDefined();
      // Half a mm the way the fix says (the sensitivity's own step is 0.5 mm), the pair moving together as in the rates.
      const i = coords.findIndex((c) => c.key === top.key && c.axis === top.best.axis);
      const offsets = coords.map((_, k) => (k === i ? 0.5 * top.best.improveSign : 0));
      const before = measure(design, objective);
      const after = measure(offsetDesignFile(design, coords, offsets), objective);
      const better = objectiveKind(objective) === 'worst' ? before - after : after - before;
      const way = top.best.improveSign > 0 ? top.best.direction : oppositeDirection(top.best.direction);
      expect(better, `${objective}: ${top.key} ${way}`).toBeGreaterThan(0);
      // Within a fifth of the linear prediction (a worst value may switch pose within half a mm).
      // Negative control: the other way makes it worse.
      const back = measure(offsetDesignFile(design, coords, offsets.map((x) => -x)), objective);
      expect(objectiveKind(objective) === 'worst' ? before - back : back - before).toBeLessThan(0);
      expect(Math.abs(better - 0.5 * top.strongest), `${objective}: ${before} -> ${after}, rate ${top.strongest}`).toBeLessThan(0.2 * 0.5 * top.strongest);
    }
  }, 60_000);

  it('lists the proposals that change the objective, improving ones first', () => {
    const p = (id: string, before: number, after: number | null): Proposal =>
      ({ id, title: id, rule: '', moves: [], design: {} as DesignFile, effect: [{ id: 'slip', label: 'slip', unit: 'deg', tolerance: 1, kind: 'worst', before, after }] }) as unknown as Proposal;
    const none = { ...p('n', 1, 1), design: null } as Proposal;
    const list = proposalsFor([p('worse', 1, 2), p('better', 1, 0.5), p('broken', 1, null), none], 'slip');
    expect(list.map((x) => [x.proposal.id, x.improves])).toEqual([['better', true], ['worse', false], ['broken', false]]);
    expect(proposalsFor([p('better', 1, 0.5)], 'selfSteer')).toEqual([]);
  });
});
