/**
 * Writes docs/job-format.schema.json from the zod schemas (the committed copy is checked by
 * tests/unit/electrical/job-schema.test.ts).  npx tsx scripts/gen-job-schema.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { jobSchemaText } from '../src/lib/electrical/json-schema';

const target = fileURLToPath(new URL('../docs/job-format.schema.json', import.meta.url));
writeFileSync(target, jobSchemaText());
process.stdout.write(`wrote ${target}\n`);
