import { describe, expect, test } from 'vitest';
import { computeJob, parseJobDocument } from '../../../src/lib/electrical/index';
import type { JobDocumentInput, JobResult, MethodId } from '../../../src/lib/electrical/index';
import { circuit, job, load } from './job-builder';

function run(input: JobDocumentInput): JobResult {
	const parsed = parseJobDocument(input);
	if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
	return computeJob(parsed.doc);
}

function method(r: JobResult, id: MethodId) {
	const m = r.service.methods.find((x) => x.method === id);
	if (!m) throw new Error(`no method ${id}`);
	return m;
}

function lineValue(lines: readonly { key: string; value: number }[], key: string): number {
	const l = lines.find((x) => x.key === key);
	if (!l) throw new Error(`no line ${key}`);
	return l.value;
}

/** NEC Informative Annex D, Example D1(a): 1500 ft², 12 kW range, 5.5 kW dryer, 2 small-appliance + 1 laundry circuit, 120/240 V. */
function annexD1a(extra: Partial<JobDocumentInput> = {}): JobDocumentInput {
	return job({
		floorAreaFt2: 1500,
		service: { ratingA: 100, voltageSystem: '120/240-1ph-3w' },
		circuits: [
			circuit({ id: 'sa1', position: 1 }),
			circuit({ id: 'sa2', position: 2 }),
			circuit({ id: 'laundry', position: 3 }),
			circuit({
				id: 'range',
				position: 5,
				poles: 2,
				ratingA: 40,
				conductor: { size: '8', material: 'cu', insulationC: 75 },
			}),
			circuit({
				id: 'dryer',
				position: 6,
				poles: 2,
				ratingA: 30,
				conductor: { size: '10', material: 'cu', insulationC: 75 },
			}),
		],
		loads: [
			load({ circuitId: 'sa1', kind: 'small-appliance', va: 1500 }),
			load({ circuitId: 'sa2', kind: 'small-appliance', va: 1500 }),
			load({ circuitId: 'laundry', kind: 'laundry', va: 1500 }),
			load({ circuitId: 'range', kind: 'range', watts: 12_000, voltage: 240 }),
			load({ circuitId: 'dryer', kind: 'dryer', watts: 5500, voltage: 240 }),
		],
		...extra,
	});
}

describe('Annex D Example D1(a), standard method', () => {
	const r = run(annexD1a());
	const std = method(r, 'standard');

	test('reproduces the example line by line', () => {
		// NFPA 70 (NEC) Informative Annex D, Example D1(a) (nec-check-values.md, worked example).
		expect(lineValue(std.lines, 'general-lighting')).toBe(4500); // 1500 × 3
		expect(lineValue(std.lines, 'small-appliance')).toBe(3000); // 2 × 1500
		expect(lineValue(std.lines, 'laundry')).toBe(1500);
		expect(lineValue(std.lines, 'general-subtotal')).toBe(9000);
		expect(lineValue(std.lines, 'general-demand')).toBe(5100); // 3000 + 6000 × 35 %
		expect(lineValue(std.lines, 'cooking')).toBe(8000); // Table 220.55 Column C
		expect(lineValue(std.lines, 'dryers')).toBe(5500);
		expect(std.totalVA?.value).toBe(18_600);
	});

	test('gives 77.5 A, written as 78 A, and a 100 A minimum service', () => {
		// Annex D, Example D1(a): 18,600 / 240 = 77.5 → 78 A; minimum 100 A (230.42(B), 230.79).
		expect(std.amps?.value).toBe(77.5);
		expect(std.ampsRounded?.value).toBe(78);
		expect(std.minimumServiceA?.value).toBe(100);
		expect(std.headroomA?.value).toBe(22);
	});

	test('gives a neutral of 14,550 VA and 61 A', () => {
		// Annex D, Example D1(a): 5100 + 0.70 × 8000 + 0.70 × 5500 = 14,550 VA, 61 A (220.61(B)(1)).
		expect(lineValue(r.service.neutral.lines, 'neutral-general')).toBe(5100);
		expect(lineValue(r.service.neutral.lines, 'neutral-cooking')).toBe(5600);
		expect(lineValue(r.service.neutral.lines, 'neutral-dryers')).toBe(3850);
		expect(r.service.neutral.totalVA.value).toBe(14_550);
		expect(r.service.neutral.ampsRounded.value).toBe(61);
	});

	test('shows the working and the edition beside each line', () => {
		const demand = std.lines.find((l) => l.key === 'general-demand');
		expect(demand?.rule).toBe('NEC 2023 Table 220.45');
		expect(demand?.working).toContain('6,000 VA × 35 % = 2,100 VA');
		expect(std.ampsRounded?.working).toContain('77.5 A → 78 A');
	});

	test('names the lighting sections of older editions', () => {
		// nec-check-values.md: general lighting Table 220.12 (2017), 220.14(J) (2020); demand Table 220.42 through 2020.
		const r17 = run(annexD1a({ codeEdition: '2017' }));
		const r20 = run(annexD1a({ codeEdition: '2020' }));
		const gl = (x: JobResult) => method(x, 'standard').lines.find((l) => l.key === 'general-lighting')?.rule;
		expect(gl(r17)).toBe('NEC 2017 220.12, Table 220.12');
		expect(gl(r20)).toBe('NEC 2020 220.14(J)');
		expect(method(r20, 'standard').lines.find((l) => l.key === 'general-demand')?.rule).toBe(
			'NEC 2020 Table 220.42',
		);
		expect(method(r17, 'standard').totalVA?.value).toBe(18_600);
	});
});

describe('optional method, 220.82 (our worked examples)', () => {
	test('the Annex D house without heating or cooling comes to 16,600 VA, 69 A', () => {
		// Hand: general load 4500 + 3000 + 1500 + 12,000 range + 5500 dryer = 26,500 VA (220.82(B), nameplate).
		// First 10,000 at 100 % + 16,500 × 40 % = 10,000 + 6600 = 16,600 VA; 16,600 / 240 = 69.17 → 69 A.
		const m = method(run(annexD1a()), 'optional');
		expect(m.applicable).toBe(true);
		expect(lineValue(m.lines, 'general-subtotal')).toBe(26_500);
		expect(m.totalVA?.value).toBe(16_600);
		expect(m.ampsRounded?.value).toBe(69);
	});

	test('adding 10 kW central heat and 5 kVA air conditioning takes heat at 65 %', () => {
		// Hand, 220.82(C): A/C 5000 × 100 % = 5000; central heat (one unit, fewer than four) 10,000 × 65 % = 6500.
		// Larger is 6500; total 16,600 + 6500 = 23,100 VA; 23,100 / 240 = 96.25 → 96 A.
		// Standard method for comparison: 18,600 + max(10,000, 5000) = 28,600 VA → 119.17 → 119 A.
		const base = annexD1a();
		const r = run({
			...base,
			circuits: [
				...(base.circuits ?? []),
				circuit({
					id: 'heat',
					position: 9,
					poles: 2,
					ratingA: 60,
					conductor: { size: '6', material: 'cu', insulationC: 75 },
				}),
				circuit({
					id: 'ac',
					position: 10,
					poles: 2,
					ratingA: 30,
					conductor: { size: '10', material: 'cu', insulationC: 75 },
				}),
			],
			loads: [
				...(base.loads ?? []),
				load({ circuitId: 'heat', kind: 'hvac-heat', watts: 10_000, voltage: 240, spaceHeating: 'central' }),
				load({ circuitId: 'ac', kind: 'hvac-cool', va: 5000, voltage: 240 }),
			],
		});
		const opt = method(r, 'optional');
		expect(lineValue(opt.lines, 'heating-cooling')).toBe(6500);
		expect(opt.totalVA?.value).toBe(23_100);
		expect(opt.ampsRounded?.value).toBe(96);
		expect(method(r, 'standard').totalVA?.value).toBe(28_600);
		expect(method(r, 'standard').ampsRounded?.value).toBe(119);
		expect(r.service.lowestMethod).toBe('optional');
	});

	test('is not offered for a three-phase four-wire service', () => {
		// NFPA 70 (NEC) 2023, 220.82(A): 120/240 V or 208Y/120 V 3-wire service or feeder (nec-check-values.md).
		const r = run(annexD1a({ service: { ratingA: 100, voltageSystem: '208Y/120-3ph-4w' } }));
		expect(method(r, 'optional').applicable).toBe(false);
		expect(method(r, 'optional').totalVA).toBeNull();
	});
});

/** An existing 1200 ft² house: existing 12 kW range, 5 kW dryer, 4.5 kW water heater, 2 SA and 1 laundry circuit. */
function existingHouse(
	added: { kind: 'ev-charger' | 'heat-pump'; va: number },
	extra: Partial<JobDocumentInput> = {},
): JobDocumentInput {
	return job({
		floorAreaFt2: 1200,
		service: { ratingA: 100, voltageSystem: '120/240-1ph-3w' },
		circuits: [
			circuit({ id: 'sa1', position: 1, status: 'existing' }),
			circuit({ id: 'sa2', position: 2, status: 'existing' }),
			circuit({ id: 'laundry', position: 3, status: 'existing' }),
			circuit({
				id: 'range',
				position: 5,
				poles: 2,
				ratingA: 40,
				status: 'existing',
				conductor: { size: '8', material: 'cu', insulationC: 75 },
			}),
			circuit({
				id: 'dryer',
				position: 6,
				poles: 2,
				ratingA: 30,
				status: 'existing',
				conductor: { size: '10', material: 'cu', insulationC: 75 },
			}),
			circuit({
				id: 'wh',
				position: 9,
				poles: 2,
				ratingA: 30,
				status: 'existing',
				conductor: { size: '10', material: 'cu', insulationC: 75 },
			}),
			circuit({
				id: 'new',
				position: 10,
				poles: 2,
				ratingA: 40,
				status: 'new',
				conductor: { size: '8', material: 'cu', insulationC: 75 },
			}),
		],
		loads: [
			load({ circuitId: 'sa1', kind: 'small-appliance', va: 1500 }),
			load({ circuitId: 'sa2', kind: 'small-appliance', va: 1500 }),
			load({ circuitId: 'laundry', kind: 'laundry', va: 1500 }),
			load({ circuitId: 'range', kind: 'range', watts: 12_000, voltage: 240 }),
			load({ circuitId: 'dryer', kind: 'dryer', watts: 5000, voltage: 240 }),
			load({ circuitId: 'wh', kind: 'water-heater', watts: 4500, voltage: 240 }),
			load({ circuitId: 'new', kind: added.kind, va: added.va, voltage: 240 }),
		],
		...extra,
	});
}

describe('existing dwelling with added loads, 220.83 (our worked examples)', () => {
	test('adding an EV charger and no heating or cooling uses 220.83(A)', () => {
		// from memory: 220.83(A), first 8 kVA at 100 %, remainder at 40 %, loads at nameplate.
		// Hand: 1200 × 3 = 3600; SA 3000; laundry 1500; range 12,000 + dryer 5000 + water heater 4500 + EVSE 7200 = 28,700.
		// All load 3600 + 3000 + 1500 + 28,700 = 36,800; 8000 + 28,800 × 0.40 = 8000 + 11,520 = 19,520 VA.
		// 19,520 / 240 = 81.33 → 81 A; headroom on 100 A: 19 A.
		const m = method(run(existingHouse({ kind: 'ev-charger', va: 7200 })), 'existing-added');
		expect(m.applicable).toBe(true);
		expect(m.rule).toBe('NEC 2023 220.83');
		expect(lineValue(m.lines, 'other-subtotal')).toBe(36_800);
		expect(m.totalVA?.value).toBe(19_520);
		expect(m.ampsRounded?.value).toBe(81);
		expect(m.headroomA?.value).toBe(19);
		expect(m.totalVA?.rule).toContain('220.83(A)');
	});

	test('adding a heat pump takes it at 100 % under 220.83(B)', () => {
		// from memory: 220.83(B), A/C or heating at 100 %, first 8 kVA of all other load at 100 %, rest 40 %.
		// Hand: other load 3600 + 3000 + 1500 + 12,000 + 5000 + 4500 = 29,600; 8000 + 21,600 × 0.40 = 8000 + 8640 = 16,640.
		// Heat pump 6000 at 100 % → 22,640 VA; 22,640 / 240 = 94.33 → 94 A.
		const m = method(run(existingHouse({ kind: 'heat-pump', va: 6000 })), 'existing-added');
		expect(lineValue(m.lines, 'other-demand')).toBe(16_640);
		expect(lineValue(m.lines, 'heating-cooling')).toBe(6000);
		expect(m.totalVA?.value).toBe(22_640);
		expect(m.ampsRounded?.value).toBe(94);
	});

	test('does not apply to a house with only new circuits', () => {
		expect(method(run(annexD1a()), 'existing-added').applicable).toBe(false);
	});
});

describe('existing load from measured demand, 220.87 (our worked example)', () => {
	test('an 8 kW twelve-month peak plus a new 7.2 kVA EV charger comes to 17,200 VA, 72 A', () => {
		// from memory: 220.87, 12-month maximum demand × 125 % plus the new load, within the service rating.
		// Hand: 8 kW × 1000 × 1.25 = 10,000 VA; EVSE max(7200, 7200) = 7200 (220.57); 10,000 + 7200 = 17,200 VA.
		// 17,200 / 240 = 71.67 → 72 A; on 100 A the headroom is 28 A.
		const input = existingHouse(
			{ kind: 'ev-charger', va: 7200 },
			{
				service: {
					ratingA: 100,
					voltageSystem: '120/240-1ph-3w',
					existingLoad: { method: 'measured-peak', peakDemandKW: 8 },
				},
			},
		);
		const m = method(run(input), 'measured-demand');
		expect(lineValue(m.lines, 'existing')).toBe(10_000);
		expect(lineValue(m.lines, 'new-evse')).toBe(7200);
		expect(m.totalVA?.value).toBe(17_200);
		expect(m.ampsRounded?.value).toBe(72);
		expect(m.headroomA?.value).toBe(28);
		expect(m.withinService).toBe(true);
	});

	test('a peak too high for the service is reported as over the rating', () => {
		// Hand: 16 kW × 1.25 = 20,000 + 7200 = 27,200 VA → 113.33 → 113 A > 100 A.
		const input = existingHouse(
			{ kind: 'ev-charger', va: 7200 },
			{
				service: {
					ratingA: 100,
					voltageSystem: '120/240-1ph-3w',
					existingLoad: { method: 'measured-peak', peakDemandKW: 16 },
				},
			},
		);
		const m = method(run(input), 'measured-demand');
		expect(m.ampsRounded?.value).toBe(113);
		expect(m.withinService).toBe(false);
		expect(m.headroomA?.value).toBe(-13);
	});

	test('is not applicable without a demand record', () => {
		expect(method(run(annexD1a()), 'measured-demand').applicable).toBe(false);
	});
});

describe('service findings', () => {
	test('a service smaller than every applicable method is a violation', () => {
		// Hand: Annex D house standard 78 A, optional 69 A; on a 60 A service both exceed it.
		const r = run(annexD1a({ service: { ratingA: 60, voltageSystem: '120/240-1ph-3w' } }));
		const f = r.service.findings.find((x) => x.code === 'service-capacity');
		expect(f?.severity).toBe('violation');
		expect(r.service.findings.some((x) => x.code === 'service-minimum')).toBe(true);
	});

	test('the lowest applicable method decides and its minimum service is reported', () => {
		const r = run(annexD1a());
		expect(r.service.lowestMethod).toBe('optional');
		expect(r.service.minimumServiceA.value).toBe(100);
		expect(r.service.findings.find((x) => x.code === 'service-capacity')?.severity).toBe('ok');
	});
});
