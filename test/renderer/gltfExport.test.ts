/**
 * The posed mechanism as glTF 2.0 binary (renderer/export/): checked by the Khronos glTF
 * validator (npm gltf-validator, validateBytes), an outside reader of the format, and by a
 * GLB reader written here from the glTF 2.0 specification (12-byte header, a JSON chunk, a
 * BIN chunk; accessors into buffer views), which finds each joint where the solved pose put
 * it: ISO 8855 (x forward, y left, z up, mm) written as glTF (X, Y, Z) = (y, z, x) / 1000 m
 * (glTF 2.0 spec, "Coordinate System and Units": +Y up, +Z forward, metres).
 */
import { describe, expect, it } from 'vitest';
import { validateBytes } from 'gltf-validator';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { poseGlb, sweepGlb, sweepPoses } from '../../renderer/export/glbExport';
import { exportParts } from '../../renderer/export/mechanismScene';
import { demoWorkbench } from './helpers';

interface Gltf {
  asset: { version: string };
  scenes: { name?: string; nodes: number[]; extras?: Record<string, unknown> }[];
  nodes: { name?: string; translation?: number[]; rotation?: number[]; scale?: number[]; mesh?: number }[];
  accessors: { bufferView: number; byteOffset?: number; componentType: number; count: number; type: string }[];
  bufferViews: { buffer: number; byteOffset?: number; byteLength: number; byteStride?: number }[];
  animations?: { name?: string; channels: { sampler: number; target: { node: number; path: string } }[]; samplers: { input: number; output: number; interpolation?: string }[] }[];
}

/** A GLB read by the container layout of the glTF 2.0 spec (section "Binary glTF Layout"). */
function readGlb(bytes: Uint8Array): { json: Gltf; bin: DataView } {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  expect(view.getUint32(0, true)).toBe(0x46546c67); // 'glTF'
  expect(view.getUint32(4, true)).toBe(2);
  expect(view.getUint32(8, true)).toBe(bytes.byteLength);
  const jsonLength = view.getUint32(12, true);
  expect(view.getUint32(16, true)).toBe(0x4e4f534a); // 'JSON'
  const json = JSON.parse(new TextDecoder().decode(bytes.subarray(20, 20 + jsonLength))) as Gltf;
  const binAt = 20 + jsonLength;
  const binLength = view.getUint32(binAt, true);
  expect(view.getUint32(binAt + 4, true)).toBe(0x004e4942); // 'BIN'
  return { json, bin: new DataView(bytes.buffer, bytes.byteOffset + binAt + 8, binLength) };
}

/** The floats of an accessor (tightly packed FLOAT, 5126), one array per element. */
function floats(g: { json: Gltf; bin: DataView }, index: number): number[][] {
  const a = g.json.accessors[index];
  expect(a.componentType).toBe(5126);
  const size = { SCALAR: 1, VEC3: 3, VEC4: 4 }[a.type]!;
  const bv = g.json.bufferViews[a.bufferView];
  const stride = bv.byteStride ?? size * 4;
  const out: number[][] = [];
  for (let k = 0; k < a.count; k++) {
    const at = (bv.byteOffset ?? 0) + (a.byteOffset ?? 0) + k * stride;
    out.push(Array.from({ length: size }, (_, c) => g.bin.getFloat32(at + 4 * c, true)));
  }
  return out;
}

/** glTF metres from ISO 8855 mm, written out here rather than taken from the module. */
const asGltf = (p: readonly number[]) => [p[1] / 1000, p[2] / 1000, p[0] / 1000];

/** A joint whose drawing point is a named mechanism point, and where the pose has it. */
function namedJoint(layout: DrawingLayout, snap: PoseSnapshot, which = 0) {
  const joints = layout.joints.filter((j) => 'point' in j.at);
  const j = joints[which % joints.length];
  return { joint: j, at: snap.points[(j.at as { point: string }).point] };
}

async function errorsOf(bytes: Uint8Array) {
  const report = await validateBytes(bytes);
  return { count: report.issues.numErrors, messages: report.issues.messages.filter((m) => m.severity === 0).map((m) => `${m.code} ${m.pointer ?? ''} ${m.message}`) };
}

describe('glTF export of the posed mechanism', () => {
  const wb = demoWorkbench();
  wb.actions.setPose({ leanDeg: 12, handlebarDeg: 6 });
  const state = wb.pose.getState();
  const layout = state.drawing!;
  const snap = state.outcome.snapshot!;

  it('the pose on screen: valid glTF 2.0 (Khronos validator: no errors), a node per part named in words, joints where the solve put them', async () => {
    expect(state.outcome.reached).toBe(true);
    expect(snap.inputs.leanDeg).toBe(12);
    const { bytes, missing } = await poseGlb(layout, snap, 'Heron');
    expect(missing).toEqual([]);
    const errors = await errorsOf(bytes);
    expect(errors.messages).toEqual([]);
    expect(errors.count).toBe(0);

    const g = readGlb(bytes);
    expect(g.json.asset.version).toBe('2.0');
    const expectedNames = [
      ...layout.tubes.map((t) => t.label),
      ...(layout.handlebar ? [`${layout.handlebar.label} bar`, `${layout.handlebar.label} stem`] : []),
      ...layout.joints.map((j) => j.label),
      ...layout.frontWheels.map((w) => w.label),
      ...layout.rearWheels.map((w) => w.label),
      ...(layout.outline ? [layout.outline.label] : []),
    ];
    expect(g.json.nodes.map((n) => n.name)).toEqual(expectedNames);
    expect(exportParts(layout).map((p) => p.name)).toEqual(expectedNames);
    expect(g.json.scenes[0].nodes).toHaveLength(expectedNames.length);
    // Names in words: no camelCase identifiers.
    for (const name of expectedNames) expect(name, name).not.toMatch(/[a-z][A-Z]/);
    expect(g.json.scenes[0].extras?.caution).toMatch(/design aid/);

    for (const which of [0, 3, 7]) {
      const { joint, at } = namedJoint(layout, snap, which);
      const node = g.json.nodes[expectedNames.indexOf(joint.label)];
      const want = asGltf(at);
      for (let c = 0; c < 3; c++) expect(Math.abs(node.translation![c] - want[c]), `${joint.label} axis ${c}`).toBeLessThan(1e-6);
    }
    // Negative control: the same check against the unconverted point (mm, ISO axes) fails.
    const { joint, at } = namedJoint(layout, snap);
    const node = g.json.nodes[expectedNames.indexOf(joint.label)];
    expect(Math.max(...node.translation!.map((v, c) => Math.abs(v - at[c])))).toBeGreaterThan(1e-3);
  });

  it('a tube node stretches a unit cylinder between its two points', async () => {
    const { bytes } = await poseGlb(layout, snap, 'Heron');
    const g = readGlb(bytes);
    const tube = layout.tubes.find((t) => 'point' in t.a && 'point' in t.b)!;
    const a = asGltf(snap.points[(tube.a as { point: string }).point]);
    const b = asGltf(snap.points[(tube.b as { point: string }).point]);
    const node = g.json.nodes[g.json.nodes.findIndex((n) => n.name === tube.label)];
    const mid = a.map((v, c) => (v + b[c]) / 2);
    for (let c = 0; c < 3; c++) expect(Math.abs(node.translation![c] - mid[c])).toBeLessThan(1e-6);
    expect(node.scale![1]).toBeCloseTo(Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]), 9);
    expect(node.scale![0]).toBeCloseTo(tube.radius / 1000, 12);
    // The unit cylinder's axis (local +Y) turned by the node's rotation points from a to b.
    const [x, y, z, w] = node.rotation!;
    const axis = [2 * (x * y - w * z), 1 - 2 * (x * x + z * z), 2 * (y * z + w * x)];
    const length = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
    for (let c = 0; c < 3; c++) expect(axis[c]).toBeCloseTo((b[c] - a[c]) / length, 6);
  });

  it('a lean sweep as an animation: valid (no errors), a translation, rotation and scale channel per node, each key at its solved pose', async () => {
    const resolved = state.resolved!;
    const sweep = sweepPoses(resolved, state.pose, 9);
    expect(sweep.swept).toBe('lean');
    expect(sweep.skipped).toEqual([]);
    expect(sweep.values[0]).toBe(-resolved.envelope.leanDeg);
    expect(sweep.values[8]).toBe(resolved.envelope.leanDeg);
    const { bytes, missing } = await sweepGlb(layout, sweep, 'Heron');
    expect(missing).toEqual([]);
    const errors = await errorsOf(bytes);
    expect(errors.messages).toEqual([]);

    const g = readGlb(bytes);
    const [anim] = g.json.animations!;
    expect(anim.name).toBe('lean sweep');
    expect(anim.channels).toHaveLength(3 * g.json.nodes.length);
    const times = floats(g, anim.samplers[0].input).map((t) => t[0]);
    expect(times).toHaveLength(9);

    for (const which of [0, 5]) {
      const { joint } = namedJoint(layout, snap, which);
      const nodeIndex = g.json.nodes.findIndex((n) => n.name === joint.label);
      const channel = anim.channels.find((c) => c.target.node === nodeIndex && c.target.path === 'translation')!;
      const keys = floats(g, anim.samplers[channel.sampler].output);
      sweep.snapshots.forEach((s, k) => {
        const want = asGltf(s.points[(joint.at as { point: string }).point]);
        for (let c = 0; c < 3; c++) expect(Math.abs(keys[k][c] - want[c]), `${joint.label} key ${k}`).toBeLessThan(1e-6);
      });
      // The joint moves over the sweep (a check that could not see a frozen animation would be worthless).
      expect(Math.hypot(...keys[0].map((v, c) => v - keys[8][c]))).toBeGreaterThan(1e-3);
    }
  }, 60_000);

  it.each(['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike', 'plover-tilting-quad', 'pipit-balance-beam-trike'])('every demo (%s): the pose and a 21-pose sweep are valid, with no warnings either', async (name) => {
    const demo = demoWorkbench(name).pose.getState();
    const pose = await poseGlb(demo.drawing!, demo.outcome.snapshot!, name);
    const sweep = sweepPoses(demo.resolved!, demo.pose, 21);
    expect(sweep.skipped).toEqual([]);
    // A vehicle that does not lean sweeps its handlebar instead.
    expect(sweep.swept).toBe(demo.resolved!.vehicle.tilting ? 'lean' : 'handlebar');
    const animated = await sweepGlb(demo.drawing!, sweep, name);
    for (const bytes of [pose.bytes, animated.bytes]) {
      const report = await validateBytes(bytes);
      expect([report.issues.numErrors, report.issues.numWarnings]).toEqual([0, 0]);
    }
    expect(readGlb(animated.bytes).json.nodes).toHaveLength(exportParts(demo.drawing!).length);
  }, 60_000);

  it('the validator finds errors in a damaged file (negative control)', async () => {
    const { bytes } = await poseGlb(layout, snap, 'Heron');
    const g = readGlb(bytes);
    g.json.scenes[0].nodes.push(g.json.nodes.length + 5);
    const text = new TextEncoder().encode(JSON.stringify(g.json).padEnd(Math.ceil(JSON.stringify(g.json).length / 4) * 4, ' '));
    const bin = new Uint8Array(g.bin.buffer, g.bin.byteOffset, g.bin.byteLength);
    const out = new Uint8Array(12 + 8 + text.length + 8 + bin.length);
    const v = new DataView(out.buffer);
    v.setUint32(0, 0x46546c67, true);
    v.setUint32(4, 2, true);
    v.setUint32(8, out.length, true);
    v.setUint32(12, text.length, true);
    v.setUint32(16, 0x4e4f534a, true);
    out.set(text, 20);
    v.setUint32(20 + text.length, bin.length, true);
    v.setUint32(24 + text.length, 0x004e4942, true);
    out.set(bin, 28 + text.length);
    expect((await errorsOf(out)).count).toBeGreaterThan(0);
  });
});
