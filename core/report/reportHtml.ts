/**
 * The workshop report as one self-contained HTML document (inline CSS and SVG, no script, no
 * outside resources), printable to PDF: one `<section class="sheet">` per printed page.
 * Every number comes from ReportData (core's analyses); cells carry the exact value they show
 * rounded in `data-value`, so a reader (or a test) can check them against the analysis.
 */
import { ANALYSIS_DEFINITIONS } from '../analysis/definitions';
import type { CheckItem } from '../analysis/designCheck';
import type { WheelAlignment } from '../analysis/analysisTypes';
import { JOINT_WORDS } from '../analysis/words';
import { SAFETY_CAUTION } from './caution';
import { SEVERITY_STYLE } from './severity';
import { CURVE_CHARTS } from './charts/curveOptions';
import { renderPlots } from './plots';
import { drawView, VIEWS } from './drawings';
import { escapeHtml, fixed, htmlTable, mm1, num, td } from './html';
import type { LeanLinkageRow, RearPairRow, ReportData } from './gatherReport';

/** The sign conventions printed on the first sheet: core's own definitions, in this order. */
const CONVENTIONS: (keyof typeof ANALYSIS_DEFINITIONS)[] = ['axes', 'lean', 'handlebar', 'steer', 'toe', 'camber', 'caster', 'kpi', 'trail', 'scrubRadius', 'travel', 'selfSteer', 'ratioChange', 'ackermann', 'turningCircle', 'verdict'];

const CONVENTION_WORDS: Partial<Record<keyof typeof ANALYSIS_DEFINITIONS, string>> = { kpi: 'KPI', scrubRadius: 'scrub radius', selfSteer: 'self-steer', ratioChange: 'ratio change', turningCircle: 'turning circle' };


const CSS = `
@page { size: A4; margin: 11mm 12mm; }
* { box-sizing: border-box; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; font-size: 9pt; color: #1d2529; margin: 0; background: #e9ece6; }
.sheet { background: #fff; width: 186mm; min-height: 10mm; margin: 8mm auto; padding: 0; break-after: page; page-break-after: always; }
.sheet:last-of-type { break-after: auto; page-break-after: auto; }
@media screen { .sheet { padding: 8mm; width: 202mm; box-shadow: 0 1px 4px rgba(0,0,0,.2); } }
@media print { body { background: #fff; } .sheet { margin: 0; } }
h1 { font-size: 16pt; margin: 0 0 2mm; }
h2 { font-size: 12pt; margin: 0 0 2mm; border-bottom: 0.4mm solid #1d2529; padding-bottom: 1mm; }
h3 { font-size: 10pt; margin: 3mm 0 1.5mm; }
p { margin: 1mm 0; }
.meta td { padding: 0.4mm 2mm 0.4mm 0; vertical-align: top; }
.meta td:first-child { color: #4f5b62; white-space: nowrap; }
.hash { font-family: "DejaVu Sans Mono", monospace; font-size: 8pt; word-break: break-all; }
.caution { border: 0.6mm solid #d8453b; padding: 2mm 3mm; margin: 3mm 0; font-weight: bold; }
table { border-collapse: collapse; width: 100%; }
table.grid th, table.grid td { border-bottom: 0.2mm solid #c9cdc6; padding: 0.5mm 1.2mm; text-align: left; font-size: 8pt; }
table.grid th { background: #f0f2ee; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
.verdict { white-space: nowrap; font-weight: bold; }
.conventions dt { font-weight: bold; float: left; clear: left; width: 27mm; font-size: 8pt; }
.conventions dd { margin: 0 0 0.8mm 28mm; font-size: 8pt; }
.notes { white-space: pre-wrap; font-size: 8.5pt; }
.charts { display: grid; grid-template-columns: 1fr 1fr; gap: 2mm 3mm; }
.chart svg { width: 100%; height: auto; display: block; }
.chart p { font-size: 7.5pt; color: #4f5b62; margin: 0; }
.map svg { width: 100%; height: auto; display: block; }
.drawing-box { margin-bottom: 2mm; }
.drawing-box svg { width: 100%; height: 72mm; display: block; border: 0.2mm solid #c9cdc6; }
.drawing-box p { font-size: 7.5pt; color: #4f5b62; margin: 0.5mm 0 0; }
.small { font-size: 7.5pt; color: #4f5b62; }
.pass { color: #1f9e89; } .fail { color: #d8453b; }
table.limits { table-layout: fixed; }
table.limits th, table.limits td { overflow-wrap: anywhere; font-size: 6.5pt; padding: 0.25mm 0.8mm; line-height: 1.2; }
`;

/** A file-format identifier in words: 'bellCrank' -> 'bell crank'. */
const words = (id: string) => id.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();

function verdictCell(v: keyof typeof SEVERITY_STYLE): string {
  const s = SEVERITY_STYLE[v];
  return `<td class="verdict" data-verdict="${v}" style="color:${s.colour}">${escapeHtml(`${s.glyph} ${s.word}`)}</td>`;
}

function sheet(id: string, title: string, body: string): string {
  return `<section class="sheet" id="${id}"><h2>${escapeHtml(title)}</h2>${body}</section>`;
}

function worstDigits(it: CheckItem): number {
  return it.unit === 'poses' ? 0 : it.unit === 'mm' ? 1 : 2;
}

function whereText(it: CheckItem): string {
  const f1 = (x: number) => fixed(x, 1);
  return it.where ? `${f1(it.where.leanDeg)}, ${f1(it.where.handlebarDeg)}, ${f1(it.where.travelMm)}` : '\u2013';
}

function coverSheet(r: ReportData): string {
  const s = r.source;
  const judged = r.check.judged === 'operating' ? r.check.operating : r.check.full;
  const fails = judged.items.filter((i) => i.verdict === 'over' || i.verdict === 'broken').length;
  const meta = [
    ['design', escapeHtml(s.name)],
    ['file', escapeHtml(s.fileName)],
    ['SHA-256 of the file', `<span class="hash" id="sha256">${escapeHtml(s.sha256)}</span>`],
    ['made', `<span id="made-at">${escapeHtml(s.madeAt)}</span>`],
    ['units', 'millimetres and degrees throughout (turning circles in metres)'],
    ['vehicle', escapeHtml(`${r.design.vehicle.tilting ? 'tilting' : 'not tilting'}, wheelbase ${mm1(r.design.vehicle.wheelbaseMm)} mm, front end ${words(r.design.frontEnd.kind)}, steering ${words(r.design.steering.kind)}`)],
    [
      'check',
      `<span class="${r.check.passed ? 'pass' : 'fail'}" id="check-result">${r.check.passed ? 'PASS' : 'FAIL'}</span> ` +
        escapeHtml(`(${r.check.judged === 'operating' ? 'operating region' : 'full rectangle'}: ${judged.items.length} items, ${fails} over the limit or broken)`),
    ],
  ];
  const conventions = CONVENTIONS.map((k) => `<dt>${escapeHtml(CONVENTION_WORDS[k] ?? k)}</dt><dd>${escapeHtml(ANALYSIS_DEFINITIONS[k])}</dd>`).join('');
  return (
    `<section class="sheet" id="cover"><h1>Workshop report: ${escapeHtml(s.name)}</h1>` +
    `<table class="meta">${meta.map(([k, v]) => `<tr><td>${k}</td><td>${v}</td></tr>`).join('')}</table>` +
    `<p class="caution" id="caution" role="note">${escapeHtml(SAFETY_CAUTION)}</p>` +
    `<h3>Axes and sign conventions</h3><dl class="conventions">${conventions}</dl>` +
    `<h3>Notes</h3><p class="notes" id="notes">${s.notes ? escapeHtml(s.notes) : '<span class="small">(the design has no notes)</span>'}</p>` +
    `</section>`
  );
}

const WHEEL_ROWS: { field: keyof WheelAlignment; label: string; unit: string; digits: number }[] = [
  { field: 'steerDeg', label: 'road-wheel angle', unit: 'deg', digits: 2 },
  { field: 'toeDeg', label: 'toe (in +)', unit: 'deg', digits: 2 },
  { field: 'camberDeg', label: 'camber to the ground (top out +)', unit: 'deg', digits: 2 },
  { field: 'camberToFrameDeg', label: 'camber to the frame', unit: 'deg', digits: 2 },
  { field: 'casterDeg', label: 'caster (top rearward +)', unit: 'deg', digits: 2 },
  { field: 'kpiDeg', label: 'KPI (top inward +)', unit: 'deg', digits: 2 },
  { field: 'trailMm', label: 'trail', unit: 'mm', digits: 1 },
  { field: 'scrubRadiusMm', label: 'scrub radius (inboard +)', unit: 'mm', digits: 1 },
  { field: 'casterOffsetMm', label: 'caster offset at wheel centre', unit: 'mm', digits: 1 },
  { field: 'kingpinOffsetAtCentreMm', label: 'kingpin offset at wheel centre', unit: 'mm', digits: 1 },
  { field: 'spindleLengthMm', label: 'spindle length (centre to axis)', unit: 'mm', digits: 1 },
  { field: 'travelMm', label: 'wheel-centre travel (bump +)', unit: 'mm', digits: 1 },
];

function hardpointSheet(r: ReportData): string {
  const rows = r.hardpoints.map((h) => [
    `<td class="num">${h.key}</td>`,
    td(`${h.group ? h.group + ': ' : ''}${h.label}`),
    `<td data-field="point">${escapeHtml(h.point)}</td>`,
    `<td data-field="side">${h.side}</td>`,
    ...(['x', 'y', 'z'] as const).map((k) => `<td class="num" data-field="${k}" data-value="${String(h.at[k])}">${escapeHtml(String(h.at[k]))}</td>`),
  ]);
  const hp = htmlTable(['#', 'hardpoint', 'field in the file', 'side', 'x mm', 'y mm', 'z mm'], rows, 'grid hardpoints').replace('<table', '<table id="hardpoints"');
  const a = r.designPose.analysis;
  let alignment: string;
  if (!a) {
    alignment = `<p class="fail">The design pose could not be solved (${escapeHtml(r.designPose.message)}): no alignment figures.</p>`;
  } else {
    const rowsA = WHEEL_ROWS.map((w) => [
      td(w.label),
      num(a.wheels.left[w.field] as number | null, w.digits, `left.${w.field}`),
      num(a.wheels.right[w.field] as number | null, w.digits, `right.${w.field}`),
      td(w.unit),
    ]);
    const st = a.steering;
    rowsA.push(
      [td('local steering ratio (handlebar per road wheel)'), num(st.localRatio, 2, 'steering.localRatio'), td(''), td(':1')],
      [td('steering-arm transmission angle'), num(st.steeringArmTransmissionDeg?.left ?? null, 1, 'steering.steeringArmTransmissionDeg.left'), num(st.steeringArmTransmissionDeg?.right ?? null, 1, 'steering.steeringArmTransmissionDeg.right'), td('deg')],
    );
    alignment = htmlTable(['at design (lean 0, handlebar 0, tyres on the ground)', 'left', 'right', 'unit'], rowsA, 'grid alignment').replace('<table', '<table id="alignment"');
    const jointRows = a.joints
      .filter((j) => j.side === 'left')
      .map((j) => {
        const right = a.joints.find((k) => k.joint === j.joint && k.side === 'right');
        return [td(`${JOINT_WORDS[j.joint] ?? j.joint} (${words(j.kind)})`), num(j.articulationDeg, 2, `joint.${j.joint}.left`), num(right?.articulationDeg ?? null, 2, `joint.${j.joint}.right`), num(j.ratedDeg, 1)];
      });
    alignment += `<h3>Joint articulation at design</h3>` + htmlTable(['joint', 'left deg', 'right deg', 'rated deg'], jointRows, 'grid joints-at-design');
  }
  return sheet('hardpoints-sheet', 'Hardpoints and alignment at design', `${hp}<p class="small">Design file values (ISO 8855 axes, mm). The numbers # key the drawings.</p><h3>Alignment at design position</h3>${alignment}`);
}

function drawingSheet(r: ReportData): string {
  if (!r.figures) return sheet('drawings', 'Drawings of the front end at design position', `<p>The design pose could not be solved; no drawings.</p>`);
  const boxes = VIEWS.map(
    (v) => `<div class="drawing-box">${drawView(v, r.graph, r.drawingPoints, r.figures!)}<p><b>${escapeHtml(v.title)}</b>, ${escapeHtml(v.seen)}. Dots numbered as the hardpoint table; dashed: steering axes to the ground${v.id === 'side' ? ', the far (right) side' : ''}.</p></div>`,
  );
  return sheet('drawings', 'Drawings of the front end at design position', boxes.join(''));
}

function chartBox(id: string, svg: string, caption: string): string {
  return `<div class="chart" data-chart="${id}">${svg}${caption ? `<p>${escapeHtml(caption)}</p>` : ''}</div>`;
}

function curveSheets(r: ReportData): string[] {
  // The standalone plots' renderings (tiltbench report --plots), at a size for half a sheet.
  const plots = renderPlots(r.curves, r.map, { curve: [560, 300], map: [720, 400] });
  const charts = CURVE_CHARTS.map((c, k) => chartBox(c.id, plots[k].svg, ''));
  const note = `<p class="small">Curves from core's sweeps (the workbench's charts), marker at design position. Missing curves say why.</p>`;
  const mapSvg = plots[plots.length - 1].svg;
  const m = r.map;
  const mapWords =
    `Envelope map: core's verdict on every pose of lean ${fixed(m.lean[0], 0)}..${fixed(m.lean[m.lean.length - 1], 0)} deg x handlebar ${fixed(m.handlebar[0], 0)}..${fixed(m.handlebar[m.handlebar.length - 1], 0)} deg ` +
    `(${m.cells.length} poses, tyres on the ground), outlined: the operating region (balanced turns at ${m.riding.minKmh}..${m.riding.maxKmh} km/h, lean limit ${m.riding.maxLeanDeg} deg).`;
  return [
    sheet('curves-1', 'Curves (1 of 2)', `${note}<div class="charts">${charts.slice(0, 6).join('')}</div>`),
    sheet('curves-2', 'Curves (2 of 2) and the envelope map', `<div class="charts">${charts.slice(6).join('')}</div><div class="map" data-chart="map">${mapSvg}<p class="small">${escapeHtml(mapWords)}</p></div>`),
  ];
}

function limitsSheet(r: ReportData): string {
  const c = r.check;
  const judged = c.judged === 'operating' ? c.operating : c.full;
  const other = c.judged === 'operating' ? c.full : c.operating;
  const rows = judged.items.map((it) => {
    const o = other.items.find((x) => x.id === it.id);
    return [
      td(it.label),
      num(it.worst, worstDigits(it), 'worst') + td(it.unit === 'poses' ? '' : it.unit),
      td(whereText(it), 'data-field="where"'),
      td(it.firstOver ? whereText({ ...it, where: it.firstOver }) : '', 'data-field="firstOver"'),
      td(it.limit, 'data-field="limit"'),
      verdictCell(it.verdict),
      o ? num(o.worst, worstDigits(o), 'fullWorst') + verdictCell(o.verdict) : td('') + td(''),
    ];
  });
  const body = judged.items
    .map((it, k) => `<tr data-id="${escapeHtml(it.id)}">${rows[k].join('')}</tr>`)
    .join('');
  const region = c.judged === 'operating' ? 'operating region' : 'full rectangle';
  const otherName = c.judged === 'operating' ? 'full rectangle' : 'operating region';
  const table =
    `<table class="grid limits" id="limits"><colgroup>${[48, 11, 6, 24, 22, 33, 14, 13, 15].map((w) => `<col style="width:${w}mm">`).join('')}</colgroup><thead><tr><th>item</th><th>worst</th><th></th><th>where (lean, handlebar, ${escapeHtml(c.travelAxis.name)})</th><th>first over at</th><th>allowed</th><th>${escapeHtml(region)} (judged)</th><th>${escapeHtml(otherName === 'full rectangle' ? 'full grid' : otherName)} worst</th><th></th></tr></thead><tbody>${body}</tbody></table>`;
  const a = c.axes;
  const grid = `grid: lean ${a.leanDeg.length} x handlebar ${a.handlebarDeg.length} x ${c.travelAxis.name} ${a.travelMm.length} values, tyres on the ground; ${judged.poses} poses in the ${region}, ${other.poses} in the ${otherName}.${c.travelAxis.note ? ` Note: ${c.travelAxis.note}.` : ''}`;
  return sheet('limits-sheet', `Limits: result ${c.passed ? 'PASS' : 'FAIL'}`, `<p class="small">${escapeHtml(grid)} As <code>tiltbench check</code> prints them.</p>${table}`);
}

function steeringLimits(r: ReportData): string {
  const limRows = r.check.limits.flatMap((l) =>
    (['left', 'right'] as const).map((turn) => {
      const s = l[turn];
      const what = s.handlebarDeg === null ? (s.reason ?? '') : `${s.kinds.map((k) => k.replace(/-/g, ' ')).join(', ')}: ${s.detail}`;
      return [num(l.leanDeg, 1, 'leanDeg'), td(`${turn} turn`), num(s.handlebarDeg, 1, 'handlebarDeg'), num(s.leftWheelDeg, 1), num(s.rightWheelDeg, 1), td(what)];
    }),
  );
  return `<h3>Steering limits (first limit met each way, zero travel)</h3>` + htmlTable(['lean deg', 'turn', 'handlebar deg', 'left wheel deg', 'right wheel deg', 'what limits it'], limRows, 'grid steer-limits');
}

/** Words when a full-lock pose lies past the steering limit the check found at lean 0 (its joints or clearances are over there). */
function beyondLimit(r: ReportData, f: ReportData['fullLock'][number]): string {
  const lim = r.check.limits.find((l) => l.leanDeg === 0)?.[f.turn].handlebarDeg ?? null;
  return lim !== null && Math.abs(f.handlebarDeg) > Math.abs(lim) + 1e-9 ? `past the steering limit (${fixed(lim, 1)} deg at lean 0)` : '';
}

function turningSheet(r: ReportData): string {
  const rows = r.fullLock.map((f) => {
    const tc = f.pose.analysis?.turningCircle;
    const ack = f.pose.analysis?.ackermann;
    return [
      td(`${f.turn} turn`),
      num(f.handlebarDeg, 1, 'handlebarDeg'),
      num(f.pose.analysis?.wheels.left.steerDeg ?? null, 2, 'leftWheelDeg'),
      num(f.pose.analysis?.wheels.right.steerDeg ?? null, 2, 'rightWheelDeg'),
      num(tc?.turningDiameterMm != null ? tc.turningDiameterMm / 1000 : null, 2, 'turningDiameterM'),
      num(tc?.kerbToKerbMm != null ? tc.kerbToKerbMm / 1000 : null, 2, 'kerbToKerbM'),
      num(tc?.wallToWallMm != null ? tc.wallToWallMm / 1000 : null, 2, 'wallToWallM'),
      num(ack?.percent ?? null, 1, 'ackermannPct'),
      td(f.pose.analysis ? [tc?.reason ?? (tc?.wallToWallFrom ? `wall to wall: ${tc.wallToWallFrom}` : ''), beyondLimit(r, f)].filter(Boolean).join('; ') : `not solved: ${f.pose.message}`, 'data-field="note"'),
    ];
  });
  const table = htmlTable(['at full lock (lean 0, the envelope\u2019s handlebar angle)', 'handlebar deg', 'left wheel deg', 'right wheel deg', 'turning diameter m', 'kerb to kerb m', 'wall to wall m', 'Ackermann %', ''], rows, 'grid turning').replace('<table', '<table id="turning"');
  const info = r.check.info.filter((i) => i.startsWith('turning circle')).map((i) => `<li>${escapeHtml(i)}</li>`).join('');
  return `<h3>Turning circles (SAE J695)</h3>${table}${info ? `<p class="small">From the check, the tightest inside the steering limit:</p><ul class="small">${info}</ul>` : ''}`;
}

/** One sheet per study run (sensitivity, tolerance spread, tune); none when no study was asked for. */
function studySheets(r: ReportData): string[] {
  const parts: string[] = [];
  if (r.sensitivity) {
    const s = r.sensitivity;
    const objRows = s.objectives
      .filter((o) => !o.id.startsWith('joint.'))
      .map((o) => [td(o.label, `data-id="${escapeHtml(o.id)}"`), num(o.value, 3, 'value'), td(o.unit), td(o.tolerance === null ? '\u2013' : `${o.kind === 'worst' ? 'at most' : 'at least'} ${o.tolerance} ${o.unit}`), td(o.where ?? '\u2013')]);
    const top = s.coordinates.slice(0, 10).map((c, k) => `<li>${k + 1}. ${escapeHtml(c.sentence)}</li>`).join('');
    parts.push(
      sheet('sensitivity-sheet', 'Study: sensitivity to each hardpoint coordinate',
      `<p id="sensitivity">${escapeHtml(s.method)}; step ${s.stepMm} mm; ${s.poses.length} poses.</p>` +
        htmlTable(['measure over the poses', 'value', 'unit', 'allowed', 'where'], objRows, 'grid') +
        `<p class="small">Largest effects per mm, largest first:</p><ol class="small" style="list-style:none;padding-left:0">${top}</ol>`),
    );
  }
  if (r.tolerance) {
    const t = r.tolerance;
    const rows = t.overPoses.map((sp) => [
      td(sp.label, `data-id="${escapeHtml(sp.id)}"`),
      num(sp.nominal, 3, 'nominal'),
      num(sp.summary?.mean ?? null, 3, 'mean'),
      num(sp.summary?.std ?? null, 3, 'std'),
      num(sp.summary?.p5 ?? null, 3, 'p5'),
      num(sp.summary?.p95 ?? null, 3, 'p95'),
      td(sp.unit),
      num(sp.withinTolerance === null ? null : sp.withinTolerance * 100, 1, 'withinPct'),
    ]);
    parts.push(
      sheet('tolerance-sheet', 'Study: tolerance spread over built vehicles',
      `<p id="tolerance">${escapeHtml(t.methodWords)}; ${escapeHtml(t.distributionWords)}; seed ${t.seed}; ${t.samplesMeasured} of ${t.samplesAsked} samples measured.</p>` +
        htmlTable(['over the poses', 'as drawn', 'mean', 'std', 'p5', 'p95', 'unit', 'within %'], rows, 'grid') +
        `<p class="small">Within every tolerance: ${t.withinAll === null ? '\u2013' : fixed(t.withinAll * 100, 1) + ' %'} of the samples measured.</p>`),
    );
  }
  if (r.tune) {
    const t = r.tune;
    const kept = (k: boolean | null) => (k === null ? '\u2013' : k ? 'kept' : 'NOT KEPT');
    const rows = t.summary.map((i) => [
      td(`${i.label}${i.group === 'constraint' ? ' (kept)' : ''}`, `data-id="${escapeHtml(`${i.group}.${i.id}`)}"`),
      num(i.before, 3, 'before'),
      num(i.after, 3, 'after'),
      td(i.unit),
      td(i.limit === null ? '\u2013' : `${i.kind === 'worst' ? 'at most' : 'at least'} ${i.limit} ${i.unit}`.trim()),
      td(`${kept(i.keptBefore)} / ${kept(i.keptAfter)}`),
    ]);
    const moves = t.variables.map((v) => [td(v.words, `data-id="${escapeHtml(v.id)}"`), num(v.movedMm, 2, 'movedMm'), td(`${v.rangeMm[0]} .. ${v.rangeMm[1]}`), td(v.atBound ? `at the ${v.atBound === 'low' ? 'lowest' : 'highest'} end` : '')]);
    parts.push(
      sheet('tune-sheet', 'Study: tune (not applied)',
      `<p id="tune">Plan ${escapeHtml(t.planName)}: ${escapeHtml(t.method)}; ${t.poses.length} poses (${escapeHtml(t.posesFrom)}); ${t.iterations} iterations, ${t.evaluations} designs solved, best of ${t.starts.length} starts. Everything else in this report is the design as drawn; this sheet says what the tune would change.</p>` +
        htmlTable(['measure over the poses', 'before', 'after', 'unit', 'allowed', 'limit before / after'], rows, 'grid') +
        `<h3>Moves (mm from the design as drawn)</h3>` +
        htmlTable(['coordinate', 'moved', 'range', ''], moves, 'grid') +
        (t.notAssembledAfter.length > 0 ? `<p class="small">The tuned design does not assemble at: ${escapeHtml(t.notAssembledAfter.join('; '))}</p>` : '')),
    );
  }
  return parts;
}

/** The whole report, one HTML document. */
/**
 * The lean linkage (balance beam): the rocker against lean with the spring held, and the spring
 * against its travel upright, each pose's figures as `tiltbench pose --json` gives them
 * (leanLinkage); a pose that did not give them shows its reason.
 */
function leanLinkageSheet(r: ReportData): string | null {
  const l = r.leanLinkage;
  if (!l) return null;
  const f = (x: number) => fixed(x, 1);
  const why = (row: LeanLinkageRow) => row.pose.leanLinkageReason ?? row.pose.message ?? 'no lean-linkage figures';
  const leanRows = l.byLean.map((row) => {
    const m = row.pose.leanLinkage;
    const k = `lean.${f(row.leanDeg)}`;
    if (!m) return [num(row.leanDeg, 1), `<td colspan="5">${escapeHtml(why(row))}</td>`];
    return [
      num(row.leanDeg, 1),
      num(m.rockerDeg, 2, `${k}.rockerDeg`),
      num(m.stopMarginDeg, 2, `${k}.stopMarginDeg`),
      num(m.springLengthMm, 2, `${k}.springLengthMm`),
      num(m.actuatorLengthMm ?? null, 1, `${k}.actuatorLengthMm`),
      num(m.rollAxis?.heightAtAxleMm ?? null, 1, `${k}.rollAxis.heightAtAxleMm`),
      num(m.rollAxis?.lateralAtAxleMm ?? null, 1, `${k}.rollAxis.lateralAtAxleMm`),
    ];
  });
  const travelRows = l.byTravel.map((row) => {
    const m = row.pose.leanLinkage;
    const k = `travel.${f(row.springTravelMm)}`;
    if (!m) return [num(row.springTravelMm, 1), `<td colspan="4">${escapeHtml(why(row))}</td>`];
    const wheel = row.pose.analysis?.wheels.left.travelMm ?? null;
    return [
      num(row.springTravelMm, 1),
      num(m.springLengthMm, 2, `${k}.springLengthMm`),
      num(m.motionRatio ?? null, 3, `${k}.motionRatio`),
      num(wheel, 1, `${k}.wheelTravelMm`),
      num(m.rollAxis?.heightAtAxleMm ?? null, 1, `${k}.rollAxis.heightAtAxleMm`),
    ];
  });
  const upright = l.byLean.find((row) => row.leanDeg === 0)?.pose.leanLinkage;
  const stops = upright
    ? `<p id="lean-at-stops">Lean at the stops (rocker driven to each stop, handlebar and spring held, from upright): ` +
      `<span data-field="leanAtStop.positive"${upright.leanAtStopDeg?.positive == null ? '' : ` data-value="${String(upright.leanAtStopDeg.positive)}"`}>${fixed(upright.leanAtStopDeg?.positive ?? null, 1)}</span> deg at +${fixed(upright.stopDeg, 1)} deg of rocker, ` +
      `<span data-field="leanAtStop.negative"${upright.leanAtStopDeg?.negative == null ? '' : ` data-value="${String(upright.leanAtStopDeg.negative)}"`}>${fixed(upright.leanAtStopDeg?.negative ?? null, 1)}</span> deg at -${fixed(upright.stopDeg, 1)} deg.</p>`
    : '';
  const body =
    `<h3>Against lean (spring travel 0, handlebar 0, tyres on the ground)</h3>` +
    htmlTable(['lean deg', 'rocker deg', 'stop margin deg', 'spring length mm', 'actuator length mm', 'roll axis height at x = 0 mm', 'roll axis sideways at x = 0 mm'], leanRows, 'grid lean-linkage').replace('<table', '<table id="lean-linkage-lean"') +
    stops +
    `<h3>Against spring travel (lean 0, handlebar 0)</h3>` +
    htmlTable(['spring travel mm (compression +)', 'spring length mm', 'motion ratio (spring per wheel)', 'wheel-centre travel mm (bump +)', 'roll axis height mm'], travelRows, 'grid lean-linkage').replace('<table', '<table id="lean-linkage-travel"') +
    `<p class="small">Figures as <code>tiltbench pose --json</code> gives them (leanLinkage). ${escapeHtml(ANALYSIS_DEFINITIONS.leanLinkage)} Roll axis: ${escapeHtml(ANALYSIS_DEFINITIONS.rollAxis)}.</p>`;
  return sheet('lean-linkage-sheet', 'Lean linkage (balance beam)', body);
}

/**
 * The leaning rear pair: each rear wheel's camber (to the ground and to the frame) and toe
 * against lean, straight ahead; then the four-wheel turn centre and each wheel's slip angle in
 * turns. Each figure is `tiltbench pose --json`'s analysis.rear at that pose.
 */
function rearPairSheet(r: ReportData): string | null {
  const rp = r.rearPair;
  if (!rp) return null;
  const f = (x: number) => fixed(x, 1);
  const failed = (row: RearPairRow, cols: number) => [num(row.leanDeg, 1), num(row.handlebarDeg, 1), `<td colspan="${cols}">${escapeHtml(`not solved: ${row.pose.message}`)}</td>`];
  const leanRows = rp.byLean.map((row) => {
    const rear = row.pose.analysis?.rear;
    if (!rear) return failed(row, 6);
    const k = `rear.lean.${f(row.leanDeg)}`;
    return [
      num(row.leanDeg, 1),
      num(rear.left.camberDeg, 2, `${k}.left.camberDeg`),
      num(rear.right.camberDeg, 2, `${k}.right.camberDeg`),
      num(rear.left.camberToFrameDeg, 2, `${k}.left.camberToFrameDeg`),
      num(rear.right.camberToFrameDeg, 2, `${k}.right.camberToFrameDeg`),
      num(rear.left.toeDeg, 2, `${k}.left.toeDeg`),
      num(rear.right.toeDeg, 2, `${k}.right.toeDeg`),
    ];
  });
  const turnRows = rp.turns.map((row) => {
    const tc = row.pose.analysis?.rear?.turnCentre;
    const k = `rear.turn.${f(row.leanDeg)}.${f(row.handlebarDeg)}`;
    if (!row.pose.analysis?.rear) return failed(row, 7);
    if (!tc || !tc.centreMm || !tc.slipDeg) return [num(row.leanDeg, 1), num(row.handlebarDeg, 1), td(`no turn centre: ${tc?.reason ?? 'straight ahead'}`, 'colspan="7"')];
    return [
      num(row.leanDeg, 1),
      num(row.handlebarDeg, 1),
      num(tc.centreMm.y / 1000, 3, `${k}.centreYM`),
      num(tc.lineSpreadMm, 1, `${k}.lineSpreadMm`),
      num(tc.slipDeg.frontLeftDeg, 2, `${k}.slip.frontLeftDeg`),
      num(tc.slipDeg.frontRightDeg, 2, `${k}.slip.frontRightDeg`),
      num(tc.slipDeg.rearLeftDeg, 2, `${k}.slip.rearLeftDeg`),
      num(tc.slipDeg.rearRightDeg, 2, `${k}.slip.rearRightDeg`),
      num(tc.worstSlipDeg, 2, `${k}.worstSlipDeg`),
    ];
  });
  const body =
    `<h3>Rear wheels against lean (handlebar 0, tyres on the ground)</h3>` +
    htmlTable(['lean deg', 'camber L deg', 'camber R deg', 'camber to frame L deg', 'camber to frame R deg', 'toe L deg', 'toe R deg'], leanRows, 'grid rear-pair').replace('<table', '<table id="rear-pair-lean"') +
    `<h3>Four-wheel turn centre and slip angles</h3>` +
    htmlTable(['lean deg', 'handlebar deg', 'turn centre y m (left +)', 'axis lines spread mm', 'slip FL deg', 'slip FR deg', 'slip RL deg', 'slip RR deg', 'worst slip deg'], turnRows, 'grid rear-pair').replace('<table', '<table id="rear-pair-turns"') +
    `<p class="small">Figures as <code>tiltbench pose --json</code> gives them (analysis.rear). Camber top-outward positive; toe-in positive; the turn centre is the point nearest all four wheels' axis lines on the ground, the spread how far those lines miss it.</p>`;
  return sheet('rear-pair-sheet', 'Leaning rear pair: alignment and the four-wheel turn centre', body);
}

export function reportHtml(r: ReportData): string {
  const studies = studySheets(r);
  const last = sheet(
    'turning-sheet',
    'Turning circles and steering limits',
    turningSheet(r) +
      steeringLimits(r) +
      (studies.length ? '' : `<p class="small">No studies were run for this report (tiltbench report --with-sensitivity, --with-tolerance N).</p>`) +
      `<p class="caution">${escapeHtml(SAFETY_CAUTION)}</p>`,
  );
  const extra = [leanLinkageSheet(r), rearPairSheet(r)].filter((x): x is string => x !== null);
  const sheets = [coverSheet(r), hardpointSheet(r), drawingSheet(r), ...curveSheets(r), limitsSheet(r), ...extra, last, ...studies];
  return (
    `<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8"><meta name="generator" content="Tiltbench report">` +
    `<meta name="viewport" content="width=device-width, initial-scale=1">` +
    `<title>${escapeHtml(`Workshop report: ${r.source.name}`)}</title><style>${CSS}</style></head><body>\n` +
    sheets.join('\n') +
    `\n</body></html>\n`
  );
}
