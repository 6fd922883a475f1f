import { describe, expect, test } from 'vitest';
import { permitPatternSchema } from '../../../src/lib/schemas/jurisdiction';
import { formatPermitNumber, permitPeriod } from '../../../src/lib/workflow/permit-number';

describe('permit number patterns', () => {
	test.each([
		['E{YYYY}-{SEQ:5}', 2026, 17, 'E2026-00017'],
		['E{YYYY}-{SEQ:5}', 2027, 1, 'E2027-00001'],
		['QC-EL-{SEQ:4}', 2026, 412, 'QC-EL-0412'],
		['{YYYY}/{SEQ:3}/ELEC', 2026, 9, '2026/009/ELEC'],
		['P {SEQ:1}', 2026, 7, 'P 7'],
		// A number longer than its field is printed whole, never cut to a number already issued.
		['E{YYYY}-{SEQ:2}', 2026, 123, 'E2026-123'],
		['{SEQ:3}-{YYYY}-{SEQ:3}', 2026, 5, '005-2026-005'],
	])('%s in %i with number %i reads %s', (pattern, year, seq, expected) => {
		expect(permitPatternSchema.safeParse(pattern).success).toBe(true);
		expect(formatPermitNumber(pattern, year, seq)).toBe(expected);
	});

	test.each([
		['E{YYYY}-{SEQ:5}', '2026'],
		['{YYYY}{SEQ:4}', '2026'],
		['QC-EL-{SEQ:4}', ''],
	])('%s counts on the period “%s”', (pattern, period) => {
		expect(permitPeriod(pattern, 2026)).toBe(period);
	});
});
