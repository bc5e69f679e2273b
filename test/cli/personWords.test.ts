// What a person reads carries words, not the program's identifiers: no camelCase token
// (`upperOuter`, `tieRodInner`, `tieRod-upperArm`) in the CLI's text, in the JSON fields meant
// for people (labels, messages, details, limits, reasons, findings, notes), in the chart legends
// core's curves carry, or in the alerts (findings) of a pose. Machine keys (JSON property names,
// sweep column names) are not words for a person and are not scanned.
import { describe, it, expect } from 'vitest';
import { join } from 'node:path';
import { main } from '../../core/cli/main';
import type { CliIo } from '../../core/cli/io';
import { CURVE_KINDS, curve } from '../../core/analysis/curves';
import { demo } from '../core/analysis/helpers';

const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');
const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');
const LINNET = join(DESIGNS, 'linnet-track-rod-trike.tiltsheet');
const FINCH = join(DESIGNS, 'finch-knuckle-steered-trike.tiltsheet');

async function run(argv: string[]) {
  const io: CliIo & { text: string } = {
    text: '',
    isTty: false,
    out(t: string) {
      io.text += t;
    },
    err(t: string) {
      io.text += t;
    },
  };
  const code = await main(argv, io);
  return { code, text: io.text };
}

const CAMEL = /\b[a-z]+[A-Z][A-Za-z0-9]*\b/g;

/** camelCase tokens of a text, with the line they stand in. */
function identifiersIn(text: string): string[] {
  return text.split('\n').flatMap((line) => [...line.matchAll(CAMEL)].map((m) => `${m[0]} in "${line.trim().slice(0, 100)}"`));
}

const PERSON_FIELDS = new Set(['label', 'title', 'message', 'detail', 'limit', 'culprit', 'reason', 'findings', 'info', 'notes', 'caution']);

/** camelCase tokens in the string values of the fields meant for a person, anywhere in a JSON value. */
function identifiersInJson(value: unknown, key = ''): string[] {
  if (typeof value === 'string') return PERSON_FIELDS.has(key) || key.endsWith('Reason') ? identifiersIn(value) : [];
  if (Array.isArray(value)) return value.flatMap((v) => identifiersInJson(v, key));
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => identifiersInJson(v, k));
  return [];
}

describe('words for a person, not identifiers', () => {
  it('negative control: the scan finds an identifier in text and in a JSON label', () => {
    expect(identifiersIn('right upperOuter joint at 30 deg')).toHaveLength(1);
    expect(identifiersInJson({ items: [{ label: 'clearance tieRod-upperArm, left' }] })).toHaveLength(2);
    expect(identifiersInJson({ leanDeg: 3, label: 'lean' })).toEqual([]);
  });

  it('pose, ride, check and a pose past the steering limit print words only (text and JSON)', async () => {
    const runs = [
      ['pose', HERON, '--lean', '10', '--steer', '5'],
      ['pose', HERON, '--speed', '20', '--steer', '4'],
      ['pose', HERON, '--steer', '100'],
      ['pose', WREN, '--steer', '-12'],
      ['pose', LINNET, '--steer', '30'],
      ['pose', FINCH, '--lean', '20', '--steer', '10'],
      ['check', FINCH, '--lean-step', '17.5', '--steer-step', '12.5'],
      ['check', HERON, '--lean-step', '12.5', '--steer-step', '12.5', '--travel-step', '35'],
      ['validate', HERON],
    ];
    for (const argv of runs) {
      const text = await run(argv);
      expect(identifiersIn(text.text), argv.join(' ')).toEqual([]);
      if (argv[0] === 'validate') continue;
      const json = await run([...argv, '--json']);
      expect(identifiersInJson(JSON.parse(json.text)), `${argv.join(' ')} --json`).toEqual([]);
    }
  }, 120_000);

  it("core's curve legends and a pose's findings use words", () => {
    const design = demo('heron-tilting-velomobile');
    for (const kind of CURVE_KINDS) {
      const c = curve(design, kind, { values: kind === 'bumpSteer' || kind === 'camberTravel' ? [-10, 0, 10] : [0, 5, 10] });
      expect(identifiersInJson(c), kind).toEqual([]);
    }
  });
});
