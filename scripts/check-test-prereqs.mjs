#!/usr/bin/env node
// Runs before `npm test` (the "pretest" script): the suite needs three things npm cannot
// install, Debian's Chromium (end-to-end tests, test/e2e/support/chromium.ts, and the report's
// PDF), python3 with SciPy and NumPy (the independent SciPy solve and the predictor's
// numpy.polyfit check) and pdftoppm from poppler-utils (the report's PDF turned into pages).
// Without them the run would fail test by test, minutes in; instead this stops at once with
// the one command that installs them. On CI (CI=true) running as root with apt-get, it
// installs them itself, as .ci/run does.
import { spawnSync } from 'node:child_process';
import { accessSync, constants } from 'node:fs';

const CHROMIUM = process.env.TILTBENCH_CHROMIUM ?? '/usr/bin/chromium';
const PYTHON = '/usr/bin/python3';
const PDFTOPPM = '/usr/bin/pdftoppm';
const PACKAGES = ['chromium', 'python3-scipy', 'poppler-utils'];

/** What is missing, each with the Debian package that brings it. */
function missing() {
  const out = [];
  try {
    accessSync(CHROMIUM, constants.X_OK);
  } catch {
    out.push({ what: `${CHROMIUM} (end-to-end tests)`, pkg: 'chromium' });
  }
  const probe = spawnSync(PYTHON, ['-c', 'import scipy, numpy'], { stdio: 'ignore' });
  if (probe.error || probe.status !== 0) out.push({ what: `${PYTHON} with SciPy and NumPy (SciPy cross-check)`, pkg: 'python3-scipy' });
  try {
    accessSync(PDFTOPPM, constants.X_OK);
  } catch {
    out.push({ what: `${PDFTOPPM} (the report's PDF checked page by page)`, pkg: 'poppler-utils' });
  }
  return out;
}

function run(cmd, args) {
  console.log(`check-test-prereqs: ${cmd} ${args.join(' ')}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  return r.status === 0;
}

let gaps = missing();
if (gaps.length === 0) process.exit(0);

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const hasApt = spawnSync('apt-get', ['--version'], { stdio: 'ignore' }).status === 0;
const onCi = process.env.CI === 'true' || process.env.CI === '1';
const wanted = [...new Set(gaps.map((g) => g.pkg))];

if (onCi && isRoot && hasApt) {
  if (run('apt-get', ['update', '-qq']) && run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...wanted])) {
    gaps = missing();
    if (gaps.length === 0) process.exit(0);
  }
}

const command = `${isRoot ? '' : 'sudo '}apt-get install ${PACKAGES.join(' ')}`;
console.error(
  [
    'npm test needs what npm cannot install; missing:',
    ...gaps.map((g) => `  - ${g.what}`),
    'Install them (Debian) with:',
    `  ${command}`,
    'then run npm test again.',
  ].join('\n'),
);
process.exit(1);
