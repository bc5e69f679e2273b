/**
 * The lean linkage's constraint row (mean y of the two front tyres' lowest points = 0) and its
 * analytic Jacobian: the row's value equals the lowest points computed here from the posed
 * wheels (the torus's lowest point: centre + (R - r) (a_z a - z) / sqrt(1 - a_z^2) - r z), and
 * every Jacobian entry of every row equals a central difference of the residuals (step 1e-6 in
 * each unknown, through the tree's own step), away from a solution (at a solved pose shifted
 * off it) so no term hides behind a zero. Negative control, run by hand: the spin axis's z term's
 * sign flipped in contactYJacobian makes this row 5.5 off (relative).
 */
import { describe, expect, it } from 'vitest';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { pipitDoc } from '../mechanism/pipitDemo';

describe('mean contact y row', () => {
  const design = resolveDesign(pipitDoc());
  const solver = new PoseSolver(buildMechanism(design));
  const m = solver.mechanism;
  expect(solver.solve({ ...zeroInputs(), leanDeg: 18, handlebarDeg: 12, heaveMm: -5 }).reached).toBe(true);
  // Move off the solution: every unknown by a small, different amount.
  const off = new Float64Array(m.nVars).map((_, k) => 0.01 * Math.sin(1 + 3.7 * k));
  m.step(off);
  const row = m.graph.constraints.reduce((acc, c) => acc + (c.kind === 'coincident' ? 3 : 1), 0) - 1;

  it('is the last row and reads the posed wheels', () => {
    expect(m.graph.constraints[m.graph.constraints.length - 1].kind).toBe('meanContactY');
    const r = new Float64Array(m.nResiduals);
    m.residuals(r);
    let y = 0;
    for (const w of m.graph.wheels) {
      const c = [0, 0, 0];
      const a = [0, 0, 0];
      m.worldPoint(w.body, w.centre, c);
      m.worldDirection(w.body, w.spinAxis, a);
      const s = Math.hypot(a[0], a[1]);
      y += (c[1] + ((w.rollingRadius - w.crownRadius) * a[2] * a[1]) / s) / 2;
    }
    expect(r[row]).toBeCloseTo(y, 10);
    expect(Math.abs(y)).toBeGreaterThan(1e-3);
  });

  it('analytic Jacobian = central differences, every row, every unknown', () => {
    const n = m.nVars;
    const jac = new Float64Array(m.nResiduals * n);
    const r = new Float64Array(m.nResiduals);
    m.residuals(r);
    m.jacobian(jac);
    const rp = new Float64Array(m.nResiduals);
    const rm = new Float64Array(m.nResiduals);
    const h = 1e-6;
    let worst = 0;
    let worstRow = 0;
    for (let k = 0; k < n; k++) {
      const e = new Float64Array(n);
      m.save();
      e[k] = h;
      m.step(e);
      m.residuals(rp);
      m.restore();
      m.save();
      e[k] = -h;
      m.step(e);
      m.residuals(rm);
      m.restore();
      for (let i = 0; i < m.nResiduals; i++) {
        const fd = (rp[i] - rm[i]) / (2 * h);
        const gap = Math.abs(fd - jac[i * n + k]) / Math.max(1, Math.abs(fd));
        if (gap > worst) {
          worst = gap;
          worstRow = i;
        }
      }
    }
    expect(worst, `row ${worstRow} (${m.constraintLabelOfRow(worstRow)})`).toBeLessThan(1e-5);
    // The new row has non-zero entries (it sees the slides and both uprights' chains).
    let nonZero = 0;
    for (let k = 0; k < n; k++) if (Math.abs(jac[row * n + k]) > 1e-6) nonZero++;
    expect(nonZero).toBeGreaterThan(4);
  });
});
