/**
 * `tiltbench report --plots FOLDER [--png]`: every chart of the workbench as its own SVG (the
 * option builders' own rendering) and PNG (headless Chromium's picture of that SVG). The PNGs
 * are read by a small PNG reader in Python written here from the PNG specification (W3C PNG,
 * 2nd edition: zlib data, the five row filters), independent of the command's own reader; one
 * chart is also photographed alone by Chromium and compared pixel for pixel with its cut-out.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run, WREN } from './cliHarness';
import { parseDesignText } from '../../core/design/validateDesign';
import { computeCurves, computeMap } from '../../core/report/chartSweeps';
import { PLOT_FILES, renderPlots, WORKBENCH_PLOT_SIZES } from '../../core/report/plots';
import { decodePng, type Picture } from '../../core/cli/png';

/** A PNG's pixels as the PNG specification defines them, read in Python: size, channels and a SHA-256 of the unfiltered samples. */
const PNG_READER = `
import hashlib, json, struct, sys, zlib
b = open(sys.argv[1], 'rb').read()
assert b[:8] == b'\\x89PNG\\r\\n\\x1a\\n'
at, idat = 8, b''
while at < len(b):
    n, kind = struct.unpack('>I4s', b[at:at + 8])
    data = b[at + 8:at + 8 + n]
    if kind == b'IHDR':
        w, h, depth, colour = struct.unpack('>IIBB', data[:10])
        ch = {2: 3, 6: 4}[colour]
    elif kind == b'IDAT':
        idat += data
    at += 12 + n
raw = zlib.decompress(idat)
stride = w * ch
out = bytearray(h * stride)
for y in range(h):
    f = raw[y * (stride + 1)]
    row = raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)]
    base = y * stride
    for i in range(stride):
        a = out[base + i - ch] if i >= ch else 0
        up = out[base - stride + i] if y else 0
        c = out[base - stride + i - ch] if y and i >= ch else 0
        if f == 0: v = row[i]
        elif f == 1: v = row[i] + a
        elif f == 2: v = row[i] + up
        elif f == 3: v = row[i] + (a + up) // 2
        else:
            p = a + up - c; pa, pb, pc = abs(p - a), abs(p - up), abs(p - c)
            v = row[i] + (a if pa <= pb and pa <= pc else up if pb <= pc else c)
        out[base + i] = v & 255
print(json.dumps({'width': w, 'height': h, 'channels': ch, 'sha256': hashlib.sha256(bytes(out)).hexdigest()}))
`;

const pythonPng = (path: string) => JSON.parse(execFileSync('python3', ['-c', PNG_READER, path], { encoding: 'utf8' })) as { width: number; height: number; channels: number; sha256: string };

function grey(p: Picture): Float64Array {
  const g = new Float64Array(p.width * p.height);
  for (let k = 0; k < g.length; k++) g[k] = (p.pixels[k * p.channels] + p.pixels[k * p.channels + 1] + p.pixels[k * p.channels + 2]) / 3;
  return g;
}

function stats(p: Picture): { ink: number; firstInkRow: number } {
  const g = grey(p);
  let ink = 0;
  let first = -1;
  g.forEach((v, k) => {
    if (v < 200) {
      ink++;
      if (first < 0) first = Math.floor(k / p.width);
    }
  });
  return { ink: ink / g.length, firstInkRow: first };
}

function meanAbsDiff(a: Picture, b: Picture): number {
  const ga = grey(a);
  const gb = grey(b);
  let sum = 0;
  ga.forEach((v, k) => (sum += Math.abs(v - gb[k])));
  return sum / ga.length;
}

/** The title each file's chart carries, written out here (as in test/renderer/chartsSvg.test.ts). */
const TITLES: Record<string, string> = {
  'lean-steer': 'Lean steer',
  'bump-steer': 'Bump steer',
  'ratio-lean': 'Ratio change',
  'slip-steer': 'Toe mismatch',
  ackermann: 'Ackermann',
  camber: 'Camber',
  'joints-lean': 'Joint articulation against lean',
  'joints-steer': 'Joint articulation against steer',
  ratio: 'Steering ratio',
  'front-lift': 'Front lift with steer',
  'envelope-map': 'Envelope map',
};

/** zrender numbers its instances and style classes; two renderings differ only there. */
const sameDrawing = (svg: string) => svg.replace(/zr\d+-cls-\d+/g, 'zr-cls').replace(/zr\d+-/g, 'zr-');

describe('tiltbench report --plots', () => {
  it('writes every chart as SVG (the builders\u2019 own rendering) and PNG at twice its size, cut right', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-plots-'));
    const r = await run(['report', WREN, '--plots', dir, '--png', '--map-step', '10']);
    expect(r.code, r.err).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(PLOT_FILES.flatMap((n) => [`${n}.png`, `${n}.svg`]).sort());
    const parsed = parseDesignText(readFileSync(WREN, 'utf8'), WREN);
    if (!parsed.ok) throw new Error('the Wren must load');
    const plots = renderPlots(computeCurves({ design: parsed.design }), computeMap({ design: parsed.design, angleStepDeg: 10 }));
    plots.forEach((p, k) => {
      expect(p.name).toBe(PLOT_FILES[k]);
      expect(sameDrawing(readFileSync(join(dir, `${p.name}.svg`), 'utf8')), p.name).toBe(sameDrawing(p.svg));
      expect(p.svg, p.name).toContain(`>${TITLES[p.name]}`);
    });
    const read = (name: string) => decodePng(readFileSync(join(dir, name)));
    // The command's own PNG reader, used below, reads what Python reads by the specification.
    const py = pythonPng(join(dir, 'ackermann.png'));
    const ours = read('ackermann.png');
    expect({ width: ours.width, height: ours.height, channels: ours.channels, sha256: createHash('sha256').update(ours.pixels).digest('hex') }).toEqual(py);
    for (const [k, name] of PLOT_FILES.entries()) {
      const p = read(`${name}.png`);
      const [w, h] = k === PLOT_FILES.length - 1 ? WORKBENCH_PLOT_SIZES.map : WORKBENCH_PLOT_SIZES.curve;
      expect([p.width, p.height], name).toEqual([2 * w, 2 * h]);
      const s = stats(p);
      expect(s.ink, name).toBeGreaterThan(0.002); // the Wren does not lean: its lean charts hold only a title and why (0.6 % ink)
      // The title is the first thing drawn, near the top: a cut that slipped by a chart's part would not start there.
      expect(s.firstInkRow, name).toBeGreaterThanOrEqual(0);
      expect(s.firstInkRow, name).toBeLessThan(0.08 * 2 * h);
    }
    // One chart photographed alone equals its cut-out.
    const alone = join(dir, 'alone.png');
    execFileSync('/usr/bin/chromium', ['--headless', '--no-sandbox', '--disable-gpu', `--user-data-dir=${join(dir, 'profile')}`, '--hide-scrollbars', '--default-background-color=ffffffff', '--force-device-scale-factor=2', '--window-size=720,360', `--screenshot=${alone}`, `file://${join(dir, 'ackermann.svg')}`], { stdio: 'ignore', timeout: 60_000 });
    const single = decodePng(readFileSync(alone));
    expect([single.width, single.height]).toEqual([ours.width, ours.height]);
    expect(meanAbsDiff(ours, single)).toBeLessThan(1);
    // Negative control: another chart differs by far more.
    expect(meanAbsDiff(read('camber.png'), single)).toBeGreaterThan(3);
  }, 180_000);

  it('plots alone need no --out; --png without --plots, studies without --out and a folder that is not one are refused', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-plots-'));
    const svgOnly = await run(['report', WREN, '--plots', dir, '--map-step', '10']);
    expect(svgOnly.code, svgOnly.err).toBe(0);
    expect(readdirSync(dir).filter((f) => f.endsWith('.svg'))).toHaveLength(PLOT_FILES.length);
    expect(readdirSync(dir).filter((f) => f.endsWith('.png'))).toHaveLength(0);
    const png = await run(['report', WREN, '--out', join(dir, 'r.html'), '--png']);
    expect(png.code).toBe(2);
    expect(png.err).toContain('--png is for --plots');
    const studies = await run(['report', WREN, '--plots', dir, '--with-sensitivity']);
    expect(studies.code).toBe(2);
    expect(studies.err).toContain('the studies go into the report');
    const notFolder = await run(['report', WREN, '--plots', join(dir, 'lean-steer.svg')]);
    expect(notFolder.code).toBe(2);
    expect(notFolder.err).toContain('not a folder');
  }, 60_000);
});
