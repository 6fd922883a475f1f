import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { jobSchemaText } from '../../../src/lib/electrical/index';

describe('docs/job-format.schema.json', () => {
	test('is in step with the zod schemas (regenerate with npx tsx scripts/gen-job-schema.ts)', () => {
		const committed = readFileSync(new URL('../../../docs/job-format.schema.json', import.meta.url), 'utf8');
		expect(committed).toBe(jobSchemaText());
	});
});
