import { describe, expect, test } from 'vitest';
import { parseJobDocument, type JobDocument } from '../../../src/lib/electrical';
import {
	changesService,
	feeFor,
	formatCents,
	parseDollars,
	sampleFeeJob,
} from '../../../src/lib/workflow/fees';
import { circuit, job } from '../electrical/job-builder';

const schedule = {
	feeBaseCents: 7_500,
	feePerCircuitCents: 1_250,
	feePerPanelCents: 4_000,
	feeServiceChangeCents: 15_000,
};

function doc(over: Parameters<typeof job>[0] = {}): JobDocument {
	const parsed = parseJobDocument(job(over));
	if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
	return parsed.doc;
}

const subpanel = {
	id: 'p2',
	name: 'Garage',
	kind: 'sub' as const,
	fedFromCircuitId: 'f',
	voltageSystem: '120/240-1ph-3w' as const,
	busRatingA: 100,
	mainBreakerA: null,
	spaces: 20,
};

describe('permit fees', () => {
	test('an addition to an existing house pays the base, each new or modified circuit and each panel', () => {
		const d = doc({
			panels: [...job().panels!, subpanel],
			circuits: [
				circuit({ id: 'a', position: 1, status: 'existing' }),
				circuit({ id: 'b', position: 3, status: 'new' }),
				circuit({ id: 'c', position: 5, status: 'modified' }),
				circuit({ id: 'd', position: 7, status: 'removed' }),
				circuit({
					id: 'f',
					position: 9,
					poles: 2,
					ratingA: 60,
					conductor: { size: '6', material: 'cu', insulationC: 90 },
					status: 'new',
				}),
			],
		});
		const fee = feeFor(schedule, d);
		// Hand: 75.00 + 3 circuits × 12.50 + 2 panels × 40.00 = 75.00 + 37.50 + 80.00 = 192.50; no service change.
		expect(fee.lines.map((l) => [l.key, l.quantity, l.amountCents])).toEqual([
			['base', 1, 7_500],
			['circuits', 3, 3_750],
			['panels', 2, 8_000],
		]);
		expect(fee.totalCents).toBe(19_250);
		expect(formatCents(fee.totalCents)).toBe('192.50');
	});

	test('a job that records no existing load or circuit installs a new service and pays the service change fee', () => {
		const d = doc({ circuits: [circuit({ id: 'a', position: 1 }), circuit({ id: 'b', position: 3 })] });
		expect(changesService(d)).toBe(true);
		const fee = feeFor(schedule, d);
		// Hand: 75.00 + 2 × 12.50 + 1 × 40.00 + 150.00 = 290.00.
		expect(fee.lines.at(-1)).toEqual({
			key: 'service-change',
			label: 'Service change',
			quantity: 1,
			unitCents: 15_000,
			amountCents: 15_000,
		});
		expect(fee.totalCents).toBe(29_000);
	});

	test('a measured existing load keeps the service unless the caller says it changes', () => {
		const d = doc({
			service: {
				ratingA: 200,
				voltageSystem: '120/240-1ph-3w',
				existingLoad: { method: 'measured-peak', peakDemandKW: 9 },
			},
			circuits: [circuit({ id: 'a', position: 1 })],
		});
		expect(feeFor(schedule, d).lines.map((l) => l.key)).not.toContain('service-change');
		expect(feeFor(schedule, d, { serviceChange: true }).totalCents).toBe(7_500 + 1_250 + 4_000 + 15_000);
	});

	test('the settings page’s sample job counts its circuits and panels and changes the service only when asked', () => {
		// Hand: 75.00 + 8 × 12.50 + 2 × 40.00 (+ 150.00) = 255.00 (405.00).
		expect(feeFor(schedule, sampleFeeJob(8, 2, false)).totalCents).toBe(25_500);
		expect(feeFor(schedule, sampleFeeJob(8, 2, true)).totalCents).toBe(40_500);
	});

	test('a schedule of zeros charges nothing', () => {
		const zero = { feeBaseCents: 0, feePerCircuitCents: 0, feePerPanelCents: 0, feeServiceChangeCents: 0 };
		expect(feeFor(zero, doc({ circuits: [circuit({ id: 'a', position: 1 })] })).totalCents).toBe(0);
	});

	test.each([
		[0, '0.00'],
		[5, '0.05'],
		[123_456, '1,234.56'],
		[100_000_000, '1,000,000.00'],
	])('%i cents are shown as %s', (cents, shown) => {
		expect(formatCents(cents)).toBe(shown);
	});

	test.each([
		['12', 1_200],
		['12.5', 1_250],
		['1,234.56', 123_456],
		[' 0.07 ', 7],
		['12.345', null],
		['-3', null],
		['ten', null],
		['', null],
	])('the typed amount "%s" is %s cents', (text, cents) => {
		expect(parseDollars(text)).toBe(cents);
	});
});
