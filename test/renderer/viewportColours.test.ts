// The 3D view's own colours against the status colours, under normal vision and simulated
// protanopia, deuteranopia and tritanopia.
//
// Colour difference: CIEDE2000 (CIE 142-2001), implemented here after G. Sharma, W. Wu and
// E. N. Dalal, "The CIEDE2000 color-difference formula: implementation notes, supplementary
// test data, and mathematical observations", Color Research & Application 30(1), 2005, and
// checked against pairs of that paper's test data below.
// Simulation: Machado, Oliveira and Fernandes, "A physiologically-based model for simulation
// of color vision deficiency", IEEE TVCG 15(6), 2009, their published matrices for severity
// 1.0 (dichromacy), applied to linear sRGB and clipped, as their supplementary page gives them
// (the same numbers as the colorspacious library's cvd.py).
// sRGB to CIELAB: IEC 61966-2-1 transfer curve and matrix, D65 white.
// Outside reference: the culori library (differenceCiede2000 and its Machado filters) agrees
// pair for pair when the matrices are applied its way, and the thresholds hold its way too.
import { describe, expect, it } from 'vitest';
import { SEVERITY_STYLE, type Severity } from '../../renderer/model/severity';
import { VIEW_COLOUR } from '../../renderer/viewport/palette';
import { PART_CLASS_COLOUR } from '../../renderer/viewport/drawingParts';

type Lab = [number, number, number];
type M3 = [number, number, number][];

const SIMULATIONS: Record<string, M3> = {
  normal: [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ],
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

const linear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);

function labOf(hex: string, sim: M3): Lab {
  const rgb = [1, 3, 5].map((i) => linear(parseInt(hex.slice(i, i + 2), 16) / 255));
  return labFromLinear(sim.map((row) => Math.min(1, Math.max(0, row[0] * rgb[0] + row[1] * rgb[1] + row[2] * rgb[2]))));
}

function labFromLinear(s: number[]): Lab {
  const X = 0.4124564 * s[0] + 0.3575761 * s[1] + 0.1804375 * s[2];
  const Y = 0.2126729 * s[0] + 0.7151522 * s[1] + 0.072175 * s[2];
  const Z = 0.0193339 * s[0] + 0.119192 * s[1] + 0.9503041 * s[2];
  const f = (t: number) => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  const [fx, fy, fz] = [f(X / 0.95047), f(Y / 1), f(Z / 1.08883)];
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** As labOf, but the matrix applied to the gamma-encoded values without clipping (culori's way). */
function labOfEncoded(hex: string, sim: M3): Lab {
  const enc = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const s = sim.map((row) => row[0] * enc[0] + row[1] * enc[1] + row[2] * enc[2]);
  const lin = s.map((c) => Math.sign(c) * linear(Math.abs(c)));
  return labFromLinear(lin);
}

const rad = (d: number) => (d * Math.PI) / 180;

function ciede2000([L1, a1, b1]: Lab, [L2, a2, b2]: Lab): number {
  const Cbar = (Math.hypot(a1, b1) + Math.hypot(a2, b2)) / 2;
  const G = 0.5 * (1 - Math.sqrt(Cbar ** 7 / (Cbar ** 7 + 25 ** 7)));
  const a1p = (1 + G) * a1;
  const a2p = (1 + G) * a2;
  const C1 = Math.hypot(a1p, b1);
  const C2 = Math.hypot(a2p, b2);
  const hue = (b: number, a: number) => (b === 0 && a === 0 ? 0 : (((Math.atan2(b, a) * 180) / Math.PI) % 360 + 360) % 360);
  const h1 = hue(b1, a1p);
  const h2 = hue(b2, a2p);
  const dL = L2 - L1;
  const dC = C2 - C1;
  let dh = 0;
  if (C1 * C2 !== 0) {
    dh = h2 - h1;
    if (dh > 180) dh -= 360;
    else if (dh < -180) dh += 360;
  }
  const dH = 2 * Math.sqrt(C1 * C2) * Math.sin(rad(dh / 2));
  const Lb = (L1 + L2) / 2;
  const Cb = (C1 + C2) / 2;
  let hb = h1 + h2;
  if (C1 * C2 !== 0) {
    if (Math.abs(h1 - h2) <= 180) hb = (h1 + h2) / 2;
    else hb = h1 + h2 < 360 ? (h1 + h2 + 360) / 2 : (h1 + h2 - 360) / 2;
  }
  const T = 1 - 0.17 * Math.cos(rad(hb - 30)) + 0.24 * Math.cos(rad(2 * hb)) + 0.32 * Math.cos(rad(3 * hb + 6)) - 0.2 * Math.cos(rad(4 * hb - 63));
  const dTheta = 30 * Math.exp(-(((hb - 275) / 25) ** 2));
  const RC = 2 * Math.sqrt(Cb ** 7 / (Cb ** 7 + 25 ** 7));
  const SL = 1 + (0.015 * (Lb - 50) ** 2) / Math.sqrt(20 + (Lb - 50) ** 2);
  const SC = 1 + 0.045 * Cb;
  const SH = 1 + 0.015 * Cb * T;
  const RT = -Math.sin(rad(2 * dTheta)) * RC;
  return Math.sqrt((dL / SL) ** 2 + (dC / SC) ** 2 + (dH / SH) ** 2 + RT * (dC / SC) * (dH / SH));
}

/** The smallest CIEDE2000 difference between `hex` and any of `others`, over every simulation. */
function worst(hex: string, others: Record<string, string>): { de: number; against: string; sim: string } {
  let w = { de: Infinity, against: '', sim: '' };
  for (const [sim, m] of Object.entries(SIMULATIONS)) {
    for (const [name, o] of Object.entries(others)) {
      const de = ciede2000(labOf(hex, m), labOf(o, m));
      if (de < w.de) w = { de, against: name, sim };
    }
  }
  return w;
}

const STATUS: Record<string, string> = Object.fromEntries(
  (['none', 'within', 'close', 'over', 'broken'] as Severity[]).map((s) => [s, SEVERITY_STYLE[s].colour]),
);

describe('the colour-difference formula', () => {
  it('matches Sharma, Wu and Dalal (2005) test data', () => {
    const pairs: [Lab, Lab, number][] = [
      [[50, 2.6772, -79.7751], [50, 0, -82.7485], 2.0425],
      [[50, 3.1571, -77.2803], [50, 0, -82.7485], 2.8615],
      [[50, 2.8361, -74.02], [50, 0, -82.7485], 3.4412],
      [[50, 0, 0], [50, -1, 2], 2.3669],
      [[50, 2.5, 0], [73, 25, -18], 27.1492],
      [[50, 2.5, 0], [50, 0, -2.5], 4.3065],
      [[60.2574, -34.0099, 36.2677], [60.4626, -34.1751, 39.4387], 1.2644],
      [[63.0109, -31.0961, -5.8663], [62.8187, -29.7946, -4.0864], 1.263],
      [[22.7233, 20.0904, -46.694], [23.0331, 14.973, -42.5619], 2.0373],
      [[2.0776, 0.0795, -1.135], [0.9033, -0.0636, -0.5514], 0.9082],
    ];
    for (const [a, b, want] of pairs) {
      expect(ciede2000(a, b)).toBeCloseTo(want, 4);
      expect(ciede2000(b, a)).toBeCloseTo(want, 4);
    }
  });

  it('keeps white white in every simulation, and makes red and green alike under deuteranopia', () => {
    for (const m of Object.values(SIMULATIONS)) {
      const w = labOf('#ffffff', m);
      expect(w[0]).toBeCloseTo(100, 1);
      expect(Math.hypot(w[1], w[2])).toBeLessThan(1);
    }
    // A red and a green of like lightness: far apart to normal vision, close under deuteranopia.
    const normal = ciede2000(labOf('#c04040', SIMULATIONS.normal), labOf('#6a8a2a', SIMULATIONS.normal));
    const deutan = ciede2000(labOf('#c04040', SIMULATIONS.deuteranopia), labOf('#6a8a2a', SIMULATIONS.deuteranopia));
    expect(normal).toBeGreaterThan(30);
    expect(deutan).toBeLessThan(normal / 3);
  });
});

describe("the viewport's colours (CIEDE2000, worst case over normal vision and the three dichromacies)", () => {
  const neutralParts: Record<string, string> = { ...PART_CLASS_COLOUR, joint: VIEW_COLOUR.joint, tyre: VIEW_COLOUR.tyre, rim: VIEW_COLOUR.rim };

  it('the selection stands apart from every status colour and every part colour: at least 15', () => {
    const w = worst(VIEW_COLOUR.selection, { ...STATUS, ...neutralParts });
    expect(w.de, `${w.against} under ${w.sim}`).toBeGreaterThanOrEqual(15);
  });

  it('the turn paths stand apart from the status colours, the selection and the ground: at least 15', () => {
    const w = worst(VIEW_COLOUR.path, { ...STATUS, selection: VIEW_COLOUR.selection, ground: VIEW_COLOUR.ground, background: VIEW_COLOUR.background, grid: VIEW_COLOUR.gridMajor });
    expect(w.de, `${w.against} under ${w.sim}`).toBeGreaterThanOrEqual(15);
  });

  it('a part that takes a status colour visibly changes: every neutral part colour at least 10 from every status colour', () => {
    for (const [part, hex] of Object.entries(neutralParts)) {
      const w = worst(hex, STATUS);
      expect(w.de, `${part} against ${w.against} under ${w.sim}`).toBeGreaterThanOrEqual(10);
    }
  });

  it('the kinds of tube differ from each other under normal vision: at least 9 apart', () => {
    const kinds = ['frame', 'wishbone', 'upright', 'steering', 'tieRod'] as const;
    for (const a of kinds) {
      for (const b of kinds) {
        if (a >= b) continue;
        const de = ciede2000(labOf(PART_CLASS_COLOUR[a], SIMULATIONS.normal), labOf(PART_CLASS_COLOUR[b], SIMULATIONS.normal));
        expect(de, `${a} and ${b}`).toBeGreaterThanOrEqual(9);
      }
    }
  });

  it('negative control: the earlier bronze of steering parts was 2.4 from "over" under deuteranopia', () => {
    const w = worst('#a4713a', { over: SEVERITY_STYLE.over.colour });
    expect(w.de).toBeLessThan(10);
    expect(w.sim).toBe('deuteranopia');
  });
});

describe('agreement with an outside implementation', () => {
  // culori applies Machado's matrices to gamma-encoded sRGB (unclipped), this file to linear
  // sRGB (clipped), as colorspacious does. Applied the same way, the two must agree: that checks
  // this file's sRGB -> CIELAB -> CIEDE2000 chain against culori's. And the viewport's
  // thresholds must hold under culori's convention too, so they do not rest on that choice.
  it('matches the culori library pair for pair when the matrices are applied as culori does, and the thresholds hold there too', async () => {
    const { differenceCiede2000, filterDeficiencyDeuter, filterDeficiencyProt, filterDeficiencyTrit, parse } = await import('culori');
    const dE = differenceCiede2000();
    type C = NonNullable<ReturnType<typeof parse>>;
    const theirs: Record<string, (c: C) => C> = {
      normal: (c) => c,
      protanopia: filterDeficiencyProt(1),
      deuteranopia: filterDeficiencyDeuter(1),
      tritanopia: filterDeficiencyTrit(1),
    };
    const colours: Record<string, string> = { ...STATUS, ...PART_CLASS_COLOUR, selection: VIEW_COLOUR.selection, path: VIEW_COLOUR.path, ground: VIEW_COLOUR.ground };
    const theirDe = (a: string, b: string, sim: string) => dE(theirs[sim](parse(a)!), theirs[sim](parse(b)!));
    let worstGap = 0;
    let pairs = 0;
    for (const [sim, m] of Object.entries(SIMULATIONS)) {
      for (const a of Object.values(colours)) {
        for (const b of Object.values(colours)) {
          if (a >= b) continue;
          const ours = ciede2000(labOfEncoded(a, m), labOfEncoded(b, m));
          worstGap = Math.max(worstGap, Math.abs(ours - theirDe(a, b, sim)));
          pairs++;
        }
      }
    }
    expect(pairs).toBeGreaterThan(100);
    expect(worstGap).toBeLessThan(0.05);
    // The thresholds of the checks above, under culori's convention.
    const least = (hex: string, others: string[]) => Math.min(...Object.keys(theirs).flatMap((sim) => others.map((o) => theirDe(hex, o, sim))));
    const statusHex = Object.values(STATUS);
    const partHex = [...Object.values(PART_CLASS_COLOUR), VIEW_COLOUR.joint, VIEW_COLOUR.tyre, VIEW_COLOUR.rim];
    expect(least(VIEW_COLOUR.selection, [...statusHex, ...partHex])).toBeGreaterThanOrEqual(15);
    expect(least(VIEW_COLOUR.path, [...statusHex, VIEW_COLOUR.selection, VIEW_COLOUR.ground, VIEW_COLOUR.background, VIEW_COLOUR.gridMajor])).toBeGreaterThanOrEqual(15);
    for (const p of partHex) expect(least(p, statusHex), p).toBeGreaterThanOrEqual(10);
  });
});
