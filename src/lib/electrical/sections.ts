/**
 * Section labels per code edition. Numbers moved between editions; every rule string the engine
 * writes comes from here so the edition is always named.
 */
import type { Edition } from './types';

type PerEdition = Record<Edition, string>;

const same = (s: string): PerEdition => ({ '2017': s, '2020': s, '2023': s });

const SECTION_TABLE = {
	generalLighting: { '2017': '220.12, Table 220.12', '2020': '220.14(J)', '2023': '220.41' },
	lightingDemand: { '2017': 'Table 220.42', '2020': 'Table 220.42', '2023': 'Table 220.45' },
	smallAppliance: same('220.52(A)'),
	laundry: same('220.52(B)'),
	fixedAppliances: same('220.53'),
	dryers: same('220.54'),
	cooking: same('220.55, Table 220.55'),
	motors: same('220.50, 430.24'),
	heating: same('220.51'),
	noncoincident: same('220.60'),
	// EVSE load at 7200 W or nameplate: 220.57, from memory (2020 onward).
	evse: { '2017': '220.14(A)', '2020': '220.57', '2023': '220.57' },
	neutral: same('220.61(B)'),
	optional: same('220.82'),
	optionalGeneral: same('220.82(B)'),
	optionalHeatCool: same('220.82(C)'),
	existingAdded: same('220.83'),
	measuredDemand: same('220.87'),
	roundingAmps: same('Informative Annex D (amperes rounded)'),
	minimumService: same('230.79(C)'),
	standardRatings: same('240.6(A)'),
	ampacityTable: { '2017': 'Table 310.15(B)(16)', '2020': 'Table 310.16', '2023': 'Table 310.16' },
	terminals: same('110.14(C)'),
	smallConductors: same('240.4(D)'),
	nextSizeUp: same('240.4(B)'),
	motorAcConductors: same('240.4(G)'),
	continuousConductor: same('210.19(A)(1)'),
	continuousBreaker: same('210.20(A)'),
	// Household range branch circuits by Table 220.55; 210.19(C) in 2023 (from memory).
	rangeBranch: { '2017': '210.19(A)(3)', '2020': '210.19(A)(3)', '2023': '210.19(C)' },
	motorFla: same('Table 430.248'),
	motorConductor: same('430.22'),
	// 210.23: a 10 A paragraph was added in 2023 and the rest moved down a letter (from memory).
	multioutlet: { '2017': '210.23', '2020': '210.23', '2023': '210.23' },
	cordAndPlug: { '2017': '210.23(A)(1)', '2020': '210.23(A)(1)', '2023': '210.23(B)(1)' },
	fastenedInPlace: { '2017': '210.23(A)(2)', '2020': '210.23(A)(2)', '2023': '210.23(B)(2)' },
	tenAmpCircuits: same('210.3'),
	// Voltage-drop recommendation: 210.19(A)(1) Informational Note No. 4 (2017/2020); the 2023 note is from memory.
	voltageDrop: {
		'2017': '210.19(A)(1) Informational Note No. 4; Chapter 9 Table 8',
		'2020': '210.19(A)(1) Informational Note No. 4; Chapter 9 Table 8',
		'2023': '210.19(A) Informational Note; Chapter 9 Table 8',
	},
	gfci: same('210.8(A)'),
	afci: { '2017': '210.12(A)', '2020': '210.12(A)', '2023': '210.12(B)' },
	requiredSmallAppliance: same('210.11(C)(1)'),
	requiredLaundry: same('210.11(C)(2)'),
	requiredBathroom: same('210.11(C)(3)'),
	requiredGarage: same('210.11(C)(4)'),
	multiwire: same('210.4(B)'),
	multiwireLegs: same('210.4'),
	panelRating: same('408.30'),
	panelProtection: same('408.36'),
	circuitDirectory: same('408.4(A)'),
	feederRating: same('215.2(A)(1), 215.3'),
	evseContinuous: same('Article 625'),
	waterHeaterContinuous: same('422.13'),
} satisfies Record<string, PerEdition>;

export type SectionKey = keyof typeof SECTION_TABLE;

// Labels are built once per edition: the engine asks for them for every circuit.
const LABELS = {} as Record<Edition, Record<SectionKey, string>>;
for (const edition of ['2017', '2020', '2023'] as const) {
	const labels = {} as Record<SectionKey, string>;
	for (const key of Object.keys(SECTION_TABLE) as SectionKey[])
		labels[key] = `NEC ${edition} ${SECTION_TABLE[key][edition]}`;
	LABELS[edition] = labels;
}
const joined = new Map<string, string>();

/** The rule label for a section in an edition, e.g. section('lightingDemand', '2023') → 'NEC 2023 Table 220.45'. */
export function section(key: SectionKey, edition: Edition): string {
	return LABELS[edition][key];
}

/** Section labels for two or more keys joined: 'NEC 2023 210.19(A)(1), 210.20(A)'. */
export function sections(keys: readonly SectionKey[], edition: Edition): string {
	const id = `${edition} ${keys.join(' ')}`;
	let label = joined.get(id);
	if (label === undefined) {
		label = `NEC ${edition} ${keys.map((k) => SECTION_TABLE[k][edition]).join(', ')}`;
		joined.set(id, label);
	}
	return label;
}

/** Mark for rules that are practice, not code. */
export const COMMON_PRACTICE = 'common practice (no code section)';
