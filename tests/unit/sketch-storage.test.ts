import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { cleanOriginalName, inlineDisposition, sketchPaths, uploadsRoot } from '../../src/lib/sketch-storage';

const JOB = '3f0c9a52-6d1e-4c1b-9a57-2b8e4f1d0c77';
const STORED = '8d1f2c3a-4b5e-4f60-8a71-9c0d1e2f3a4b.png';

describe('original file names are kept as plain text only', () => {
	test.each([
		['a plain name', 'kitchen plan.png', 'kitchen plan.png'],
		['a name climbing out with ../', '../../../etc/passwd', 'passwd'],
		['a Windows path', 'C:\\Users\\sketch\\plan.jpg', 'plan.jpg'],
		['control characters', 'plan\u0000\n\r.pdf', 'plan.pdf'],
		['nothing at all', '', 'sketch.png'],
		['only dots', '..', 'sketch.png'],
		['a name ending in a slash', 'plans/', 'sketch.png'],
		['an overlong name', `${'p'.repeat(300)}.png`, 'p'.repeat(200)],
	])('%s', (_label, input, expected) => {
		expect(cleanOriginalName(input, 'png')).toBe(expected);
	});
});

// RFC 6266 section 4.3: a quoted ASCII filename for old clients and filename* (RFC 8187) for the rest.
describe('download headers name the file safely', () => {
	test.each([
		['a plain name', 'plan.png', 'inline; filename="plan.png"; filename*=UTF-8\'\'plan.png'],
		[
			'quotes and semicolons',
			'Plan "A"; v2.pdf',
			'inline; filename="Plan _A__ v2.pdf"; filename*=UTF-8\'\'Plan%20%22A%22%3B%20v2.pdf',
		],
		[
			'letters outside ASCII',
			'Küche (neu).jpg',
			'inline; filename="K_che (neu).jpg"; filename*=UTF-8\'\'K%C3%BCche%20%28neu%29.jpg',
		],
	])('%s', (_label, name, expected) => {
		expect(inlineDisposition(name)).toBe(expected);
	});
});

describe('paths on disk come only from a job id and a stored name', () => {
	test('a stored sketch and its thumbnail sit in the job’s folder under the uploads root', () => {
		const { file, thumbnail } = sketchPaths({ job_id: JOB, stored_name: STORED });
		expect(file).toBe(path.join(uploadsRoot(), JOB, STORED));
		expect(thumbnail).toBe(`${file}.thumb.png`);
	});

	test.each([
		['a stored name with ../', { job_id: JOB, stored_name: '../../escape.png' }],
		[
			'a stored name with another extension',
			{ job_id: JOB, stored_name: '8d1f2c3a-4b5e-4f60-8a71-9c0d1e2f3a4b.svg' },
		],
		['a job id that is a path', { job_id: '../other', stored_name: STORED }],
	])('%s is refused', (_label, row) => {
		expect(() => sketchPaths(row)).toThrow();
	});
});
