import { describe, expect, test } from 'vitest';
import {
	CIRCULAR_MILS,
	K_FACTOR,
	RESISTANCE_STRANDED,
	STANDARD_RATINGS_A,
	columnCkW,
	motorFullLoadA,
	nextStandardRatingA,
	smallConductorLimitA,
	tableAmpacity,
} from '../../../src/lib/electrical/tables';
import type { ConductorSize } from '../../../src/lib/electrical/tables';
import { cookingDemand, lightingDemand, roundAmpsAnnexD } from '../../../src/lib/electrical/dwelling';

describe('Table 310.16 ampacities', () => {
	// NFPA 70 (NEC) 2023, Table 310.16, copper, 60/75/90 °C columns (nec-check-values.md).
	test.each<[ConductorSize, number, number, number]>([
		['14', 15, 20, 25],
		['12', 20, 25, 30],
		['10', 30, 35, 40],
		['8', 40, 50, 55],
		['6', 55, 65, 75],
		['4', 70, 85, 95],
		['3', 85, 100, 115],
		['2', 95, 115, 130],
		['1', 110, 130, 145],
		['1/0', 125, 150, 170],
		['2/0', 145, 175, 195],
		['3/0', 165, 200, 225],
		['4/0', 195, 230, 260],
	])('copper %s AWG carries %i / %i / %i A at 60 / 75 / 90 °C', (size, a60, a75, a90) => {
		expect(tableAmpacity(size, 'cu', 60, '2023')).toBe(a60);
		expect(tableAmpacity(size, 'cu', 75, '2023')).toBe(a75);
		expect(tableAmpacity(size, 'cu', 90, '2023')).toBe(a90);
	});

	// NFPA 70 (NEC) 2023, Table 310.16, aluminum, 60/75/90 °C columns (nec-check-values.md).
	test.each<[ConductorSize, number, number, number]>([
		['12', 15, 20, 25],
		['10', 25, 30, 35],
		['8', 35, 40, 45],
		['6', 40, 50, 55],
		['4', 55, 65, 75],
		['3', 65, 75, 85],
		['2', 75, 90, 100],
		['1', 85, 100, 115],
		['1/0', 100, 120, 135],
		['2/0', 115, 135, 150],
		['3/0', 130, 155, 175],
		['4/0', 150, 180, 205],
	])('aluminum %s AWG carries %i / %i / %i A at 60 / 75 / 90 °C in the 2023 table', (size, a60, a75, a90) => {
		expect(tableAmpacity(size, 'al', 60, '2023')).toBe(a60);
		expect(tableAmpacity(size, 'al', 75, '2023')).toBe(a75);
		expect(tableAmpacity(size, 'al', 90, '2023')).toBe(a90);
	});

	test('aluminum 12 and 8 AWG have no 60 °C value before 2023 and 14 AWG aluminum none at all', () => {
		// nec-check-values.md: "15 (2023 charts only)", "35 (2023 charts only)"; 14 AWG Al shown as "-".
		expect(tableAmpacity('12', 'al', 60, '2020')).toBeNull();
		expect(tableAmpacity('8', 'al', 60, '2017')).toBeNull();
		expect(tableAmpacity('14', 'al', 75, '2023')).toBeNull();
	});

	test('the pre-2014 values are not used', () => {
		// nec-check-values.md: older copies show Cu 14 at 60 °C = 20 and Cu 1 at 90 °C = 150, not current.
		expect(tableAmpacity('14', 'cu', 60, '2017')).not.toBe(20);
		expect(tableAmpacity('1', 'cu', 90, '2017')).not.toBe(150);
	});
});

describe('240.4(D) small conductors', () => {
	// NFPA 70 (NEC) 2023, 240.4(D): 14 Cu 15 A, 12 Cu 20 A, 10 Cu 30 A, 12 Al 15 A, 10 Al 25 A.
	test.each<[ConductorSize, 'cu' | 'al', number | null]>([
		['14', 'cu', 15],
		['12', 'cu', 20],
		['10', 'cu', 30],
		['12', 'al', 15],
		['10', 'al', 25],
		['8', 'cu', null],
		['8', 'al', null],
	])('%s AWG %s is protected at not more than %s A', (size, material, limit) => {
		expect(smallConductorLimitA(size, material)).toBe(limit);
	});
});

describe('Chapter 9 Table 8', () => {
	// NFPA 70 (NEC) 2023, Chapter 9 Table 8, circular mils and stranded resistance at 75 °C, ohm/kft.
	test.each<[ConductorSize, number, number, number]>([
		['14', 4110, 3.14, 5.17],
		['12', 6530, 1.98, 3.25],
		['10', 10380, 1.24, 2.04],
		['8', 16510, 0.778, 1.28],
		['6', 26240, 0.491, 0.808],
		['4', 41740, 0.308, 0.508],
		['3', 52620, 0.245, 0.403],
		['2', 66360, 0.194, 0.319],
		['1', 83690, 0.154, 0.253],
		['1/0', 105600, 0.122, 0.201],
		['2/0', 133100, 0.0967, 0.159],
		['3/0', 167800, 0.0766, 0.126],
		['4/0', 211600, 0.0608, 0.1],
	])('%s AWG has %i cmil, %f ohm/kft copper and %f ohm/kft aluminum', (size, cm, cu, al) => {
		expect(CIRCULAR_MILS[size]).toBe(cm);
		expect(RESISTANCE_STRANDED.cu[size]).toBe(cu);
		expect(RESISTANCE_STRANDED.al[size]).toBe(al);
	});

	test('K agrees with R × CM / 1000 of the stranded rows within 2 %', () => {
		// nec-check-values.md: "K agrees with R × CM / 1000 from the stranded rows" (K = 12.9 Cu, 21.2 Al).
		expect(K_FACTOR).toEqual({ cu: 12.9, al: 21.2 });
		for (const size of Object.keys(CIRCULAR_MILS) as ConductorSize[]) {
			expect((RESISTANCE_STRANDED.cu[size] * CIRCULAR_MILS[size]) / 1000 / 12.9).toBeCloseTo(1, 1);
			expect((RESISTANCE_STRANDED.al[size] * CIRCULAR_MILS[size]) / 1000 / 21.2).toBeCloseTo(1, 1);
		}
	});
});

describe('240.6(A) standard ratings', () => {
	test('the list matches the standard ratings in order', () => {
		// NFPA 70 (NEC) 2023, Table 240.6(A).
		expect([...STANDARD_RATINGS_A]).toEqual([
			15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400,
			450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
		]);
	});

	test.each([
		[77.5, 80],
		[78, 80],
		[100, 100],
		[100.1, 110],
		[159, 175],
	])('%f A rounds up to the standard rating %i A', (a, r) => {
		expect(nextStandardRatingA(a)).toBe(r);
	});
});

describe('Table 430.248 single-phase motor currents', () => {
	// NFPA 70 (NEC) 2023, Table 430.248, 115 V and 230 V columns (nec-check-values.md).
	test.each<[Parameters<typeof motorFullLoadA>[0], number, number]>([
		['1/2', 9.8, 4.9],
		['3/4', 13.8, 6.9],
		['1', 16, 8],
		['1-1/2', 20, 10],
		['2', 24, 12],
		['3', 34, 17],
		['5', 56, 28],
	])('%s hp draws %f A at 115 V and %f A at 230 V', (hp, a115, a230) => {
		expect(motorFullLoadA(hp, 120)).toBe(a115);
		expect(motorFullLoadA(hp, 240)).toBe(a230);
	});

	test('1/2 hp draws 5.4 A at 208 V', () => {
		// NFPA 70 (NEC) 2023, Table 430.248, 208 V column (nec-check-values.md: 1/2 hp 5.6 / 5.4 at 200 / 208 V).
		expect(motorFullLoadA('1/2', 208)).toBe(5.4);
	});

	test('values outside the reference sheet are the remembered ones', () => {
		// from memory: Table 430.248, 1/3 hp 7.2 A at 115 V; 10 hp 50 A at 230 V.
		expect(motorFullLoadA('1/3', 120)).toBe(7.2);
		expect(motorFullLoadA('10', 240)).toBe(50);
	});
});

describe('Article 220 dwelling factors', () => {
	test('lighting demand takes the first 3000 VA at 100 %, then 35 % up to 120,000 VA, then 25 %', () => {
		// NFPA 70 (NEC) 2023, Table 220.45 (Table 220.42 through 2020).
		expect(lightingDemand(2000).va).toBe(2000);
		expect(lightingDemand(9000).va).toBe(5100);
		// hand: 3000 + 117,000 × 0.35 + 10,000 × 0.25 = 3000 + 40,950 + 2500 = 46,450
		expect(lightingDemand(130_000).va).toBe(46_450);
	});

	test('one range of 12 kW or less counts 8 kW and a 14 kW range 8.8 kW', () => {
		// NFPA 70 (NEC) 2023, Table 220.55 Column C and Note 1 (nec-check-values.md: a 14 kW range 8.8 kW).
		expect(cookingDemand([12]).va).toBe(8000);
		expect(cookingDemand([10]).va).toBe(8000);
		expect(cookingDemand([14]).va).toBe(8800);
		expect(columnCkW(1)).toBe(8);
	});

	test('a fraction of a kilowatt over 12 counts only when more than half', () => {
		// NFPA 70 (NEC) 2023, Table 220.55 Note 1, "major fraction" read as more than half (common practice).
		expect(cookingDemand([12.4]).va).toBe(8000);
		expect(cookingDemand([12.6]).va).toBe(8400);
	});

	test('two ranges use Column C for two appliances', () => {
		// from memory: Table 220.55 Column C, 2 appliances 11 kW.
		expect(cookingDemand([12, 12]).va).toBe(11_000);
	});

	test('a wall oven of 6 kW takes Column B at 80 %', () => {
		// from memory: Table 220.55 Column B, one appliance 80 %. hand: 6 kW × 0.80 = 4.8 kW
		expect(cookingDemand([6]).va).toBeCloseTo(4800, 6);
	});

	test('amperes drop a fraction below one half and round one half up', () => {
		// NEC Informative Annex D: "a fraction below 0.5 is dropped, 0.5 or more rounds up".
		expect(roundAmpsAnnexD(77.5)).toBe(78);
		expect(roundAmpsAnnexD(60.625)).toBe(61);
		expect(roundAmpsAnnexD(109.29)).toBe(109);
		expect(roundAmpsAnnexD(18_600 / 240)).toBe(78);
	});
});
