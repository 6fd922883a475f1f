import { describe, expect, test } from 'vitest';
import {
	computeJob,
	legOf,
	parseJobDocument,
	positionsTaken,
	voltageDrop,
} from '../../../src/lib/electrical/index';
import type { JobDocumentInput, JobResult } from '../../../src/lib/electrical/index';
import { circuit, job, load } from './job-builder';

function run(input: JobDocumentInput): JobResult {
	const parsed = parseJobDocument(input);
	if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
	return computeJob(parsed.doc);
}

const codes = (r: JobResult, id: string, severity = 'violation') =>
	r.findings.filter((f) => f.target.id === id && f.severity === severity).map((f) => f.code);

describe('branch circuits', () => {
	test('continuous load counts at 125 % against the breaker', () => {
		// NFPA 70 (NEC) 2023, 210.20(A): noncontinuous + 125 % of continuous.
		// Hand: 1800 VA continuous × 1.25 = 2250 VA ÷ 120 V = 18.75 A ≤ 20 A; 2000 VA → 2500 / 120 = 20.83 A > 20 A.
		const ok = run(
			job({
				circuits: [circuit({ id: 'c', position: 1 })],
				loads: [load({ circuitId: 'c', kind: 'lighting', va: 1800, continuous: true })],
			}),
		);
		expect(ok.circuits[0]?.breakerLoadA.value).toBe(18.75);
		expect(codes(ok, 'c')).toEqual([]);
		const over = run(
			job({
				circuits: [circuit({ id: 'c', position: 1 })],
				loads: [load({ circuitId: 'c', kind: 'lighting', va: 2000, continuous: true })],
			}),
		);
		expect(codes(over, 'c')).toContain('breaker-overload');
	});

	test('an EV charger is continuous without being marked so', () => {
		// NFPA 70 (NEC) 2023, Article 625: EVSE is a continuous load. Hand: 9600 × 1.25 / 240 = 50 A on a 50 A breaker.
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'ev',
						position: 1,
						poles: 2,
						ratingA: 50,
						conductor: { size: '6', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [load({ circuitId: 'ev', kind: 'ev-charger', va: 9600, voltage: 240 })],
			}),
		);
		expect(r.circuits[0]?.breakerLoadA.value).toBe(50);
		expect(codes(r, 'ev')).toEqual([]);
	});

	test('ampacity is read at the lower of the insulation and terminal temperatures', () => {
		// NFPA 70 (NEC) 2023, 110.14(C) with Table 310.16: 10 AWG Cu 90 °C insulation on 60 °C terminals → 30 A.
		const r = run(
			job({
				terminalTemperatureC: 60,
				circuits: [
					circuit({
						id: 'c',
						position: 1,
						ratingA: 30,
						conductor: { size: '10', material: 'cu', insulationC: 90 },
					}),
				],
			}),
		);
		expect(r.circuits[0]?.conductorAmpacityA?.value).toBe(30);
		expect(r.circuits[0]?.conductorAmpacityA?.working).toContain('60 °C column');
	});

	test('14 AWG copper on a 20 A breaker breaks 240.4(D)', () => {
		// NFPA 70 (NEC) 2023, 240.4(D): 14 AWG Cu not over 15 A.
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'c',
						position: 1,
						ratingA: 20,
						conductor: { size: '14', material: 'cu', insulationC: 90 },
					}),
				],
				loads: [load({ circuitId: 'c', kind: 'lighting', va: 600 })],
			}),
		);
		expect(codes(r, 'c')).toContain('small-conductor-limit');
	});

	test('the next standard rating above the ampacity is allowed where no receptacles are supplied', () => {
		// NFPA 70 (NEC) 2023, 240.4(B): 6 AWG Cu at 75 °C = 65 A (Table 310.16) may take a 70 A breaker.
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'c',
						position: 1,
						poles: 2,
						ratingA: 70,
						conductor: { size: '6', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [load({ circuitId: 'c', kind: 'fixed-appliance', va: 9000, voltage: 240 })],
			}),
		);
		expect(codes(r, 'c')).toEqual([]);
		expect(codes(r, 'c', 'note')).toContain('next-size-up');
	});

	test('a breaker two sizes above the ampacity is a violation', () => {
		// NFPA 70 (NEC) 2023, 240.4(B): only the next higher standard rating; 65 A conductor on 80 A is not permitted.
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'c',
						position: 1,
						poles: 2,
						ratingA: 80,
						conductor: { size: '6', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [load({ circuitId: 'c', kind: 'fixed-appliance', va: 9000, voltage: 240 })],
			}),
		);
		expect(codes(r, 'c')).toContain('conductor-overcurrent');
	});

	test('a 12 kW range on a 40 A circuit is sized by Table 220.55', () => {
		// NFPA 70 (NEC) 2023, 210.19(C) (210.19(A)(3) before 2023; from memory) and Table 220.55 Column C:
		// hand: 8000 VA ÷ 240 V = 33.33 A ≤ 40 A.
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'r',
						position: 1,
						poles: 2,
						ratingA: 40,
						conductor: { size: '8', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [load({ circuitId: 'r', kind: 'range', watts: 12_000, voltage: 240 })],
			}),
		);
		expect(r.circuits[0]?.breakerLoadA.value).toBeCloseTo(33.333, 3);
		expect(codes(r, 'r')).toEqual([]);
	});

	test('a motor load takes its current from Table 430.248 and adds 25 % for the conductors', () => {
		// NFPA 70 (NEC) 2023, Table 430.248: 1 hp at 115 V = 16 A; 430.22: conductors at 125 % → 20 A.
		const r = run(
			job({
				circuits: [circuit({ id: 'm', position: 1 })],
				loads: [load({ circuitId: 'm', kind: 'motor', hp: '1' })],
			}),
		);
		const c = r.circuits[0];
		expect(c?.connectedVA.value).toBe(1920); // 16 A × 120 V
		expect(c?.amps.value).toBe(16);
		expect(c?.conductorLoadA.value).toBe(20);
	});

	test('fastened-in-place equipment over half the rating on a receptacle circuit breaks 210.23', () => {
		// NFPA 70 (NEC) 2023, 210.23: fastened-in-place not over 50 % where lighting or receptacles are also supplied.
		// Hand: 1500 VA / 120 V = 12.5 A > 10 A (50 % of 20 A).
		const r = run(
			job({
				circuits: [circuit({ id: 'c', position: 1 })],
				loads: [
					load({ circuitId: 'c', kind: 'receptacles', va: 180 }),
					load({ circuitId: 'c', kind: 'fixed-appliance', va: 1500 }),
				],
			}),
		);
		expect(codes(r, 'c')).toContain('fastened-over-50');
	});

	test('a cord-and-plug item over 80 % of the rating breaks 210.23', () => {
		// NFPA 70 (NEC) 2023, 210.23: cord-and-plug equipment not over 80 %. Hand: 1800 / 120 = 15 A > 12 A (80 % of 15 A).
		const r = run(
			job({
				circuits: [
					circuit({
						id: 'c',
						position: 1,
						ratingA: 15,
						conductor: { size: '14', material: 'cu', insulationC: 90 },
					}),
				],
				loads: [load({ circuitId: 'c', kind: 'fixed-appliance', va: 1800, cordAndPlug: true })],
			}),
		);
		expect(codes(r, 'c')).toContain('cord-and-plug-over-80');
	});

	test('voltage drop follows VD = 2 K I L / CM', () => {
		// Textbook K method with Chapter 9 Table 8 (nec-check-values.md). Hand: 2 × 12.9 × 16 A × 100 ft / 6530 cmil
		// = 41,280 / 6530 = 6.3216 V; 6.3216 / 120 = 5.27 %.
		const vd = voltageDrop(16, 100, { size: '12', material: 'cu', insulationC: 90 }, 1, 120, '2023');
		expect(vd.volts.value).toBeCloseTo(6.322, 3);
		expect(vd.percent.value).toBeCloseTo(5.268, 2);
	});

	test('a drop over 3 % is a note, never a violation', () => {
		// nec-check-values.md: 3 % branch / 5 % total is a recommendation (210.19(A)(1) Informational Note No. 4).
		const r = run(
			job({
				circuits: [circuit({ id: 'c', position: 1, lengthFt: 150 })],
				loads: [load({ circuitId: 'c', kind: 'lighting', va: 1500 })],
			}),
		);
		expect(codes(r, 'c', 'note')).toContain('voltage-drop');
		expect(codes(r, 'c')).toEqual([]);
	});

	test('a circuit with no directory entry breaks 408.4(A)', () => {
		const r = run(
			job({
				circuits: [circuit({ id: 'c', position: 1, label: '' })],
				loads: [load({ circuitId: 'c', kind: 'lighting', va: 100 })],
			}),
		);
		expect(codes(r, 'c')).toContain('label-missing');
	});
});

describe('protection', () => {
	const rooms = [
		{ id: 'bath', name: 'Bath', type: 'bathroom' as const, areaFt2: 50 },
		{ id: 'bed', name: 'Bedroom', type: 'bedroom' as const, areaFt2: 150 },
		{ id: 'kit', name: 'Kitchen', type: 'kitchen' as const, areaFt2: 150 },
		{ id: 'base', name: 'Basement', type: 'basement' as const, areaFt2: 500 },
	];
	const one = (
		roomId: string,
		kind: 'receptacles' | 'lighting',
		over: Parameters<typeof circuit>[0] extends infer T ? Partial<T> : never = {},
		edition: '2017' | '2020' | '2023' = '2023',
	) =>
		run(
			job({
				codeEdition: edition,
				rooms,
				circuits: [circuit({ id: 'c', position: 1, roomIds: [roomId], ...over })],
				loads: [load({ circuitId: 'c', kind, va: 180, roomIds: [roomId] })],
			}),
		);

	test.each([
		['bath', 'receptacles', 'standard', 'gfci-required'],
		['bed', 'lighting', 'standard', 'afci-required'],
		['kit', 'receptacles', 'gfci', 'afci-required'],
		['kit', 'receptacles', 'afci', 'gfci-required'],
	] as const)(
		'a new circuit in %s supplying %s on a %s breaker is missing %s',
		(room, kind, breakerType, code) => {
			// NFPA 70 (NEC) 2023, 210.8(A) (bathrooms, kitchens) and 210.12(B) (bedrooms, kitchens).
			expect(codes(one(room, kind, { breakerType }), 'c')).toContain(code);
		},
	);

	test('a dual-function breaker satisfies both', () => {
		// The brief: 'dual-function' counts as both AFCI and GFCI.
		expect(codes(one('kit', 'receptacles', { breakerType: 'dual-function' }), 'c')).toEqual([]);
	});

	test('a GFPE breaker is not personnel protection', () => {
		expect(codes(one('bath', 'receptacles', { breakerType: 'gfpe' }), 'c')).toContain('gfci-required');
	});

	test('kitchen receptacles not serving the countertop need GFCI only from 2023', () => {
		// nec-check-values.md: kitchens all receptacles in 2023; 2020 only those serving countertops.
		expect(codes(one('kit', 'receptacles', { breakerType: 'afci' }, '2020'), 'c')).not.toContain(
			'gfci-required',
		);
		expect(codes(one('kit', 'receptacles', { breakerType: 'afci' }, '2023'), 'c')).toContain('gfci-required');
	});

	test('a basement receptacle in 2017 is a warning (only unfinished basements) and a violation from 2020', () => {
		// nec-check-values.md: 210.8(A) basements; 2017 covers unfinished portions only (from memory).
		expect(codes(one('base', 'receptacles', {}, '2017'), 'c', 'warning')).toContain('gfci-required');
		expect(codes(one('base', 'receptacles', {}, '2020'), 'c')).toContain('gfci-required');
	});

	test('an existing unprotected circuit is a note, not a violation', () => {
		expect(codes(one('bed', 'lighting', { status: 'existing' }), 'c', 'note')).toContain('afci-required');
	});

	test('AFCI rule names 210.12(A) before 2023 and 210.12(B) in 2023', () => {
		// nec-check-values.md: AFCI 210.12(A) (2014 to 2020; 210.12(B) in 2023).
		const rule = (e: '2020' | '2023') =>
			one('bed', 'lighting', {}, e).findings.find((f) => f.code === 'afci-required')?.rule;
		expect(rule('2020')).toBe('NEC 2020 210.12(A)');
		expect(rule('2023')).toBe('NEC 2023 210.12(B)');
	});

	test('missing small-appliance, laundry, bathroom and garage circuits are reported', () => {
		// NFPA 70 (NEC) 2023, 210.11(C)(1)–(4) (nec-check-values.md).
		const r = run(
			job({
				rooms: [
					{ id: 'k', name: 'Kitchen', type: 'kitchen', areaFt2: 100 },
					{ id: 'l', name: 'Laundry', type: 'laundry', areaFt2: 40 },
					{ id: 'b', name: 'Bath', type: 'bathroom', areaFt2: 40 },
					{ id: 'g', name: 'Garage', type: 'garage', areaFt2: 300 },
				],
				circuits: [
					circuit({
						id: 'sa',
						position: 1,
						ratingA: 15,
						conductor: { size: '14', material: 'cu', insulationC: 90 },
						roomIds: ['k'],
					}),
				],
				loads: [load({ circuitId: 'sa', kind: 'small-appliance', va: 1500, roomIds: ['k'] })],
			}),
		);
		const v = r.protection.filter((f) => f.severity === 'violation').map((f) => f.code);
		expect(v).toEqual(
			expect.arrayContaining([
				'small-appliance-rating',
				'small-appliance-circuits',
				'laundry-circuit',
				'bathroom-circuit',
				'garage-circuit',
			]),
		);
	});
});

describe('panels', () => {
	test('positions alternate legs by row and a 2-pole breaker lands on both legs', () => {
		expect([1, 2, 3, 4, 5, 6].map((p) => legOf(p, '120/240-1ph-3w'))).toEqual(['A', 'A', 'B', 'B', 'A', 'A']);
		expect([1, 3, 5, 7].map((p) => legOf(p, '208Y/120-3ph-4w'))).toEqual(['A', 'B', 'C', 'A']);
		expect(positionsTaken(5, 2)).toEqual([5, 7]);
	});

	test('free positions, conflicts and positions beyond the spaces are found', () => {
		const r = run(
			job({
				panels: [
					{
						id: 'p1',
						name: 'Main',
						kind: 'main',
						voltageSystem: '120/240-1ph-3w',
						busRatingA: 100,
						mainBreakerA: 100,
						spaces: 8,
					},
				],
				circuits: [
					circuit({ id: 'a', position: 1, poles: 2 }),
					circuit({ id: 'b', position: 3 }),
					circuit({ id: 'c', position: 7, poles: 2 }),
				],
			}),
		);
		const p = r.panels[0];
		expect(p?.freePositions).toEqual([2, 4, 5, 6, 8]);
		expect(codes(r, 'b')).toContain('position-conflict');
		expect(codes(r, 'c')).toContain('position-beyond-spaces');
	});

	test('leg loads add 1-pole loads to one leg and split 240 V loads over both', () => {
		// Hand: 1200 VA at 120 V on position 1 (leg A) = 10 A; 4800 VA at 240 V on 3/5 = 20 A on each leg.
		const r = run(
			job({
				circuits: [
					circuit({ id: 'a', position: 1 }),
					circuit({
						id: 'w',
						position: 3,
						poles: 2,
						ratingA: 30,
						conductor: { size: '10', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [
					load({ circuitId: 'a', kind: 'lighting', va: 1200 }),
					load({ circuitId: 'w', kind: 'fixed-appliance', va: 4800, voltage: 240 }),
				],
			}),
		);
		const legs = r.panels[0]?.legs.map((l) => l.amps.value);
		expect(legs).toEqual([30, 20]);
		expect(r.panels[0]?.imbalance.value).toBeCloseTo(33.33, 2);
	});

	test('multiwire circuits on the same leg are a violation', () => {
		// NFPA 70 (NEC) 2023, 210.4: positions 1 and 2 share row 1, leg A.
		const r = run(
			job({
				circuits: [
					circuit({ id: 'a', position: 1, multiwireWith: 'b' }),
					circuit({ id: 'b', position: 2, multiwireWith: 'a' }),
				],
			}),
		);
		expect(codes(r, 'a')).toContain('multiwire-same-leg');
		const ok = run(
			job({
				circuits: [
					circuit({ id: 'a', position: 1, multiwireWith: 'b' }),
					circuit({ id: 'b', position: 3, multiwireWith: 'a' }),
				],
			}),
		);
		expect(codes(ok, 'a')).toEqual([]);
	});

	test('a subpanel passes its load to its feeder circuit', () => {
		const r = run(
			job({
				panels: [
					{
						id: 'p1',
						name: 'Main',
						kind: 'main',
						voltageSystem: '120/240-1ph-3w',
						busRatingA: 200,
						mainBreakerA: 200,
						spaces: 20,
					},
					{
						id: 'p2',
						name: 'Shop',
						kind: 'sub',
						fedFromCircuitId: 'f',
						voltageSystem: '120/240-1ph-3w',
						busRatingA: 60,
						mainBreakerA: null,
						spaces: 8,
					},
				],
				circuits: [
					circuit({
						id: 'f',
						position: 1,
						poles: 2,
						ratingA: 60,
						conductor: { size: '6', material: 'cu', insulationC: 75 },
					}),
					circuit({
						id: 'x',
						panelId: 'p2',
						position: 1,
						poles: 2,
						ratingA: 50,
						conductor: { size: '6', material: 'cu', insulationC: 75 },
					}),
				],
				loads: [load({ circuitId: 'x', kind: 'fixed-appliance', va: 9600, voltage: 240 })],
			}),
		);
		const feeder = r.circuits.find((c) => c.circuitId === 'f');
		expect(feeder?.feedsPanelId).toBe('p2');
		expect(feeder?.connectedVA.value).toBe(9600);
		expect(feeder?.breakerLoadA.value).toBe(40); // 9600 / 240
		expect(r.circuits.find((c) => c.circuitId === 'x')?.voltageDropTotal).not.toBeNull();
	});
});
