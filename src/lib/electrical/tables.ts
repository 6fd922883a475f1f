/**
 * Tabulated values from NFPA 70 (NEC). Each table names its source; values the reference sheet
 * does not carry are marked "from memory" and are checked in tests/unit/electrical/tables.test.ts.
 */
import type { Edition } from './types';

export const CONDUCTOR_SIZES = [
	'14',
	'12',
	'10',
	'8',
	'6',
	'4',
	'3',
	'2',
	'1',
	'1/0',
	'2/0',
	'3/0',
	'4/0',
] as const;
export type ConductorSize = (typeof CONDUCTOR_SIZES)[number];
export type ConductorMaterial = 'cu' | 'al';
export type TemperatureC = 60 | 75 | 90;

/** Label a size the way the trade writes it: '12 AWG', '2/0 AWG'. */
export function sizeLabel(size: ConductorSize): string {
	return `${size} AWG`;
}

type AmpacityRow = readonly [number | null, number | null, number | null];

/** Table 310.16 (Table 310.15(B)(16) in 2017), copper, 60/75/90 °C columns. */
const AMPACITY_CU: Record<ConductorSize, AmpacityRow> = {
	'14': [15, 20, 25],
	'12': [20, 25, 30],
	'10': [30, 35, 40],
	'8': [40, 50, 55],
	'6': [55, 65, 75],
	'4': [70, 85, 95],
	'3': [85, 100, 115],
	'2': [95, 115, 130],
	'1': [110, 130, 145],
	'1/0': [125, 150, 170],
	'2/0': [145, 175, 195],
	'3/0': [165, 200, 225],
	'4/0': [195, 230, 260],
};

/** Same table, aluminum. 12 AWG and 8 AWG at 60 °C appear in the 2023 table only. */
const AMPACITY_AL: Record<ConductorSize, AmpacityRow> = {
	'14': [null, null, null],
	'12': [15, 20, 25],
	'10': [25, 30, 35],
	'8': [35, 40, 45],
	'6': [40, 50, 55],
	'4': [55, 65, 75],
	'3': [65, 75, 85],
	'2': [75, 90, 100],
	'1': [85, 100, 115],
	'1/0': [100, 120, 135],
	'2/0': [115, 135, 150],
	'3/0': [130, 155, 175],
	'4/0': [150, 180, 205],
};

const COLUMN: Record<TemperatureC, 0 | 1 | 2> = { 60: 0, 75: 1, 90: 2 };

/** Ampacity from Table 310.16 for a size, material and temperature column; null where the table has no value. */
export function tableAmpacity(
	size: ConductorSize,
	material: ConductorMaterial,
	column: TemperatureC,
	edition: Edition,
): number | null {
	if (material === 'al' && column === 60 && (size === '12' || size === '8') && edition !== '2023')
		return null;
	const row = material === 'cu' ? AMPACITY_CU[size] : AMPACITY_AL[size];
	return row[COLUMN[column]];
}

/** 240.4(D): largest overcurrent protection for small conductors; null where 240.4(D) does not apply. */
export function smallConductorLimitA(size: ConductorSize, material: ConductorMaterial): number | null {
	if (material === 'cu') {
		if (size === '14') return 15;
		if (size === '12') return 20;
		if (size === '10') return 30;
		return null;
	}
	if (size === '12') return 15;
	if (size === '10') return 25;
	return null;
}

/** Chapter 9 Table 8: area in circular mils. */
export const CIRCULAR_MILS: Record<ConductorSize, number> = {
	'14': 4110,
	'12': 6530,
	'10': 10380,
	'8': 16510,
	'6': 26240,
	'4': 41740,
	'3': 52620,
	'2': 66360,
	'1': 83690,
	'1/0': 105600,
	'2/0': 133100,
	'3/0': 167800,
	'4/0': 211600,
};

/** Chapter 9 Table 8: DC resistance at 75 °C, stranded conductors, ohm per 1000 ft. */
export const RESISTANCE_STRANDED: Record<ConductorMaterial, Record<ConductorSize, number>> = {
	cu: {
		'14': 3.14,
		'12': 1.98,
		'10': 1.24,
		'8': 0.778,
		'6': 0.491,
		'4': 0.308,
		'3': 0.245,
		'2': 0.194,
		'1': 0.154,
		'1/0': 0.122,
		'2/0': 0.0967,
		'3/0': 0.0766,
		'4/0': 0.0608,
	},
	al: {
		'14': 5.17,
		'12': 3.25,
		'10': 2.04,
		'8': 1.28,
		'6': 0.808,
		'4': 0.508,
		'3': 0.403,
		'2': 0.319,
		'1': 0.253,
		'1/0': 0.201,
		'2/0': 0.159,
		'3/0': 0.126,
		'4/0': 0.1,
	},
};

/** Resistivity constant K at 75 °C, ohm-cmil/ft (textbook voltage-drop practice). */
export const K_FACTOR: Record<ConductorMaterial, number> = { cu: 12.9, al: 21.2 };

/** 240.6(A) standard ampere ratings of fuses and inverse-time circuit breakers. */
export const STANDARD_RATINGS_A = [
	15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400, 450,
	500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
] as const;

/** Breaker ratings accepted for a branch circuit: the 240.6(A) list plus 10 A (a 240.6(A) fuse rating; 10 A branch circuits from 2023, 210.3). */
export const BREAKER_RATINGS_A = [10, ...STANDARD_RATINGS_A] as const;
export type BreakerRating = (typeof BREAKER_RATINGS_A)[number];

/** Smallest standard rating (240.6(A)) at or above `amps`; the largest rating when amps exceed the list. */
export function nextStandardRatingA(amps: number): number {
	for (const r of STANDARD_RATINGS_A) if (r >= amps - 1e-9) return r;
	return 6000;
}

/** Smallest standard rating strictly above `amps` (for 240.4(B), next size up). */
export function standardRatingAbove(amps: number): number | null {
	for (const r of STANDARD_RATINGS_A) if (r > amps + 1e-9) return r;
	return null;
}

export const MOTOR_HP = [
	'1/6',
	'1/4',
	'1/3',
	'1/2',
	'3/4',
	'1',
	'1-1/2',
	'2',
	'3',
	'5',
	'7-1/2',
	'10',
] as const;
export type MotorHp = (typeof MOTOR_HP)[number];

/** Horsepower as a number. */
export const HP_VALUE: Record<MotorHp, number> = {
	'1/6': 1 / 6,
	'1/4': 0.25,
	'1/3': 1 / 3,
	'1/2': 0.5,
	'3/4': 0.75,
	'1': 1,
	'1-1/2': 1.5,
	'2': 2,
	'3': 3,
	'5': 5,
	'7-1/2': 7.5,
	'10': 10,
};

/**
 * Table 430.248, full-load current of single-phase AC motors, columns 115 / 200 / 208 / 230 V.
 * The 115 V and 230 V values for 1/2 to 5 hp and the 200/208 V values for 1/2 hp are on the reference
 * sheet; the other entries (1/6, 1/4, 1/3, 7-1/2 and 10 hp, and the 200/208 V columns) are from memory.
 */
const MOTOR_FLA: Record<MotorHp, readonly [number, number, number, number]> = {
	'1/6': [4.4, 2.5, 2.4, 2.2],
	'1/4': [5.8, 3.3, 3.2, 2.9],
	'1/3': [7.2, 4.1, 4.0, 3.6],
	'1/2': [9.8, 5.6, 5.4, 4.9],
	'3/4': [13.8, 7.9, 7.6, 6.9],
	'1': [16, 9.2, 8.8, 8],
	'1-1/2': [20, 11.5, 11, 10],
	'2': [24, 13.8, 13.2, 12],
	'3': [34, 19.6, 18.7, 17],
	'5': [56, 32.2, 30.8, 28],
	'7-1/2': [80, 46, 44, 40],
	'10': [100, 57.5, 55, 50],
};

/** The Table 430.248 column used for a system voltage: 120 V → 115 V column, 240 V → 230 V, 208 V → 208 V. */
export function motorColumnV(voltage: 120 | 208 | 240): 115 | 208 | 230 {
	return voltage === 120 ? 115 : voltage === 208 ? 208 : 230;
}

/** Full-load current from Table 430.248 for a horsepower and system voltage. */
export function motorFullLoadA(hp: MotorHp, voltage: 120 | 208 | 240): number {
	const row = MOTOR_FLA[hp];
	return voltage === 120 ? row[0] : voltage === 208 ? row[2] : row[3];
}

/** Table 220.55 Column C, maximum demand in kW for 1 to 25 appliances (entries above one are from memory). */
const COLUMN_C_KW = [
	8, 11, 14, 17, 20, 21, 22, 23, 24, 25, 26, 27, 28, 29, 30, 31, 32, 33, 34, 35, 36, 37, 38, 39, 40,
];

/** Table 220.55 Column C for n appliances, kW (from memory beyond one appliance). */
export function columnCkW(n: number): number {
	if (n <= 0) return 0;
	if (n <= 25) return COLUMN_C_KW[n - 1] ?? 0;
	if (n <= 40) return 15 + n;
	if (n <= 50) return 25 + 0.75 * n;
	if (n <= 60) return 30 + 0.5 * n;
	return 30 + 0.25 * n;
}

/** Table 220.55 Column A (less than 3.5 kW), percent, for 1 to 25 appliances (from memory). */
const COLUMN_A_PCT = [
	80, 75, 70, 66, 62, 59, 56, 53, 51, 49, 47, 45, 43, 41, 40, 39, 38, 37, 36, 35, 34, 33, 32, 31, 30,
];
/** Table 220.55 Column B (3.5 to 8.75 kW), percent, for 1 to 25 appliances (from memory). */
const COLUMN_B_PCT = [
	80, 65, 55, 50, 45, 43, 40, 36, 35, 34, 32, 32, 32, 32, 32, 28, 28, 28, 28, 28, 26, 26, 26, 26, 26,
];

/** Table 220.55 Column A demand factor, percent (from memory). */
export function columnApct(n: number): number {
	if (n <= 0) return 0;
	return n <= 25 ? (COLUMN_A_PCT[n - 1] ?? 30) : 30;
}

/** Table 220.55 Column B demand factor, percent (from memory). */
export function columnBpct(n: number): number {
	if (n <= 0) return 0;
	if (n <= 25) return COLUMN_B_PCT[n - 1] ?? 26;
	if (n <= 30) return 24;
	if (n <= 40) return 22;
	if (n <= 50) return 20;
	if (n <= 60) return 18;
	return 16;
}

/** Smallest service for a one-family dwelling, amperes (230.79(C)). */
export const MIN_SERVICE_ONE_FAMILY_A = 100;
