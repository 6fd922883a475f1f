/** Branch-circuit and feeder checks: load against breaker and conductor, conductor protection, 210.23, voltage drop. */
import { cookingDemand } from './dwelling';
import { fig, finding, num, q, roundTo } from './format';
import { circuitVoltage } from './positions';
import type { Circuit, Panel } from './schema';
import { COMMON_PRACTICE, section, sections } from './sections';
import {
	CIRCULAR_MILS,
	K_FACTOR,
	STANDARD_RATINGS_A,
	sizeLabel,
	smallConductorLimitA,
	standardRatingAbove,
	tableAmpacity,
} from './tables';
import type { TemperatureC } from './tables';
import type { Edition, Figure, Finding, Leg } from './types';

/** What a circuit's loads add up to, gathered in one pass over its loads. */
export interface CircuitLoadStats {
	count: number;
	connectedVA: number;
	continuousVA: number;
	/** Largest motor (one item), VA, for 430.22. */
	largestMotorVA: number;
	/** Loads of kind lighting, receptacles, small-appliance or laundry. */
	hasGeneralOutlets: boolean;
	hasReceptacles: boolean;
	/** Fastened-in-place utilization equipment (not lighting, not receptacle loads, not cord-and-plug). */
	fastenedVA: number;
	/** Largest single cord-and-plug item, VA. */
	largestCordVA: number;
	/** Every load is a motor, air conditioner or heat pump (240.4(G) applies). */
	motorOrAcOnly: boolean;
	/** Load voltages other than the circuit's (and other than 120 V); null when there are none. */
	otherVoltages: Set<number> | null;
	/** Terms of the connected-load sum, for the working (first few only). */
	terms: number[];
	/** Nameplate kW of each household cooking appliance, when every load on the circuit is one. */
	cookingKW: number[];
	onlyCooking: boolean;
}

export function emptyStats(): CircuitLoadStats {
	return {
		count: 0,
		connectedVA: 0,
		continuousVA: 0,
		largestMotorVA: 0,
		hasGeneralOutlets: false,
		hasReceptacles: false,
		fastenedVA: 0,
		largestCordVA: 0,
		motorOrAcOnly: true,
		otherVoltages: null,
		terms: [],
		cookingKW: [],
		onlyCooking: true,
	};
}

export interface VoltageDrop {
	volts: Figure;
	percent: Figure;
}

export interface CircuitResult {
	circuitId: string;
	panelId: string;
	label: string;
	status: Circuit['status'];
	positions: number[];
	legs: Leg[];
	/** The subpanel this circuit supplies, or null for a branch circuit. */
	feedsPanelId: string | null;
	voltage: Figure;
	connectedVA: Figure;
	amps: Figure;
	/** Load the breaker must carry: noncontinuous + 125 % continuous (210.20(A)), or the feeder's calculated load. */
	breakerLoadA: Figure;
	/** Load the conductors must carry: adds 25 % of the largest motor (430.22). */
	conductorLoadA: Figure;
	breakerA: Figure;
	conductorAmpacityA: Figure | null;
	/** 240.4(D) limit for small conductors, or null where it does not apply. */
	smallConductorLimitA: Figure | null;
	voltageDrop: VoltageDrop;
	/** Voltage drop including the feeders between this panel and the service, or null when no feeder lies between. */
	voltageDropTotal: Figure | null;
	/** Current on each leg the breaker connects to, A. */
	legAmps: number[];
	findings: Finding[];
}

export interface CircuitContext {
	edition: Edition;
	terminalC: TemperatureC;
}

export interface FeederLoad {
	panelId: string;
	panelName: string;
	connectedVA: number;
	calculatedVA: number;
	/** The subpanel's leg currents, in leg order. */
	legAmps: number[];
}

const isStandardRating = (a: number) => (STANDARD_RATINGS_A as readonly number[]).includes(a);

/** The rule labels checkCircuit writes, made once per edition. */
function rulesOf(ed: Edition) {
	return {
		voltageDrop: section('voltageDrop', ed),
		feederRating: section('feederRating', ed),
		rangeBranch: sections(['rangeBranch', 'cooking'], ed),
		continuousBreaker: sections(['continuousBreaker', 'continuousConductor'], ed),
		continuousConductor: section('continuousConductor', ed),
		motorConductor: sections(['continuousConductor', 'motorConductor'], ed),
		standardRatings: section('standardRatings', ed),
		ampacityTerminals: sections(['ampacityTable', 'terminals'], ed),
		smallConductors: section('smallConductors', ed),
		ampacityTable: section('ampacityTable', ed),
		motorAcConductors: section('motorAcConductors', ed),
		nextSizeUp: section('nextSizeUp', ed),
		ampacityNextSize: sections(['ampacityTable', 'nextSizeUp'], ed),
		multioutlet: section('multioutlet', ed),
		fastenedInPlace: section('fastenedInPlace', ed),
		cordAndPlug: section('cordAndPlug', ed),
		circuitDirectory: section('circuitDirectory', ed),
	};
}
const RULES = new Map<Edition, ReturnType<typeof rulesOf>>();
function rulesFor(ed: Edition): ReturnType<typeof rulesOf> {
	let r = RULES.get(ed);
	if (!r) {
		r = rulesOf(ed);
		RULES.set(ed, r);
	}
	return r;
}

// Texts that depend on a few discrete inputs are kept and shared: most circuits of a job repeat them.
// Keyed by a text and a number, so that finding one builds no key.
const TEXTS = new Map<string, Map<number, string>>();
function kept(key: string, n: number, make: () => string): string {
	let byNumber = TEXTS.get(key);
	if (byNumber === undefined) {
		byNumber = new Map();
		TEXTS.set(key, byNumber);
	}
	let t = byNumber.get(n);
	if (t === undefined) {
		t = make();
		byNumber.set(n, t);
	}
	return t;
}
const EDITION_NUMBER: Record<Edition, number> = { '2017': 0, '2020': 1, '2023': 2 };

/** A human name for a circuit in messages. */
export function circuitName(c: Circuit): string {
	return c.label.trim().length > 0
		? `Circuit ${c.position} “${c.label.trim()}”`
		: `Circuit ${c.position} (${c.id})`;
}

function sumWorking(terms: readonly number[], count: number, total: number): string {
	if (count === 0) return 'no loads recorded → 0 VA';
	if (count === 1) return `${q(total, 'VA')}`;
	const shown = terms.map((t) => num(t)).join(' + ');
	return `${shown}${count > terms.length ? ` + … (${count} loads)` : ''} = ${q(total, 'VA')}`;
}

/** Voltage drop by the K method: VD = 2·K·I·L / CM (single-phase) or √3·K·I·L / CM (three-phase). */
export function voltageDrop(
	amps: number,
	lengthFt: number,
	conductor: Circuit['conductor'],
	poles: 1 | 2 | 3,
	volts: number,
	edition: Edition,
): VoltageDrop {
	const k = K_FACTOR[conductor.material];
	const cm = CIRCULAR_MILS[conductor.size];
	const mult = poles === 3 ? Math.sqrt(3) : 2;
	const vd = (mult * k * amps * lengthFt) / cm;
	const pct = volts > 0 ? (vd / volts) * 100 : 0;
	const rule = rulesFor(edition).voltageDrop;
	const m = poles === 3 ? '√3' : '2';
	const cable = kept(
		conductor.size,
		conductor.material === 'cu' ? 1 : 2,
		() => `${num(cm)} cmil (${sizeLabel(conductor.size)} ${conductor.material === 'cu' ? 'Cu' : 'Al'})`,
	);
	return {
		volts: fig(
			roundTo(vd, 3),
			'V',
			rule,
			() => `${m} × K ${num(k)} × ${q(amps, 'A')} × ${q(lengthFt, 'ft')} ÷ ${cable} = ${q(vd, 'V', 3)}`,
		),
		percent: fig(
			roundTo(pct, 3),
			'%',
			rule,
			() => `${q(vd, 'V', 3)} ÷ ${q(volts, 'V')} × 100 = ${q(pct, '%')}`,
		),
	};
}

/** All checks of one circuit. `feeder` is set when the circuit supplies a subpanel. */
export function checkCircuit(
	c: Circuit,
	panel: Panel,
	stats: CircuitLoadStats,
	ctx: CircuitContext,
	feeder: FeederLoad | null,
	legs: Leg[],
	positions: number[],
	name = circuitName(c),
): CircuitResult {
	const ed = ctx.edition;
	const R = rulesFor(ed);
	const target = { kind: 'circuit', id: c.id } as const;
	const findings: Finding[] = [];
	// Texts are written when first read; they use these values, not the document's objects.
	const ratingA = c.ratingA;
	const poles = c.poles;
	const system = panel.voltageSystem;
	const v = circuitVoltage(poles, system);
	const divisor = poles === 3 ? v * Math.sqrt(3) : v;
	const divLabel = poles === 3 ? `(${v} V × √3)` : `${v} V`;
	const voltage = fig(
		v,
		'V',
		'nominal system voltage',
		kept(system, 10 + poles, () => `${poles}-pole breaker in a ${system} panelboard → ${v} V`),
	);

	const connected = feeder ? feeder.connectedVA : stats.connectedVA;
	const connectedVA = fig(
		roundTo(connected, 6),
		'VA',
		feeder ? 'sum of the subpanel’s connected loads' : 'sum of the recorded loads',
		() =>
			feeder
				? `panel ${feeder.panelName}: ${q(connected, 'VA')}`
				: sumWorking(stats.terms, stats.count, connected),
	);
	const ampsValue = connected / divisor;
	const amps = fig(
		roundTo(ampsValue, 3),
		'A',
		'I = S ÷ V',
		() => `${q(connected, 'VA')} ÷ ${divLabel} = ${q(ampsValue, 'A')}`,
	);

	let breakerLoad: number;
	let breakerLoadA: Figure;
	let conductorLoad: number;
	let conductorLoadA: Figure;
	if (feeder) {
		breakerLoad = feeder.calculatedVA / divisor;
		breakerLoadA = fig(
			roundTo(breakerLoad, 3),
			'A',
			R.feederRating,
			() =>
				`calculated load of panel ${feeder.panelName} ${q(feeder.calculatedVA, 'VA')} ÷ ${divLabel} = ${q(breakerLoad, 'A')}`,
		);
		conductorLoad = breakerLoad;
		conductorLoadA = breakerLoadA;
	} else if (stats.onlyCooking && stats.count > 0 && stats.cookingKW.some((k) => k >= 8.75)) {
		// A household range of 8.75 kW or more: the branch-circuit load may be taken from Table 220.55.
		const d = cookingDemand(stats.cookingKW);
		breakerLoad = d.va / divisor;
		breakerLoadA = fig(
			roundTo(breakerLoad, 3),
			'A',
			R.rangeBranch,
			() => `${d.working}; ${q(d.va, 'VA')} ÷ ${divLabel} = ${q(breakerLoad, 'A')}`,
		);
		conductorLoad = breakerLoad;
		conductorLoadA = breakerLoadA;
	} else {
		const continuousVA = stats.continuousVA;
		const largestMotorVA = stats.largestMotorVA;
		const nonc = stats.connectedVA - continuousVA;
		const va = nonc + 1.25 * continuousVA;
		const load = va / divisor;
		breakerLoad = load;
		const breakerFigure = fig(roundTo(load, 3), 'A', R.continuousBreaker, () =>
			continuousVA > 0
				? `noncontinuous ${q(nonc, 'VA')} + 125 % × continuous ${q(continuousVA, 'VA')} = ${q(va, 'VA')} ÷ ${divLabel} = ${q(load, 'A')}`
				: `${q(va, 'VA')} noncontinuous ÷ ${divLabel} = ${q(load, 'A')}`,
		);
		breakerLoadA = breakerFigure;
		const withMotor = load + (0.25 * largestMotorVA) / divisor;
		conductorLoad = withMotor;
		conductorLoadA =
			largestMotorVA > 0
				? fig(
						roundTo(withMotor, 3),
						'A',
						R.motorConductor,
						() =>
							`${q(load, 'A')} + 25 % × largest motor ${q(largestMotorVA / divisor, 'A')} = ${q(withMotor, 'A')}`,
					)
				: fig(breakerFigure.value, breakerFigure.unit, R.continuousConductor, () => breakerFigure.working);
	}

	const breakerType = c.breakerType;
	const breakerA = fig(
		ratingA,
		'A',
		R.standardRatings,
		kept(
			breakerType,
			ratingA * 10 + poles,
			() =>
				`${ratingA} A ${poles}-pole ${breakerType === 'standard' ? '' : breakerType.toUpperCase() + ' '}breaker`,
		),
	);

	// Conductor ampacity at the lower of insulation and terminal temperature (110.14(C)).
	const { size, material, insulationC } = c.conductor;
	const terminalC = ctx.terminalC;
	const column = Math.min(insulationC, terminalC) as TemperatureC;
	const amp = tableAmpacity(size, material, column, ed);
	const wire = kept(
		size,
		material === 'cu' ? 3 : 4,
		() => `${sizeLabel(size)} ${material === 'cu' ? 'copper' : 'aluminum'}`,
	);
	const conductorAmpacityA =
		amp === null
			? null
			: fig(
					amp,
					'A',
					R.ampacityTerminals,
					kept(
						wire,
						insulationC * 10_000 + terminalC * 10 + EDITION_NUMBER[ed],
						() =>
							`${wire}, ${column} °C column (insulation ${insulationC} °C, terminals ${terminalC} °C: the lower governs) → ${q(amp, 'A')}`,
					),
				);
	const limit = smallConductorLimitA(size, material);
	const smallLimit =
		limit === null
			? null
			: fig(
					limit,
					'A',
					R.smallConductors,
					kept(wire, 5, () => `${wire}: overcurrent protection not over ${q(limit, 'A')}`),
				);

	// Breaker against its load.
	const over = breakerLoad > ratingA + 1e-9;
	findings.push(
		finding(
			over ? 'violation' : 'ok',
			feeder ? 'feeder-overload' : 'breaker-overload',
			() =>
				over
					? `${name}: the load of ${q(breakerLoad, 'A')} is more than the ${ratingA} A breaker.`
					: `${name}: the load of ${q(breakerLoad, 'A')} is within the ${ratingA} A breaker.`,
			breakerLoadA.rule,
			target,
		),
	);

	if (amp === null) {
		findings.push(
			finding(
				'warning',
				'ampacity-not-tabulated',
				() =>
					`${name}: ${wire} has no ${column} °C ampacity in the ${ed} table; confirm the terminal rating or choose another size.`,
				R.ampacityTable,
				target,
			),
		);
	} else {
		const under = conductorLoad > amp + 1e-9;
		findings.push(
			finding(
				under ? 'violation' : 'ok',
				'conductor-undersized',
				() =>
					under
						? `${name}: ${wire} (${amp} A) is smaller than the load of ${q(conductorLoad, 'A')}.`
						: `${name}: ${wire} (${amp} A) carries the load of ${q(conductorLoad, 'A')}.`,
				conductorLoadA.rule,
				target,
			),
		);
		const motorRule = R.motorAcConductors;
		if (limit !== null && ratingA > limit) {
			findings.push(
				stats.motorOrAcOnly && stats.count > 0
					? finding(
							'note',
							'small-conductor-limit',
							() =>
								`${name}: ${ratingA} A on ${wire} is above the ${limit} A of 240.4(D); allowed for motor and air-conditioning circuits sized by Articles 430 and 440 — check the nameplate maximum.`,
							motorRule,
							target,
						)
					: finding(
							'violation',
							'small-conductor-limit',
							() => `${name}: ${wire} may be protected at ${limit} A at most; the breaker is ${ratingA} A.`,
							R.smallConductors,
							target,
						),
			);
		} else if (ratingA > amp) {
			const next = standardRatingAbove(amp);
			const nextOk = !isStandardRating(amp) && next === ratingA && ratingA <= 800 && !stats.hasReceptacles;
			if (nextOk) {
				findings.push(
					finding(
						'note',
						'next-size-up',
						() =>
							`${name}: ${wire} (${amp} A) on a ${ratingA} A breaker, the next standard rating up, is permitted.`,
						R.nextSizeUp,
						target,
					),
				);
			} else if (stats.motorOrAcOnly && stats.count > 0) {
				findings.push(
					finding(
						'note',
						'conductor-overcurrent',
						() =>
							`${name}: ${ratingA} A protects ${wire} (${amp} A); allowed only as motor or air-conditioning protection per the nameplate.`,
						motorRule,
						target,
					),
				);
			} else {
				findings.push(
					finding(
						'violation',
						'conductor-overcurrent',
						() => `${name}: the ${ratingA} A breaker is larger than the ${amp} A ampacity of ${wire}.`,
						R.ampacityNextSize,
						target,
					),
				);
			}
		} else {
			findings.push(
				finding(
					'ok',
					'conductor-overcurrent',
					() => `${name}: ${wire} (${amp} A) is protected by the ${ratingA} A breaker.`,
					R.smallConductors,
					target,
				),
			);
		}
	}

	if (ratingA === 10 && ed !== '2023') {
		findings.push(
			finding(
				'warning',
				'ten-amp-circuit',
				() => `${name}: 10 A branch circuits are recognized from the 2023 edition.`,
				section('tenAmpCircuits', '2023'),
				target,
			),
		);
	}

	// 210.23: general-purpose outlet circuits in a dwelling are 15 or 20 A; cord-and-plug 80 %; fastened-in-place 50 %.
	if (!feeder && stats.hasGeneralOutlets) {
		if (ratingA > 20) {
			findings.push(
				finding(
					'violation',
					'multioutlet-rating',
					() =>
						`${name}: a lighting or receptacle circuit in a dwelling is rated 15 or 20 A, not ${ratingA} A.`,
					R.multioutlet,
					target,
				),
			);
		}
		const fastenedA = stats.fastenedVA / divisor;
		if (fastenedA > 0.5 * ratingA + 1e-9) {
			findings.push(
				finding(
					'violation',
					'fastened-over-50',
					() =>
						`${name}: equipment fastened in place draws ${q(fastenedA, 'A')}, more than 50 % of ${ratingA} A on a circuit that also supplies lighting or receptacles.`,
					R.fastenedInPlace,
					target,
				),
			);
		}
	}
	if (!feeder && stats.largestCordVA > 0) {
		const cordA = stats.largestCordVA / divisor;
		if (cordA > 0.8 * ratingA + 1e-9) {
			findings.push(
				finding(
					'violation',
					'cord-and-plug-over-80',
					() => `${name}: one cord-and-plug item draws ${q(cordA, 'A')}, more than 80 % of ${ratingA} A.`,
					R.cordAndPlug,
					target,
				),
			);
		}
	}
	if (stats.otherVoltages)
		for (const other of stats.otherVoltages) {
			findings.push(
				finding(
					'note',
					'load-voltage',
					() => `${name}: a ${other} V item on a ${v} V circuit; check the nameplate allows ${v} V.`,
					COMMON_PRACTICE,
					target,
				),
			);
		}

	const vdAmps = feeder ? breakerLoad : ampsValue;
	const vd = voltageDrop(vdAmps, c.lengthFt, c.conductor, poles, v, ed);
	const vdLimit = feeder ? 2 : 3;
	if (vd.percent.value > vdLimit) {
		findings.push(
			finding(
				'note',
				'voltage-drop',
				() =>
					feeder
						? `${name}: the feeder drops ${q(vd.percent.value, '%')}; the recommendation leaves 5 % for feeder and branch together.`
						: `${name}: voltage drop ${q(vd.percent.value, '%')} is over the 3 % recommended for a branch circuit (a recommendation, not a requirement).`,
				vd.percent.rule,
				target,
			),
		);
	} else if (!feeder) {
		findings.push(
			finding(
				'ok',
				'voltage-drop',
				() => `${name}: voltage drop ${q(vd.percent.value, '%')} is within 3 %.`,
				vd.percent.rule,
				target,
			),
		);
	}

	if (c.label.trim().length === 0) {
		findings.push(
			finding(
				'violation',
				'label-missing',
				() => `${name} has no circuit directory entry; every circuit is identified by its purpose.`,
				R.circuitDirectory,
				target,
			),
		);
	}
	if (!feeder && stats.count === 0) {
		findings.push(
			finding('note', 'no-loads', () => `${name} has no loads recorded.`, COMMON_PRACTICE, target),
		);
	}

	let legAmps: number[];
	if (feeder) {
		legAmps = legs.map((_, i) => feeder.legAmps[i] ?? 0);
	} else {
		const perLeg = connected / divisor;
		legAmps = legs.map(() => perLeg);
	}

	return {
		circuitId: c.id,
		panelId: c.panelId,
		label: c.label,
		status: c.status,
		positions,
		legs,
		feedsPanelId: feeder ? feeder.panelId : null,
		voltage,
		connectedVA,
		amps,
		breakerLoadA,
		conductorLoadA,
		breakerA,
		conductorAmpacityA,
		smallConductorLimitA: smallLimit,
		voltageDrop: vd,
		voltageDropTotal: null,
		legAmps,
		findings,
	};
}
