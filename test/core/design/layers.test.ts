/**
 * core's folders are layers, lowest first: math < design < mechanism < solver < analysis < studies < report < cli.
 * A folder imports its own and lower ones only, so the design format can be read without the
 * mechanism, the solver without the measures. ESLint's no-restricted-imports enforces it
 * (eslint.config.js); these tests show the rule refuses what it should and allows the rest, and
 * read every import in core/ independently of ESLint.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(new URL('../../..', import.meta.url).pathname);
const LAYERS = ['math', 'design', 'mechanism', 'solver', 'analysis', 'studies', 'report', 'cli'];

async function restrictedImports(filePath: string, code: string): Promise<string[]> {
  const eslint = new ESLint({ cwd: ROOT });
  const [result] = await eslint.lintText(code, { filePath: join(ROOT, filePath) });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

describe('the layer rule in eslint.config.js', () => {
  it('refuses an import of a higher layer, naming the order', async () => {
    const messages = await restrictedImports('core/design/probe.ts', "import { buildMechanism } from '../mechanism/templates/buildMechanism';\nexport const b = buildMechanism;\n");
    expect(messages).toHaveLength(1);
    expect(messages[0]).toContain('math < design < mechanism < solver < analysis < studies < report < cli');
    expect(messages[0]).toContain('core/design may not import from core/mechanism');
  });

  it('refuses type-only imports and re-exports from above too', async () => {
    expect(await restrictedImports('core/math/probe.ts', "import type { Side } from '../design/types';\nexport type S = Side;\n")).toHaveLength(1);
    expect(await restrictedImports('core/solver/probe.ts', "export { runCheck } from '../cli/commands/check';\n")).toHaveLength(1);
  });

  it('allows the same layer and lower ones (negative control)', async () => {
    const code = "import { dot } from '../math/vec3';\nimport { SIDES } from '../design/types';\nimport type { MechanismGraph } from '../mechanism/MechanismGraph';\nexport const x = [dot, SIDES] as const;\nexport type G = MechanismGraph;\n";
    expect(await restrictedImports('core/analysis/probe.ts', code)).toEqual([]);
    expect(await restrictedImports('core/design/probe.ts', "import { SIDES } from './types';\nexport const s = SIDES;\n")).toEqual([]);
  });
});

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    return e.isDirectory() ? sourceFiles(p) : /\.tsx?$/.test(e.name) ? [p] : [];
  });
}

describe('every import in core/', () => {
  it('reaches only its own layer or a lower one', () => {
    const wrong: string[] = [];
    let checked = 0;
    for (const file of sourceFiles(join(ROOT, 'core'))) {
      const own = relative(join(ROOT, 'core'), file).split('/')[0];
      const ownLayer = LAYERS.indexOf(own);
      for (const m of readFileSync(file, 'utf8').matchAll(/(?:import|export)[^'"]*?from\s+'(\.[^']+)'/g)) {
        const target = relative(join(ROOT, 'core'), resolve(join(file, '..'), m[1])).split('/')[0];
        const targetLayer = LAYERS.indexOf(target);
        checked++;
        if (ownLayer >= 0 && targetLayer > ownLayer) wrong.push(`${relative(ROOT, file)} imports ${m[1]}`);
      }
    }
    expect(checked).toBeGreaterThan(100); // the scan found core's imports at all
    expect(wrong).toEqual([]);
  });
});
