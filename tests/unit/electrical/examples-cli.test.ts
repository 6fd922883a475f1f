import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { computeJob, formatJobReport, parseJobDocument } from '../../../src/lib/electrical/index';
import { badValues } from './job-builder';

const root = new URL('../../../', import.meta.url).pathname;
const examples = readdirSync(join(root, 'examples')).filter((f) => f.endsWith('.json'));

function calc(...args: string[]) {
	return spawnSync(process.execPath, ['--import', 'tsx', join(root, 'scripts/calc.ts'), ...args], {
		cwd: root,
		encoding: 'utf8',
	});
}

describe('example jobs', () => {
	test('there are two', () => {
		expect(examples.length).toBe(2);
	});

	test.each(examples)('%s parses, computes without NaN or undefined, and has no violations', (file) => {
		const parsed = parseJobDocument(JSON.parse(readFileSync(join(root, 'examples', file), 'utf8')));
		expect(parsed.ok ? [] : parsed.errors).toEqual([]);
		if (!parsed.ok) return;
		const r = computeJob(parsed.doc);
		expect(badValues(r)).toEqual([]);
		expect(r.summary.violation).toBe(0);
		expect(formatJobReport(r)).toContain('== SERVICE ==');
	});
});

describe('npm run calc', () => {
	test('prints JSON and exits 0 for a valid job', () => {
		const out = calc(join('examples', examples[0] as string));
		expect(out.status).toBe(0);
		expect(JSON.parse(out.stdout).service.methods.length).toBe(4);
	});

	test('prints a text report with --format text', () => {
		const out = calc(join('examples', examples[0] as string), '--format', 'text');
		expect(out.status).toBe(0);
		expect(out.stdout).toContain('Standard method');
	});

	test.each([
		['an invalid document', '{"formatVersion":1}', 'name: is required'],
		['a file that is not JSON', '{ not json', 'not valid JSON'],
	])('exits 2 with the messages on stderr for %s', (_what, text, message) => {
		const dir = mkdtempSync(join(tmpdir(), 'calc-'));
		const file = join(dir, 'job.json');
		writeFileSync(file, text);
		const out = calc(file);
		expect(out.status).toBe(2);
		expect(out.stderr).toContain(message);
		expect(out.stdout).toBe('');
	});

	test('exits 2 for a file that does not exist', () => {
		const out = calc('/nonexistent/job.json');
		expect(out.status).toBe(2);
		expect(out.stderr).toContain('cannot read the file');
	});
});
