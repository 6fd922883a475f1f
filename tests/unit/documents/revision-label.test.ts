import { describe, expect, test } from 'vitest';
import { sheetLabel } from '../../../src/lib/documents/assemble';
import { revisionText } from '../../../src/lib/documents/revision';

describe('the revision printed on documents', () => {
	test.each([
		[1, false, 'rev 1'],
		[4, false, 'rev 4'],
		[1, true, 'rev 1 draft (not submitted)'],
		[3, true, 'rev 3 draft (not submitted)'],
	])('revision %i, draft %s, reads “%s”', (n, draft, words) => {
		expect(revisionText(n, draft)).toBe(words);
	});

	test('a sheet footer names the sheet, the job and the submission revision', () => {
		expect(sheetLabel(1, 9, 'Kitchen remodel', 2)).toBe('Sheet 2 of 9 · Kitchen remodel · rev 2');
		expect(sheetLabel(0, 9, 'Kitchen remodel', 3, true)).toBe(
			'Sheet 1 of 9 · Kitchen remodel · rev 3 draft (not submitted)',
		);
	});
});
