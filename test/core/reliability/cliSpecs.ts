/**
 * Every command and output mode of `tiltbench`, as argument lists for the fuzz: each with
 * small settings (a coarse grid, one study pose, two samples) so a run on a valid design takes
 * well under a second, and a generator of odd option values per option.
 */
import fc from 'fast-check';
import { join } from 'node:path';
import { HOSTILE_TEXT } from './fileMutations';

/** The invented measurement sheet of the Wren demo (any design can be fitted to it). */
const MEASUREMENTS = join(__dirname, '..', '..', '..', 'assets', 'designs', 'measurements', 'wren-rack-trike.measurements.csv');

export interface CommandSpec {
  /** e.g. "sweep csv". */
  mode: string;
  argv(design: string, dir: string, other: string): string[];
}

export const COMMAND_SPECS: CommandSpec[] = [
  { mode: 'validate', argv: (d) => ['validate', d] },
  { mode: 'pose text', argv: (d) => ['pose', d, '--lean', '10', '--steer', '-15'] },
  { mode: 'pose json', argv: (d) => ['pose', d, '--lean', '-5', '--steer', '20', '--travel', '15', '--json'] },
  { mode: 'pose speed json', argv: (d) => ['pose', d, '--speed', '25', '--steer', '10', '--json'] },
  { mode: 'pose wheel-angle', argv: (d) => ['pose', d, '--wheel-angle', '12', '--wheel', 'right'] },
  { mode: 'pose hold json', argv: (d) => ['pose', d, '--hold', 'suspension', '--steer', '15', '--json'] },
  { mode: 'sweep csv', argv: (d, dir) => ['sweep', d, '--lean', '0:10:10', '--steer', '-10:10:10', '--travel', '0:20:20', '--out', join(dir, 'sweep.csv')] },
  { mode: 'sweep json', argv: (d, dir) => ['sweep', d, '--steer', '-10:10:10', '--contact', 'travel', '--out', join(dir, 'sweep.json')] },
  { mode: 'sweep hold csv', argv: (d, dir) => ['sweep', d, '--hold', 'suspension', '--steer', '-20:20:20', '--out', join(dir, 'hold.csv')] },
  { mode: 'ride sweep csv', argv: (d, dir) => ['sweep', d, '--speed', '10:20:10', '--steer', '5:10:5', '--out', join(dir, 'ride.csv')] },
  { mode: 'ride sweep json', argv: (d, dir) => ['sweep', d, '--speed', '15:15:1', '--steer', '-10:10:20', '--out', join(dir, 'ride.json')] },
  { mode: 'check text', argv: (d) => ['check', d, '--lean-step', '30', '--steer-step', '30', '--travel-step', '200'] },
  { mode: 'check json full', argv: (d) => ['check', d, '--lean-step', '30', '--steer-step', '30', '--travel-step', '200', '--region', 'full', '--json'] },
  { mode: 'sensitivity text', argv: (d) => ['sensitivity', d, '--poses', '5,5', '--top', '2'] },
  { mode: 'sensitivity json', argv: (d) => ['sensitivity', d, '--poses', '0,10', '--each-side', '--json'] },
  { mode: 'tolerance text', argv: (d) => ['tolerance', d, '--samples', '2', '--poses', '5,5'] },
  { mode: 'tolerance json first-order', argv: (d) => ['tolerance', d, '--method', 'first-order', '--samples', '50', '--poses', '5,5', '--json'] },
  { mode: 'compare text', argv: (d, _dir, o) => ['compare', d, o, '--poses', '5,5'] },
  { mode: 'compare json', argv: (d, _dir, o) => ['compare', o, d, '--poses', '0,0', '--json'] },
  { mode: 'tune list', argv: (d) => ['tune', d, '--list-variables'] },
  { mode: 'tune suggest json', argv: (d) => ['tune', d, '--suggest', '--json'] },
  { mode: 'fit text', argv: (d, dir) => ['fit', d, '--measurements', MEASUREMENTS, '--vary', 'steering.tieRodJoint:y', '--out', join(dir, 'fitted.tiltsheet')] },
  { mode: 'hardpoints table', argv: (d, dir) => ['hardpoints', d, '--out', join(dir, 'table.csv')] },
  { mode: 'tune suggest written', argv: (d, dir) => ['tune', d, '--suggest', 'tie-rods', '--out', join(dir, 'proposed.tiltsheet')] },
  // The whole report on a coarse check grid and map (the default grid is the check's: seconds a demo).
  { mode: 'report html', argv: (d, dir) => ['report', d, '--out', join(dir, 'report.html'), '--lean-step', '30', '--steer-step', '30', '--travel-step', '200', '--map-step', '15'] },
];

const NUMBERS = ['0', '5', '-5', '90', '-90', '91', '1080', '-1081', '1e300', '-1e-300', '1e400', 'NaN', 'Infinity', '', ' ', '12mm', '0x10', '1,5', '--5'];
const RANGES = ['0:10:10', '-20:20:20', '::1', '1:2', '0:10:0', '0:10:-1', '5:5:1', '0:1e6:1', '-2000:0:1000', '0:10:1e-9', 'a:b:c', '1:2:3:4', '0:90:45'];
// No step that makes a grid just under the limit: a run must stay short (a step of 1e-9 is refused).
const STEPS = ['30', '45', '0', '-1', '1e-9', 'abc', '', '1e300'];
const WORDS = ['difference', 'ground', 'travel', 'suspension', 'operating', 'full', 'left', 'right', 'monte-carlo', 'first-order', 'normal', 'uniform', 'secant', 'sideways', ''];

/** Values an option is fuzzed with: its own kind, hostile text, and the odd cases of each. */
export const OPTION_VALUES: Record<string, fc.Arbitrary<string>> = {
  number: fc.oneof(fc.constantFrom(...NUMBERS), fc.double({ min: -2000, max: 2000, noNaN: true }).map(String)),
  range: fc.constantFrom(...RANGES),
  step: fc.constantFrom(...STEPS),
  word: fc.constantFrom(...WORDS),
  poses: fc.constantFrom('5,5', '0,0;10,-10,20', '', ';;', '5', '1,2,3,4', 'x,y', '0,5000', Array.from({ length: 60 }, () => '1,1').join(';')),
  count: fc.constantFrom('1', '2', '0', '-1', '1e9', '2.5', 'x', ''),
  hostile: fc.constantFrom(...HOSTILE_TEXT),
};

/** The options of each command and the kind of value each takes (flags: null). */
export const COMMAND_OPTIONS: Record<string, Record<string, keyof typeof OPTION_VALUES | null>> = {
  validate: {},
  pose: { lean: 'number', speed: 'number', steer: 'number', travel: 'number', 'travel-left': 'number', 'travel-right': 'number', heave: 'number', 'wheel-angle': 'number', wheel: 'word', hold: 'word', 'on-ground': null, json: null },
  sweep: { lean: 'range', steer: 'range', travel: 'range', speed: 'range', contact: 'word', hold: 'word' },
  check: { 'lean-step': 'step', 'steer-step': 'step', 'travel-step': 'step', contact: 'word', region: 'word', json: null },
  sensitivity: { poses: 'poses', step: 'number', top: 'count', 'each-side': null, json: null },
  tolerance: { samples: 'count', seed: 'count', band: 'number', distribution: 'word', method: 'word', poses: 'poses', json: null },
  // compare is given a second design after the options; tune without a plan lists or proposes.
  // compare --check runs each design's whole default check (about 5 s a demo on a 2-core machine,
  // 11 s for two at FUZZ_RUNS=3): bounded work, but past the fuzz's 10 s, so it is left out here.
  compare: { poses: 'poses', 'all-hardpoints': null, json: null },
  tune: { 'list-variables': null, suggest: null, jacobian: 'word', json: null },
};

/** Options a heavy command always gets unless the fuzz sets them, so no run does a long job. */
export const SMALL_DEFAULTS: Record<string, string[]> = {
  sweep: ['--steer', '0:10:10'],
  check: ['--lean-step', '30', '--steer-step', '30', '--travel-step', '200'],
  sensitivity: ['--poses', '5,5'],
  tolerance: ['--samples', '2', '--poses', '5,5'],
};
