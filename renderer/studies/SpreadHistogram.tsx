/**
 * A histogram of one spread as a small SVG: the bins core counted, the design's value, the
 * 5th/50th/95th percentiles and the tolerance (both signs for a worst |value|, a floor for a
 * least margin). Lines differ by dash as well as colour.
 */
import type { Spread } from '../../core/studies/toleranceSpread';
import { fmt } from '../model/format';

const W = 300;
const H = 120;
const PAD = { l: 8, r: 8, t: 8, b: 22 };

export function SpreadHistogram({ spread }: { spread: Spread }) {
  const s = spread.summary;
  if (!s || s.histogram.counts.length === 0) return <p className="hint">No sample was measured.</p>;
  const { edges, counts } = s.histogram;
  const marks: { x: number; label: string; cls: string }[] = [];
  if (spread.nominal !== null) marks.push({ x: spread.nominal, label: 'as drawn', cls: 'mark-nominal' });
  marks.push({ x: s.p5, label: '5 %', cls: 'mark-pct' }, { x: s.p95, label: '95 %', cls: 'mark-pct' });
  if (spread.tolerance !== null) {
    if (spread.kind === 'least') marks.push({ x: spread.tolerance, label: 'floor', cls: 'mark-limit' });
    else marks.push({ x: spread.tolerance, label: 'limit', cls: 'mark-limit' });
  }
  const xs = [edges[0], edges[edges.length - 1], ...marks.map((m) => m.x)];
  let lo = Math.min(...xs);
  let hi = Math.max(...xs);
  if (!(hi > lo)) {
    lo -= 1;
    hi += 1;
  }
  const px = (v: number) => PAD.l + ((v - lo) / (hi - lo)) * (W - PAD.l - PAD.r);
  const top = Math.max(...counts);
  const py = (c: number) => H - PAD.b - (c / top) * (H - PAD.t - PAD.b);
  return (
    <svg className="spread-histogram" viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Histogram of ${spread.label}: ${s.count} samples from ${fmt(s.min, 3)} to ${fmt(s.max, 3)} ${spread.unit}`} data-testid="spread-histogram">
      {counts.map((c, i) => (
        <rect key={i} className="bin" x={px(edges[i])} y={py(c)} width={Math.max(0.5, px(edges[i + 1]) - px(edges[i]) - 0.5)} height={H - PAD.b - py(c)}>
          <title>
            {fmt(edges[i], 3)} to {fmt(edges[i + 1], 3)} {spread.unit}: {c} samples
          </title>
        </rect>
      ))}
      <line className="axis" x1={PAD.l} x2={W - PAD.r} y1={H - PAD.b} y2={H - PAD.b} />
      {marks.map((m, i) => (
        <g key={i} className={m.cls}>
          <line x1={px(m.x)} x2={px(m.x)} y1={PAD.t} y2={H - PAD.b} />
          <text x={px(m.x)} y={H - PAD.b + 10 + (i % 2) * 9} textAnchor="middle">
            {m.label}
          </text>
        </g>
      ))}
      <text className="axis-end" x={PAD.l} y={PAD.t + 2} dominantBaseline="hanging">
        {fmt(lo, 3)}
      </text>
      <text className="axis-end" x={W - PAD.r} y={PAD.t + 2} textAnchor="end" dominantBaseline="hanging">
        {fmt(hi, 3)} {spread.unit}
      </text>
    </svg>
  );
}
