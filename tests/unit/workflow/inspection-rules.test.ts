import { describe, expect, test } from 'vitest';
import { inspectionRequestSchema, lastBookableIso, todayIso } from '../../../src/lib/schemas/inspection';
import { requestBlock } from '../../../src/lib/workflow/inspection-rules';
import { JOB_STATUSES } from '../../../src/lib/workflow/status';

describe('when an inspection may be requested', () => {
	const open = {
		'rough-in': ['approved', 'rough-in-failed'],
		final: ['rough-in-passed', 'final-failed'],
	} as const;

	test.each(JOB_STATUSES.flatMap((s) => (['rough-in', 'final'] as const).map((k) => [k, s] as const)))(
		'a %s request from “%s” is allowed only at its step',
		(kind, status) => {
			const block = requestBlock(kind, status, [], 0);
			if ((open[kind] as readonly string[]).includes(status)) expect(block).toBeNull();
			else expect(block).toMatch(kind === 'rough-in' ? /once the permit is approved/ : /after the rough-in/);
		},
	);

	test('an open request of the same kind blocks a second one, but not one of the other kind', () => {
		expect(requestBlock('rough-in', 'approved', ['rough-in'], 0)).toMatch(/already requested/);
		expect(requestBlock('final', 'rough-in-passed', ['rough-in'], 0)).toBeNull();
	});

	test('unanswered correction items block a new request and say how many are open', () => {
		expect(requestBlock('rough-in', 'rough-in-failed', [], 3)).toBe(
			'Answer every correction item of the failed inspection first (3 still open).',
		);
	});
});

describe('the dates of a request', () => {
	const now = new Date('2026-12-31T23:30:00Z');

	test('today and one year ahead are counted in UTC, across the end of a year', () => {
		expect(todayIso(now)).toBe('2026-12-31');
		expect(lastBookableIso(now)).toBe('2027-12-31');
		expect(lastBookableIso(new Date('2028-02-29T10:00:00Z'))).toBe('2029-03-01');
	});

	test.each([
		[[todayIso()], true],
		[[lastBookableIso()], true],
		[['2024-02-29'], false],
		[['2027-13-01'], false],
	])('preferred dates %j are accepted: %s', (dates, ok) => {
		expect(inspectionRequestSchema.safeParse({ kind: 'final', preferredDates: dates }).success).toBe(ok);
	});
});
