/** Branch-circuit and feeder checks: load against breaker and conductor, conductor protection, 210.23, voltage drop. */
import { cookingDemand } from './dwelling';
import { fig, figOf, finding, findingOf, num, q, roundTo } from './format';
import { circuitVoltage } from './positions';
import type { Circuit, Load, Panel, Room } from './schema';
import { unitVA } from './load-values';
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
	/** Figures that depend only on a few discrete inputs, shared by the circuits of one job. */
	figures?: Map<string, Map<number, Figure>>;
}

/** A figure from the job's shared ones, or undefined before `shareFigure` keeps it (as `kept` does for texts). */
function sharedFigure(ctx: CircuitContext, key: string, n: number): Figure | undefined {
	return ctx.figures?.get(key)?.get(n);
}

function shareFigure(ctx: CircuitContext, key: string, n: number, f: Figure): Figure {
	const figures = (ctx.figures ??= new Map());
	let byNumber = figures.get(key);
	if (byNumber === undefined) {
		byNumber = new Map();
		figures.set(key, byNumber);
	}
	byNumber.set(n, f);
	return f;
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
function kept(key: string, n: number): string | undefined {
	return TEXTS.get(key)?.get(n);
}

function keep(key: string, n: number, text: string): string {
	let byNumber = TEXTS.get(key);
	if (byNumber === undefined) {
		byNumber = new Map();
		TEXTS.set(key, byNumber);
	}
	byNumber.set(n, text);
	return text;
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

interface DropTexts {
	m: string;
	k: number;
	amps: number;
	lengthFt: number;
	cable: string;
	vd: number;
	volts: number;
	pct: number;
}
const dropVoltsText = (d: DropTexts) =>
	`${d.m} × K ${num(d.k)} × ${q(d.amps, 'A')} × ${q(d.lengthFt, 'ft')} ÷ ${d.cable} = ${q(d.vd, 'V', 3)}`;
const dropPercentText = (d: DropTexts) => `${q(d.vd, 'V', 3)} ÷ ${q(d.volts, 'V')} × 100 = ${q(d.pct, '%')}`;

function cableText(conductor: Circuit['conductor'], cm: number): string {
	const n = conductor.material === 'cu' ? 1 : 2;
	return (
		kept(conductor.size, n) ??
		keep(
			conductor.size,
			n,
			`${num(cm)} cmil (${sizeLabel(conductor.size)} ${conductor.material === 'cu' ? 'Cu' : 'Al'})`,
		)
	);
}

const circuitDropVoltsText = (t: CircuitTexts) =>
	`${t.dropM} × K ${num(t.dropK)} × ${q(t.dropAmps, 'A')} × ${q(t.dropLength, 'ft')} ÷ ${t.dropCable} = ${q(t.drop, 'V', 3)}`;
const circuitDropPercentText = (t: CircuitTexts) =>
	`${q(t.drop, 'V', 3)} ÷ ${q(t.dropVolts, 'V')} × 100 = ${q(t.dropPercent, '%')}`;

/** voltageDrop for checkCircuit: the texts read `t`. */
function circuitDrop(
	t: CircuitTexts,
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
	t.dropCable = cableText(conductor, cm);
	t.dropM = poles === 3 ? '√3' : '2';
	t.dropK = k;
	t.dropAmps = amps;
	t.dropLength = lengthFt;
	t.drop = vd;
	t.dropVolts = volts;
	t.dropPercent = pct;
	const percent = roundTo(pct, 3);
	t.vdPercent = percent;
	return {
		volts: figOf(roundTo(vd, 3), 'V', rule, circuitDropVoltsText, t),
		percent: figOf(percent, '%', rule, circuitDropPercentText, t),
	};
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
	const cable = cableText(conductor, cm);
	const d: DropTexts = { m: poles === 3 ? '√3' : '2', k, amps, lengthFt, cable, vd, volts, pct };
	return {
		volts: figOf(roundTo(vd, 3), 'V', rule, dropVoltsText, d),
		percent: figOf(roundTo(pct, 3), '%', rule, dropPercentText, d),
	};
}

const NONE: readonly never[] = [];

/** Numbers a circuit's texts keep, in one Float64Array for the whole job (no boxed number per field). */
export const TEXT_NUMBERS = 23;

/**
 * What a circuit's texts read, written when first shown: values fixed as the checks run. One object
 * per circuit instead of a closure per text; its numbers sit at `o` in `n`.
 */
export class CircuitTexts {
	name: string | null = null;
	ratingA = 0;
	poles: 1 | 2 | 3 = 1;
	v = 0;
	divLabel = '';
	count = 0;
	/** The circuit's loads, for the terms of the connected-load sum. */
	loads: readonly Load[] = NONE;
	breakerWorking: Figure | null = null;
	feederPanelName = '';
	cookingWorking = '';
	wire = '';
	column = 0;
	amp = 0;
	limit = 0;
	ed: Edition = '2023';
	dropM = '';
	dropCable = '';
	/** Rooms the circuit and its loads serve, and the job's rooms, for the AFCI and GFCI texts. */
	roomIds: readonly string[] = NONE;
	rooms: ReadonlyMap<string, Room> | null = null;
	gfciRooms: readonly Room[] = NONE;
	afciRule = '';
	constructor(
		readonly id: string,
		readonly position: number,
		readonly label: string,
		readonly n: Float64Array = new Float64Array(TEXT_NUMBERS),
		readonly o = 0,
	) {}
	get connected(): number {
		return this.n[this.o + 0] as number;
	}
	set connected(x: number) {
		this.n[this.o + 0] = x;
	}
	get ampsValue(): number {
		return this.n[this.o + 1] as number;
	}
	set ampsValue(x: number) {
		this.n[this.o + 1] = x;
	}
	get breakerLoad(): number {
		return this.n[this.o + 2] as number;
	}
	set breakerLoad(x: number) {
		this.n[this.o + 2] = x;
	}
	get conductorLoad(): number {
		return this.n[this.o + 3] as number;
	}
	set conductorLoad(x: number) {
		this.n[this.o + 3] = x;
	}
	get nonc(): number {
		return this.n[this.o + 4] as number;
	}
	set nonc(x: number) {
		this.n[this.o + 4] = x;
	}
	get continuousVA(): number {
		return this.n[this.o + 5] as number;
	}
	set continuousVA(x: number) {
		this.n[this.o + 5] = x;
	}
	get va(): number {
		return this.n[this.o + 6] as number;
	}
	set va(x: number) {
		this.n[this.o + 6] = x;
	}
	get largestMotorVA(): number {
		return this.n[this.o + 7] as number;
	}
	set largestMotorVA(x: number) {
		this.n[this.o + 7] = x;
	}
	get divisor(): number {
		return this.n[this.o + 8] as number;
	}
	set divisor(x: number) {
		this.n[this.o + 8] = x;
	}
	get feederCalculatedVA(): number {
		return this.n[this.o + 9] as number;
	}
	set feederCalculatedVA(x: number) {
		this.n[this.o + 9] = x;
	}
	get cookingVA(): number {
		return this.n[this.o + 10] as number;
	}
	set cookingVA(x: number) {
		this.n[this.o + 10] = x;
	}
	get fastenedA(): number {
		return this.n[this.o + 11] as number;
	}
	set fastenedA(x: number) {
		this.n[this.o + 11] = x;
	}
	get cordA(): number {
		return this.n[this.o + 12] as number;
	}
	set cordA(x: number) {
		this.n[this.o + 12] = x;
	}
	get vdPercent(): number {
		return this.n[this.o + 13] as number;
	}
	set vdPercent(x: number) {
		this.n[this.o + 13] = x;
	}
	get upstream(): number {
		return this.n[this.o + 14] as number;
	}
	set upstream(x: number) {
		this.n[this.o + 14] = x;
	}
	get branch(): number {
		return this.n[this.o + 15] as number;
	}
	set branch(x: number) {
		this.n[this.o + 15] = x;
	}
	get totalDrop(): number {
		return this.n[this.o + 16] as number;
	}
	set totalDrop(x: number) {
		this.n[this.o + 16] = x;
	}
	get dropK(): number {
		return this.n[this.o + 17] as number;
	}
	set dropK(x: number) {
		this.n[this.o + 17] = x;
	}
	get dropAmps(): number {
		return this.n[this.o + 18] as number;
	}
	set dropAmps(x: number) {
		this.n[this.o + 18] = x;
	}
	get dropLength(): number {
		return this.n[this.o + 19] as number;
	}
	set dropLength(x: number) {
		this.n[this.o + 19] = x;
	}
	get drop(): number {
		return this.n[this.o + 20] as number;
	}
	set drop(x: number) {
		this.n[this.o + 20] = x;
	}
	get dropVolts(): number {
		return this.n[this.o + 21] as number;
	}
	set dropVolts(x: number) {
		this.n[this.o + 21] = x;
	}
	get dropPercent(): number {
		return this.n[this.o + 22] as number;
	}
	set dropPercent(x: number) {
		this.n[this.o + 22] = x;
	}
}

/** The circuit's name in messages (circuitName), made when first needed. */
export function nameOf(t: CircuitTexts): string {
	if (t.name === null) {
		const label = t.label.trim();
		t.name = label.length > 0 ? `Circuit ${t.position} “${label}”` : `Circuit ${t.position} (${t.id})`;
	}
	return t.name;
}

type T = CircuitTexts;
const feederConnectedText = (t: T) => `panel ${t.feederPanelName}: ${q(t.connected, 'VA')}`;
const connectedText = (t: T) => {
	const terms: number[] = [];
	for (const l of t.loads) {
		if (terms.length === 6) break;
		terms.push(unitVA(l) * l.quantity);
	}
	return sumWorking(terms, t.count, t.connected);
};
const ampsText = (t: T) => `${q(t.connected, 'VA')} ÷ ${t.divLabel} = ${q(t.ampsValue, 'A')}`;
const feederLoadText = (t: T) =>
	`calculated load of panel ${t.feederPanelName} ${q(t.feederCalculatedVA, 'VA')} ÷ ${t.divLabel} = ${q(t.breakerLoad, 'A')}`;
const cookingLoadText = (t: T) =>
	`${t.cookingWorking}; ${q(t.cookingVA, 'VA')} ÷ ${t.divLabel} = ${q(t.breakerLoad, 'A')}`;
const breakerLoadText = (t: T) =>
	t.continuousVA > 0
		? `noncontinuous ${q(t.nonc, 'VA')} + 125 % × continuous ${q(t.continuousVA, 'VA')} = ${q(t.va, 'VA')} ÷ ${t.divLabel} = ${q(t.breakerLoad, 'A')}`
		: `${q(t.va, 'VA')} noncontinuous ÷ ${t.divLabel} = ${q(t.breakerLoad, 'A')}`;
const motorLoadText = (t: T) =>
	`${q(t.breakerLoad, 'A')} + 25 % × largest motor ${q(t.largestMotorVA / t.divisor, 'A')} = ${q(t.conductorLoad, 'A')}`;
const sameAsBreakerText = (t: T) => (t.breakerWorking as Figure).working;
const overloadText = (t: T) =>
	`${nameOf(t)}: the load of ${q(t.breakerLoad, 'A')} is more than the ${t.ratingA} A breaker.`;
const withinText = (t: T) =>
	`${nameOf(t)}: the load of ${q(t.breakerLoad, 'A')} is within the ${t.ratingA} A breaker.`;
const notTabulatedText = (t: T) =>
	`${nameOf(t)}: ${t.wire} has no ${t.column} °C ampacity in the ${t.ed} table; confirm the terminal rating or choose another size.`;
const undersizedText = (t: T) =>
	`${nameOf(t)}: ${t.wire} (${t.amp} A) is smaller than the load of ${q(t.conductorLoad, 'A')}.`;
const carriesText = (t: T) =>
	`${nameOf(t)}: ${t.wire} (${t.amp} A) carries the load of ${q(t.conductorLoad, 'A')}.`;
const smallLimitNoteText = (t: T) =>
	`${nameOf(t)}: ${t.ratingA} A on ${t.wire} is above the ${t.limit} A of 240.4(D); allowed for motor and air-conditioning circuits sized by Articles 430 and 440 — check the nameplate maximum.`;
const smallLimitText = (t: T) =>
	`${nameOf(t)}: ${t.wire} may be protected at ${t.limit} A at most; the breaker is ${t.ratingA} A.`;
const nextSizeText = (t: T) =>
	`${nameOf(t)}: ${t.wire} (${t.amp} A) on a ${t.ratingA} A breaker, the next standard rating up, is permitted.`;
const motorProtectionText = (t: T) =>
	`${nameOf(t)}: ${t.ratingA} A protects ${t.wire} (${t.amp} A); allowed only as motor or air-conditioning protection per the nameplate.`;
const overcurrentText = (t: T) =>
	`${nameOf(t)}: the ${t.ratingA} A breaker is larger than the ${t.amp} A ampacity of ${t.wire}.`;
const protectedText = (t: T) =>
	`${nameOf(t)}: ${t.wire} (${t.amp} A) is protected by the ${t.ratingA} A breaker.`;
const tenAmpText = (t: T) => `${nameOf(t)}: 10 A branch circuits are recognized from the 2023 edition.`;
const multioutletText = (t: T) =>
	`${nameOf(t)}: a lighting or receptacle circuit in a dwelling is rated 15 or 20 A, not ${t.ratingA} A.`;
const fastenedText = (t: T) =>
	`${nameOf(t)}: equipment fastened in place draws ${q(t.fastenedA, 'A')}, more than 50 % of ${t.ratingA} A on a circuit that also supplies lighting or receptacles.`;
const cordText = (t: T) =>
	`${nameOf(t)}: one cord-and-plug item draws ${q(t.cordA, 'A')}, more than 80 % of ${t.ratingA} A.`;
const feederDropText = (t: T) =>
	`${nameOf(t)}: the feeder drops ${q(t.vdPercent, '%')}; the recommendation leaves 5 % for feeder and branch together.`;
const branchDropText = (t: T) =>
	`${nameOf(t)}: voltage drop ${q(t.vdPercent, '%')} is over the 3 % recommended for a branch circuit (a recommendation, not a requirement).`;
const dropWithinText = (t: T) => `${nameOf(t)}: voltage drop ${q(t.vdPercent, '%')} is within 3 %.`;
const labelMissingText = (t: T) =>
	`${nameOf(t)} has no circuit directory entry; every circuit is identified by its purpose.`;
const noLoadsText = (t: T) => `${nameOf(t)} has no loads recorded.`;
/** Working of the voltage drop through the feeders and the branch. */
export const totalDropText = (t: T) =>
	`feeders ${q(t.upstream, '%')} + branch ${q(t.branch, '%')} = ${q(t.totalDrop, '%')}`;
/** Message of the voltage-drop-total note. */
export const totalDropNoteText = (t: T) =>
	`${nameOf(t)}: feeder and branch together drop ${q(t.totalDrop, '%')}, over the 5 % recommended.`;

function otherVoltageFinding(t: T, other: number, target: Finding['target']): Finding {
	const v = t.v;
	return finding(
		'note',
		'load-voltage',
		() => `${nameOf(t)}: a ${other} V item on a ${v} V circuit; check the nameplate allows ${v} V.`,
		COMMON_PRACTICE,
		target,
	);
}

/**
 * All checks of one circuit. `feeder` is set when the circuit supplies a subpanel; `t` gathers the
 * values the texts read (its name fields come from the circuit); `target` is the circuit's target.
 */
export function checkCircuit(
	c: Circuit,
	panel: Panel,
	stats: CircuitLoadStats,
	ctx: CircuitContext,
	feeder: FeederLoad | null,
	legs: Leg[],
	positions: number[],
	t: CircuitTexts = new CircuitTexts(c.id, c.position, c.label),
	target: Finding['target'] = { kind: 'circuit', id: c.id },
): CircuitResult {
	const ed = ctx.edition;
	const R = rulesFor(ed);
	const findings: Finding[] = [];
	const ratingA = c.ratingA;
	const poles = c.poles;
	const system = panel.voltageSystem;
	const v = circuitVoltage(poles, system);
	const divisor = poles === 3 ? v * Math.sqrt(3) : v;
	const divLabel = poles === 3 ? `(${v} V × √3)` : `${v} V`;
	t.ed = ed;
	t.ratingA = ratingA;
	t.poles = poles;
	t.v = v;
	t.divisor = divisor;
	t.divLabel = divLabel;
	const voltage =
		sharedFigure(ctx, system, 10 + poles) ??
		shareFigure(
			ctx,
			system,
			10 + poles,
			fig(v, 'V', 'nominal system voltage', `${poles}-pole breaker in a ${system} panelboard → ${v} V`),
		);

	const connected = feeder ? feeder.connectedVA : stats.connectedVA;
	t.connected = connected;
	t.count = stats.count;
	if (feeder) {
		t.feederPanelName = feeder.panelName;
		t.feederCalculatedVA = feeder.calculatedVA;
	}
	const connectedVA = figOf(
		roundTo(connected, 6),
		'VA',
		feeder ? 'sum of the subpanel’s connected loads' : 'sum of the recorded loads',
		feeder ? feederConnectedText : connectedText,
		t,
	);
	const ampsValue = connected / divisor;
	t.ampsValue = ampsValue;
	const amps = figOf(roundTo(ampsValue, 3), 'A', 'I = S ÷ V', ampsText, t);

	let breakerLoad: number;
	let breakerLoadA: Figure;
	let conductorLoad: number;
	let conductorLoadA: Figure;
	if (feeder) {
		breakerLoad = feeder.calculatedVA / divisor;
		t.breakerLoad = breakerLoad;
		breakerLoadA = figOf(roundTo(breakerLoad, 3), 'A', R.feederRating, feederLoadText, t);
		conductorLoad = breakerLoad;
		conductorLoadA = breakerLoadA;
	} else if (stats.onlyCooking && stats.count > 0 && stats.cookingKW.some((k) => k >= 8.75)) {
		// A household range of 8.75 kW or more: the branch-circuit load may be taken from Table 220.55.
		const d = cookingDemand(stats.cookingKW);
		breakerLoad = d.va / divisor;
		t.breakerLoad = breakerLoad;
		t.cookingVA = d.va;
		t.cookingWorking = d.working;
		breakerLoadA = figOf(roundTo(breakerLoad, 3), 'A', R.rangeBranch, cookingLoadText, t);
		conductorLoad = breakerLoad;
		conductorLoadA = breakerLoadA;
	} else {
		const continuousVA = stats.continuousVA;
		const largestMotorVA = stats.largestMotorVA;
		const nonc = stats.connectedVA - continuousVA;
		const va = nonc + 1.25 * continuousVA;
		const load = va / divisor;
		breakerLoad = load;
		t.continuousVA = continuousVA;
		t.largestMotorVA = largestMotorVA;
		t.nonc = nonc;
		t.va = va;
		t.breakerLoad = load;
		const breakerFigure = figOf(roundTo(load, 3), 'A', R.continuousBreaker, breakerLoadText, t);
		breakerLoadA = breakerFigure;
		const withMotor = load + (0.25 * largestMotorVA) / divisor;
		conductorLoad = withMotor;
		if (largestMotorVA > 0) {
			conductorLoadA = figOf(roundTo(withMotor, 3), 'A', R.motorConductor, motorLoadText, t);
		} else {
			t.breakerWorking = breakerFigure;
			conductorLoadA = figOf(
				breakerFigure.value,
				breakerFigure.unit,
				R.continuousConductor,
				sameAsBreakerText,
				t,
			);
		}
	}
	t.conductorLoad = conductorLoad;

	const breakerType = c.breakerType;
	const breakerA =
		sharedFigure(ctx, breakerType, ratingA * 10 + poles) ??
		shareFigure(
			ctx,
			breakerType,
			ratingA * 10 + poles,
			fig(
				ratingA,
				'A',
				R.standardRatings,
				`${ratingA} A ${poles}-pole ${breakerType === 'standard' ? '' : breakerType.toUpperCase() + ' '}breaker`,
			),
		);

	// Conductor ampacity at the lower of insulation and terminal temperature (110.14(C)).
	const { size, material, insulationC } = c.conductor;
	const terminalC = ctx.terminalC;
	const column = Math.min(insulationC, terminalC) as TemperatureC;
	const amp = tableAmpacity(size, material, column, ed);
	const wireKey = material === 'cu' ? 3 : 4;
	const wire =
		kept(size, wireKey) ??
		keep(size, wireKey, `${sizeLabel(size)} ${material === 'cu' ? 'copper' : 'aluminum'}`);
	t.wire = wire;
	t.column = column;
	const ampacityKey = insulationC * 10_000 + terminalC * 10 + EDITION_NUMBER[ed];
	const conductorAmpacityA =
		amp === null
			? null
			: (sharedFigure(ctx, wire, ampacityKey) ??
				shareFigure(
					ctx,
					wire,
					ampacityKey,
					fig(
						amp,
						'A',
						R.ampacityTerminals,
						`${wire}, ${column} °C column (insulation ${insulationC} °C, terminals ${terminalC} °C: the lower governs) → ${q(amp, 'A')}`,
					),
				));
	const limit = smallConductorLimitA(size, material);
	const smallLimit =
		limit === null
			? null
			: (sharedFigure(ctx, wire, 5) ??
				shareFigure(
					ctx,
					wire,
					5,
					fig(limit, 'A', R.smallConductors, `${wire}: overcurrent protection not over ${q(limit, 'A')}`),
				));

	// Breaker against its load.
	const over = breakerLoad > ratingA + 1e-9;
	findings.push(
		findingOf(
			over ? 'violation' : 'ok',
			feeder ? 'feeder-overload' : 'breaker-overload',
			over ? overloadText : withinText,
			t,
			breakerLoadA.rule,
			target,
		),
	);

	if (amp === null) {
		findings.push(
			findingOf('warning', 'ampacity-not-tabulated', notTabulatedText, t, R.ampacityTable, target),
		);
	} else {
		t.amp = amp;
		const under = conductorLoad > amp + 1e-9;
		findings.push(
			findingOf(
				under ? 'violation' : 'ok',
				'conductor-undersized',
				under ? undersizedText : carriesText,
				t,
				conductorLoadA.rule,
				target,
			),
		);
		const motorRule = R.motorAcConductors;
		if (limit !== null && ratingA > limit) {
			t.limit = limit;
			findings.push(
				stats.motorOrAcOnly && stats.count > 0
					? findingOf('note', 'small-conductor-limit', smallLimitNoteText, t, motorRule, target)
					: findingOf('violation', 'small-conductor-limit', smallLimitText, t, R.smallConductors, target),
			);
		} else if (ratingA > amp) {
			const next = standardRatingAbove(amp);
			const nextOk = !isStandardRating(amp) && next === ratingA && ratingA <= 800 && !stats.hasReceptacles;
			if (nextOk) {
				findings.push(findingOf('note', 'next-size-up', nextSizeText, t, R.nextSizeUp, target));
			} else if (stats.motorOrAcOnly && stats.count > 0) {
				findings.push(findingOf('note', 'conductor-overcurrent', motorProtectionText, t, motorRule, target));
			} else {
				findings.push(
					findingOf('violation', 'conductor-overcurrent', overcurrentText, t, R.ampacityNextSize, target),
				);
			}
		} else {
			findings.push(findingOf('ok', 'conductor-overcurrent', protectedText, t, R.smallConductors, target));
		}
	}

	if (ratingA === 10 && ed !== '2023') {
		findings.push(
			findingOf('warning', 'ten-amp-circuit', tenAmpText, t, section('tenAmpCircuits', '2023'), target),
		);
	}

	// 210.23: general-purpose outlet circuits in a dwelling are 15 or 20 A; cord-and-plug 80 %; fastened-in-place 50 %.
	if (!feeder && stats.hasGeneralOutlets) {
		if (ratingA > 20) {
			findings.push(findingOf('violation', 'multioutlet-rating', multioutletText, t, R.multioutlet, target));
		}
		const fastenedA = stats.fastenedVA / divisor;
		if (fastenedA > 0.5 * ratingA + 1e-9) {
			t.fastenedA = fastenedA;
			findings.push(findingOf('violation', 'fastened-over-50', fastenedText, t, R.fastenedInPlace, target));
		}
	}
	if (!feeder && stats.largestCordVA > 0) {
		const cordA = stats.largestCordVA / divisor;
		if (cordA > 0.8 * ratingA + 1e-9) {
			t.cordA = cordA;
			findings.push(findingOf('violation', 'cord-and-plug-over-80', cordText, t, R.cordAndPlug, target));
		}
	}
	if (stats.otherVoltages)
		for (const other of stats.otherVoltages) findings.push(otherVoltageFinding(t, other, target));

	const vdAmps = feeder ? breakerLoad : ampsValue;
	const vd = circuitDrop(t, vdAmps, c.lengthFt, c.conductor, poles, v, ed);
	const vdLimit = feeder ? 2 : 3;
	if (vd.percent.value > vdLimit) {
		findings.push(
			findingOf('note', 'voltage-drop', feeder ? feederDropText : branchDropText, t, vd.percent.rule, target),
		);
	} else if (!feeder) {
		findings.push(findingOf('ok', 'voltage-drop', dropWithinText, t, vd.percent.rule, target));
	}

	if (c.label.trim().length === 0) {
		findings.push(findingOf('violation', 'label-missing', labelMissingText, t, R.circuitDirectory, target));
	}
	if (!feeder && stats.count === 0) {
		findings.push(findingOf('note', 'no-loads', noLoadsText, t, COMMON_PRACTICE, target));
	}

	let legAmps: number[];
	if (feeder) {
		legAmps = [];
		for (let i = 0; i < legs.length; i++) legAmps.push(feeder.legAmps[i] ?? 0);
	} else {
		const perLeg = connected / divisor;
		legAmps = legs.length === 1 ? [perLeg] : legs.length === 2 ? [perLeg, perLeg] : [perLeg, perLeg, perLeg];
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
