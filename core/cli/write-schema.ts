/**
 * Writes the design file's JSON Schema to assets/tiltsheet.schema.json.
 *
 *   npx tsx core/cli/write-schema.ts          write (or rewrite) the file
 *   npx tsx core/cli/write-schema.ts --check  exit 1 if the file is missing or out of date
 */
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { designJsonSchema } from '../design/jsonSchema';

const target = fileURLToPath(new URL('../../assets/tiltsheet.schema.json', import.meta.url));
const text = `${JSON.stringify(designJsonSchema(), null, 2)}\n`;

if (process.argv.includes('--check')) {
  const current = existsSync(target) ? readFileSync(target, 'utf8') : '';
  if (current !== text) {
    console.error(`${target} is out of date; run: npx tsx core/cli/write-schema.ts`);
    process.exit(1);
  }
  console.log(`${target} is up to date`);
} else {
  writeFileSync(target, text);
  console.log(`wrote ${target}`);
}
