/** Branch-circuit and feeder checks: load against breaker and conductor, conductor protection, 210.23, voltage drop. */
import { cookingDemand } from './dwelling';
import { fig, figOf, finding, findingOf, num, q, roundTo } from './format';
import type { TextOf } from './format';
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
import type { RoomLookup } from './protection';
import type { Edition, Figure, Finding, Leg, Severity, Target } from './types';

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
	/** The last figure found for each kind (see Kind), as most circuits repeat the one before. */
	last?: Last[];
}

/** The last shared figure found for one kind of figure. */
interface Last {
	key: string;
	n: number;
	figure: Figure | undefined;
}

/** Kinds of shared figure, each with its own Last. */
const VOLTAGE = 0;
const BREAKER = 1;
const AMPACITY = 2;
const LIMIT = 3;

/** A figure from the job's shared ones, or undefined before `shareFigure` keeps it (as `kept` does for texts). */
function sharedFigure(ctx: CircuitContext, kind: number, key: string, n: number): Figure | undefined {
	const last = ctx.last?.[kind];
	if (last && last.figure !== undefined && last.n === n && last.key === key) return last.figure;
	const f = ctx.figures?.get(key)?.get(n);
	if (f !== undefined) remember(ctx, kind, key, n, f);
	return f;
}

function shareFigure(ctx: CircuitContext, kind: number, key: string, n: number, f: Figure): Figure {
	const figures = (ctx.figures ??= new Map());
	let byNumber = figures.get(key);
	if (byNumber === undefined) {
		byNumber = new Map();
		figures.set(key, byNumber);
	}
	byNumber.set(n, f);
	remember(ctx, kind, key, n, f);
	return f;
}

function remember(ctx: CircuitContext, kind: number, key: string, n: number, f: Figure): void {
	const all = (ctx.last ??= [VOLTAGE, BREAKER, AMPACITY, LIMIT].map(() => ({
		key: '',
		n: 0,
		figure: undefined,
	})));
	const last = all[kind] as Last;
	last.key = key;
	last.n = n;
	last.figure = f;
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

/** The rule labels the circuit checks write, made once per edition. */
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
		afci: section('afci', ed),
		gfci: section('gfci', ed),
	};
}
const RULES = new Map<Edition, ReturnType<typeof rulesOf>>();
let lastRules: { ed: Edition; rules: ReturnType<typeof rulesOf> } | null = null;
export function rulesFor(ed: Edition): ReturnType<typeof rulesOf> {
	if (lastRules?.ed === ed) return lastRules.rules;
	let r = RULES.get(ed);
	if (!r) {
		r = rulesOf(ed);
		RULES.set(ed, r);
	}
	lastRules = { ed, rules: r };
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

/** Keeps the voltage drop of a circuit in `t`, for its figures and texts. */
function setDrop(
	t: CircuitTexts,
	amps: number,
	lengthFt: number,
	conductor: Circuit['conductor'],
	poles: 1 | 2 | 3,
	volts: number,
): void {
	const k = K_FACTOR[conductor.material];
	const cm = CIRCULAR_MILS[conductor.size];
	const mult = poles === 3 ? Math.sqrt(3) : 2;
	const vd = (mult * k * amps * lengthFt) / cm;
	const pct = volts > 0 ? (vd / volts) * 100 : 0;
	const n = t.n;
	const o = t.o;
	n[o + N_DROP_K] = k;
	n[o + N_DROP_AMPS] = amps;
	n[o + N_DROP_LENGTH] = lengthFt;
	n[o + N_DROP] = vd;
	n[o + N_DROP_VOLTS] = volts;
	n[o + N_DROP_PERCENT] = pct;
	n[o + N_VD_PERCENT] = roundTo(pct, 3);
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
export const TEXT_NUMBERS = 29;
// Where each number sits from the circuit's offset. The checks write and read them in place: a
// number passed through a setter or returned by a getter may be boxed.
const N_CONNECTED = 0;
const N_AMPS_VALUE = 1;
const N_BREAKER_LOAD = 2;
const N_CONDUCTOR_LOAD = 3;
const N_NONC = 4;
const N_CONTINUOUS_VA = 5;
const N_VA = 6;
const N_LARGEST_MOTOR_VA = 7;
const N_DIVISOR = 8;
const N_FEEDER_CALCULATED_VA = 9;
const N_COOKING_VA = 10;
const N_FASTENED_A = 11;
const N_CORD_A = 12;
const N_VD_PERCENT = 13;
const N_UPSTREAM = 14;
const N_BRANCH = 15;
const N_TOTAL_DROP = 16;
const N_DROP_K = 17;
const N_DROP_AMPS = 18;
const N_DROP_LENGTH = 19;
const N_DROP = 20;
const N_DROP_VOLTS = 21;
const N_DROP_PERCENT = 22;
const N_LOADS_FROM = 23;
const N_V = 24;
const N_COUNT = 25;
const N_COLUMN = 26;
const N_AMP = 27;
const N_LIMIT = 28;

/** What the circuits of one job share, kept once rather than on each circuit. */
export interface CircuitShared {
	ed: Edition;
	/** The job's loads grouped by circuit: a circuit's are from `loadsFrom`, `count` of them. */
	loads: readonly Load[];
	/** The job's rooms by id, for the AFCI and GFCI texts. */
	rooms: RoomLookup | null;
	/** The circuits' numbers, TEXT_NUMBERS of them each. */
	n: Float64Array;
	/** Message of the afci-required 'ok' finding. */
	afciOkText: TextOf<CircuitTexts> | null;
	/** Rule of the AFCI findings when a local amendment applies another edition's list; null: the job's edition. */
	afciRule: string | null;
}

/** Shared values for a circuit checked on its own. */
export function circuitShared(ed: Edition): CircuitShared {
	return {
		ed,
		loads: NONE,
		rooms: null,
		n: new Float64Array(TEXT_NUMBERS),
		afciOkText: null,
		afciRule: null,
	};
}

/** What only some circuits have: kept aside so that the common circuit stays small. */
interface Rare {
	name: string | null;
	breakerWorking: Figure | null;
	feederPanelName: string;
	cookingWorking: string;
	roomIds: readonly string[] | null;
	gfciRooms: readonly Room[];
	feedsPanelId: string | null;
	other: Set<number> | null;
	feederLegs: number[] | null;
	extra: Finding[] | null;
	target: Target | null;
}

/**
 * What a circuit's texts read, written when first shown: values fixed as the checks run. One object
 * per circuit instead of a closure per text; its numbers sit at `o` in `shared.n`. A large job has
 * one per circuit, so it keeps few fields: what all circuits of the job share is in `shared`, what
 * few circuits have in `rare`.
 */
export class CircuitTexts {
	protected rare: Rare | null = null;
	constructor(
		readonly circuit: Circuit,
		readonly shared: CircuitShared,
		readonly o = 0,
	) {}
	protected get r(): Rare {
		return (this.rare ??= {
			name: null,
			breakerWorking: null,
			feederPanelName: '',
			cookingWorking: '',
			roomIds: null,
			gfciRooms: NONE,
			feedsPanelId: null,
			other: null,
			feederLegs: null,
			extra: null,
			target: null,
		});
	}
	get n(): Float64Array {
		return this.shared.n;
	}
	get ed(): Edition {
		return this.shared.ed;
	}
	get loads(): readonly Load[] {
		return this.shared.loads;
	}
	get rooms(): RoomLookup | null {
		return this.shared.rooms;
	}
	get afciRule(): string {
		return this.shared.afciRule ?? rulesFor(this.shared.ed).afci;
	}
	get name(): string | null {
		return this.rare?.name ?? null;
	}
	set name(x: string | null) {
		this.r.name = x;
	}
	get breakerWorking(): Figure | null {
		return this.rare?.breakerWorking ?? null;
	}
	set breakerWorking(x: Figure | null) {
		this.r.breakerWorking = x;
	}
	get feederPanelName(): string {
		return this.rare?.feederPanelName ?? '';
	}
	set feederPanelName(x: string) {
		this.r.feederPanelName = x;
	}
	get cookingWorking(): string {
		return this.rare?.cookingWorking ?? '';
	}
	set cookingWorking(x: string) {
		this.r.cookingWorking = x;
	}
	/** Rooms the circuit and its loads serve (the circuit's own list unless its loads add rooms). */
	get roomIds(): readonly string[] {
		return this.rare?.roomIds ?? this.circuit.roomIds;
	}
	set roomIds(x: readonly string[]) {
		if (x !== this.circuit.roomIds || this.rare) this.r.roomIds = x;
	}
	get gfciRooms(): readonly Room[] {
		return this.rare?.gfciRooms ?? NONE;
	}
	set gfciRooms(x: readonly Room[]) {
		this.r.gfciRooms = x;
	}
	// Read from the circuit rather than kept: a large job has one of these per circuit.
	get id(): string {
		return this.circuit.id;
	}
	get position(): number {
		return this.circuit.position;
	}
	get label(): string {
		return this.circuit.label;
	}
	get ratingA(): number {
		return this.circuit.ratingA;
	}
	get poles(): 1 | 2 | 3 {
		return this.circuit.poles;
	}
	get divLabel(): string {
		return this.circuit.poles === 3 ? `(${this.v} V × √3)` : `${this.v} V`;
	}
	get wire(): string {
		return wireText(this.circuit.conductor);
	}
	get dropM(): string {
		return this.circuit.poles === 3 ? '√3' : '2';
	}
	get dropCable(): string {
		const conductor = this.circuit.conductor;
		return cableText(conductor, CIRCULAR_MILS[conductor.size]);
	}
	get v(): number {
		return this.n[this.o + N_V] as number;
	}
	get count(): number {
		return this.n[this.o + N_COUNT] as number;
	}
	get column(): number {
		return this.n[this.o + N_COLUMN] as number;
	}
	get amp(): number {
		return this.n[this.o + N_AMP] as number;
	}
	get limit(): number {
		return this.n[this.o + N_LIMIT] as number;
	}
	get connected(): number {
		return this.n[this.o + N_CONNECTED] as number;
	}
	get ampsValue(): number {
		return this.n[this.o + N_AMPS_VALUE] as number;
	}
	get breakerLoad(): number {
		return this.n[this.o + N_BREAKER_LOAD] as number;
	}
	get conductorLoad(): number {
		return this.n[this.o + N_CONDUCTOR_LOAD] as number;
	}
	get nonc(): number {
		return this.n[this.o + N_NONC] as number;
	}
	get continuousVA(): number {
		return this.n[this.o + N_CONTINUOUS_VA] as number;
	}
	get va(): number {
		return this.n[this.o + N_VA] as number;
	}
	get largestMotorVA(): number {
		return this.n[this.o + N_LARGEST_MOTOR_VA] as number;
	}
	get divisor(): number {
		return this.n[this.o + N_DIVISOR] as number;
	}
	get feederCalculatedVA(): number {
		return this.n[this.o + N_FEEDER_CALCULATED_VA] as number;
	}
	get cookingVA(): number {
		return this.n[this.o + N_COOKING_VA] as number;
	}
	get fastenedA(): number {
		return this.n[this.o + N_FASTENED_A] as number;
	}
	get cordA(): number {
		return this.n[this.o + N_CORD_A] as number;
	}
	get vdPercent(): number {
		return this.n[this.o + N_VD_PERCENT] as number;
	}
	get upstream(): number {
		return this.n[this.o + N_UPSTREAM] as number;
	}
	get branch(): number {
		return this.n[this.o + N_BRANCH] as number;
	}
	get totalDrop(): number {
		return this.n[this.o + N_TOTAL_DROP] as number;
	}
	get dropK(): number {
		return this.n[this.o + N_DROP_K] as number;
	}
	get dropAmps(): number {
		return this.n[this.o + N_DROP_AMPS] as number;
	}
	get dropLength(): number {
		return this.n[this.o + N_DROP_LENGTH] as number;
	}
	get drop(): number {
		return this.n[this.o + N_DROP] as number;
	}
	get dropVolts(): number {
		return this.n[this.o + N_DROP_VOLTS] as number;
	}
	get dropPercent(): number {
		return this.n[this.o + N_DROP_PERCENT] as number;
	}
	get loadsFrom(): number {
		return this.n[this.o + N_LOADS_FROM] as number;
	}
	set loadsFrom(x: number) {
		this.n[this.o + N_LOADS_FROM] = x;
	}
}

/** The conductor in words, e.g. '12 AWG copper'. */
function wireText(conductor: Circuit['conductor']): string {
	const { size, material } = conductor;
	// Most circuits repeat the conductor of the one before.
	const last = lastWire;
	if (last.size === size && last.material === material) return last.text;
	const key = material === 'cu' ? 3 : 4;
	const text =
		kept(size, key) ?? keep(size, key, `${sizeLabel(size)} ${material === 'cu' ? 'copper' : 'aluminum'}`);
	last.size = size;
	last.material = material;
	last.text = text;
	return text;
}
const lastWire = { size: '', material: '', text: '' };

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
	const from = t.loadsFrom;
	const to = Math.min(from + t.count, from + 6, t.loads.length);
	for (let k = from; k < to; k++) {
		const l = t.loads[k] as Load;
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

const FEEDER = 1;
const COOKING = 2;
const MOTOR = 4;
const MOTOR_OR_AC_ONLY = 8;
const HAS_RECEPTACLES = 16;
const GENERAL = 32;
const FASTENED_OVER = 64;
const CORD_OVER = 128;
const TOTAL = 256;
const TOTAL_NOTE = 512;
const AFCI_OK = 1024;

/** Index of a severity in a count of findings: ok, note, warning, violation. */
export function severityIndex(s: Severity): number {
	return s === 'ok' ? 0 : s === 'note' ? 1 : s === 'warning' ? 2 : 3;
}

interface Made {
	connectedVA: Figure | null;
	amps: Figure | null;
	breakerLoadA: Figure | null;
	conductorLoadA: Figure | null;
	voltageDrop: VoltageDrop | null;
	voltageDropTotal: Figure | null;
	legAmps: number[] | null;
	findings: Finding[] | null;
}

const NO_POSITIONS: number[] = [];
const NO_LEGS: Leg[] = [];

/**
 * One circuit's result, which is also what its texts read (the CircuitTexts it extends). The checks
 * work out its numbers; its figures and findings are made when first read, since a large job has
 * hundreds of thousands and most are never shown. toJSON gives the plain object, fields in the
 * interface's order, so JSON is unchanged. Read it by property name: spread, Object.keys and
 * structured clone do not see the fields made when read.
 */
export class CircuitChecks extends CircuitTexts implements CircuitResult {
	positions: number[] = NO_POSITIONS;
	legs: Leg[] = NO_LEGS;
	voltage!: Figure;
	breakerA!: Figure;
	conductorAmpacityA: Figure | null = null;
	smallConductorLimitA: Figure | null = null;
	#flags = 0;
	/** Figures and findings made so far. */
	#made: Made | null = null;
	get feedsPanelId(): string | null {
		return this.rare?.feedsPanelId ?? null;
	}
	get #other(): Set<number> | null {
		return this.rare?.other ?? null;
	}
	get #feederLegs(): number[] | null {
		return this.rare?.feederLegs ?? null;
	}
	get #extra(): Finding[] | null {
		return this.rare?.extra ?? null;
	}
	/** Keeps what checkCircuit found. */
	set(
		flags: number,
		positions: number[],
		legs: Leg[],
		feedsPanelId: string | null,
		feederLegs: number[] | null,
		voltage: Figure,
		breakerA: Figure,
		conductorAmpacityA: Figure | null,
		smallConductorLimitA: Figure | null,
		other: Set<number> | null,
	): void {
		this.positions = positions;
		this.legs = legs;
		this.voltage = voltage;
		this.breakerA = breakerA;
		this.conductorAmpacityA = conductorAmpacityA;
		this.smallConductorLimitA = smallConductorLimitA;
		this.#flags = flags;
		if (feedsPanelId !== null || feederLegs !== null || other !== null) {
			const r = this.r;
			r.feedsPanelId = feedsPanelId;
			r.feederLegs = feederLegs;
			r.other = other;
		}
	}
	get #m(): Made {
		return (this.#made ??= {
			connectedVA: null,
			amps: null,
			breakerLoadA: null,
			conductorLoadA: null,
			voltageDrop: null,
			voltageDropTotal: null,
			legAmps: null,
			findings: null,
		});
	}
	get circuitId(): string {
		return this.circuit.id;
	}
	get panelId(): string {
		return this.circuit.panelId;
	}
	get status(): Circuit['status'] {
		return this.circuit.status;
	}
	/** The target of the circuit's findings. */
	get target(): Target {
		const r = this.r;
		return (r.target ??= { kind: 'circuit', id: this.circuit.id });
	}
	/** connectedVA.value, without making the figure. */
	get connectedValue(): number {
		return roundTo(this.n[this.o + N_CONNECTED] as number, 6);
	}
	/** voltageDrop.percent.value, without making the figure. */
	get dropPercentValue(): number {
		return this.n[this.o + N_VD_PERCENT] as number;
	}
	/** legAmps[i], without making the list. */
	legAmp(i: number): number {
		if (this.#feederLegs) return this.#feederLegs[i] ?? 0;
		return i < this.legs.length ? (this.n[this.o + N_AMPS_VALUE] as number) : 0;
	}
	get connectedVA(): Figure {
		const m = this.#m;
		if (m.connectedVA) return m.connectedVA;
		const feeder = (this.#flags & FEEDER) !== 0;
		return (this.#m.connectedVA = figOf(
			roundTo(this.connected, 6),
			'VA',
			feeder ? 'sum of the subpanel’s connected loads' : 'sum of the recorded loads',
			feeder ? feederConnectedText : connectedText,
			this,
		));
	}
	get amps(): Figure {
		return (this.#m.amps ??= figOf(roundTo(this.ampsValue, 3), 'A', 'I = S ÷ V', ampsText, this));
	}
	get breakerLoadA(): Figure {
		const m = this.#m;
		if (m.breakerLoadA) return m.breakerLoadA;
		const R = rulesFor(this.ed);
		const f = this.#flags;
		const value = roundTo(this.breakerLoad, 3);
		return (this.#m.breakerLoadA =
			(f & FEEDER) !== 0
				? figOf(value, 'A', R.feederRating, feederLoadText, this)
				: (f & COOKING) !== 0
					? figOf(value, 'A', R.rangeBranch, cookingLoadText, this)
					: figOf(value, 'A', R.continuousBreaker, breakerLoadText, this));
	}
	get conductorLoadA(): Figure {
		const m = this.#m;
		if (m.conductorLoadA) return m.conductorLoadA;
		const f = this.#flags;
		const breaker = this.breakerLoadA;
		if ((f & (FEEDER | COOKING)) !== 0) return (this.#m.conductorLoadA = breaker);
		const R = rulesFor(this.ed);
		if ((f & MOTOR) !== 0)
			return (this.#m.conductorLoadA = figOf(
				roundTo(this.conductorLoad, 3),
				'A',
				R.motorConductor,
				motorLoadText,
				this,
			));
		this.breakerWorking = breaker;
		return (this.#m.conductorLoadA = figOf(
			breaker.value,
			breaker.unit,
			R.continuousConductor,
			sameAsBreakerText,
			this,
		));
	}
	get voltageDrop(): VoltageDrop {
		const m = this.#m;
		if (m.voltageDrop) return m.voltageDrop;
		const rule = rulesFor(this.ed).voltageDrop;
		return (this.#m.voltageDrop = {
			volts: figOf(roundTo(this.drop, 3), 'V', rule, circuitDropVoltsText, this),
			percent: figOf(this.vdPercent, '%', rule, circuitDropPercentText, this),
		});
	}
	get voltageDropTotal(): Figure | null {
		if ((this.#flags & TOTAL) === 0) return null;
		const m = this.#m;
		if (m.voltageDropTotal) return m.voltageDropTotal;
		return (this.#m.voltageDropTotal = figOf(
			roundTo(this.totalDrop, 3),
			'%',
			rulesFor(this.ed).voltageDrop,
			totalDropText,
			this,
		));
	}
	get legAmps(): number[] {
		const m = this.#m;
		if (m.legAmps) return m.legAmps;
		if (this.#feederLegs) return (this.#m.legAmps = this.#feederLegs);
		const perLeg = this.ampsValue;
		const n = this.legs.length;
		return (this.#m.legAmps = n === 1 ? [perLeg] : n === 2 ? [perLeg, perLeg] : [perLeg, perLeg, perLeg]);
	}
	get findings(): Finding[] {
		const m = this.#m;
		if (m.findings) return m.findings;
		const out: Finding[] = [];
		this.#emit(out, null);
		return (this.#m.findings = out);
	}
	/** Adds findings made elsewhere (protection), after the circuit's own. */
	addFindings(list: readonly Finding[]): void {
		if (list.length === 0) return;
		const made = this.#made?.findings;
		if (made) for (const f of list) made.push(f);
		else if (this.#extra) for (const f of list) this.#extra.push(f);
		else this.r.extra = list.slice();
	}
	/** Adds the afci-required 'ok' finding (message `shared.afciOkText`, rule `afciRule`) after the others, made when read. */
	addAfciOk(): void {
		const made = this.#made?.findings;
		const text = this.shared.afciOkText;
		if (!text) return;
		if (made) made.push(findingOf('ok', 'afci-required', text, this, this.afciRule, this.target));
		else this.#flags |= AFCI_OK;
	}
	/** Adds the voltage drop of the feeders between this circuit's panel and the service. */
	addUpstreamDrop(up: number): void {
		const n = this.n;
		const o = this.o;
		const branch = n[o + N_VD_PERCENT] as number;
		const total = up + branch;
		n[o + N_UPSTREAM] = up;
		n[o + N_BRANCH] = branch;
		n[o + N_TOTAL_DROP] = total;
		this.#flags |= total > 5 ? TOTAL | TOTAL_NOTE : TOTAL;
		const made = this.#made?.findings;
		if (made && total > 5)
			made.push(
				findingOf(
					'note',
					'voltage-drop-total',
					totalDropNoteText,
					this,
					rulesFor(this.ed).voltageDrop,
					this.target,
				),
			);
	}
	/** Adds the count of each severity of the circuit's findings to `counts` (ok, note, warning, violation). */
	countFindings(counts: number[]): void {
		const made = this.#made?.findings;
		if (made) {
			for (const f of made) {
				const i = severityIndex(f.severity);
				counts[i] = (counts[i] as number) + 1;
			}
		} else this.#emit(null, counts);
	}
	#add(
		out: Finding[] | null,
		counts: number[] | null,
		severity: Severity,
		code: string,
		text: TextOf<CircuitTexts>,
		rule: string,
	): void {
		if (out) out.push(findingOf(severity, code, text, this, rule, this.target));
		else if (counts) {
			const i = severityIndex(severity);
			counts[i] = (counts[i] as number) + 1;
		}
	}
	#emit(out: Finding[] | null, counts: number[] | null): void {
		const f = this.#flags;
		const ed = this.ed;
		const n = this.n;
		const o = this.o;
		const R = rulesFor(ed);
		const ratingA = this.ratingA;
		const feeder = (f & FEEDER) !== 0;
		const breakerRule = feeder ? R.feederRating : (f & COOKING) !== 0 ? R.rangeBranch : R.continuousBreaker;
		const conductorRule =
			(f & (FEEDER | COOKING)) !== 0
				? breakerRule
				: (f & MOTOR) !== 0
					? R.motorConductor
					: R.continuousConductor;
		const over = (n[o + N_BREAKER_LOAD] as number) > ratingA + 1e-9;
		this.#add(
			out,
			counts,
			over ? 'violation' : 'ok',
			feeder ? 'feeder-overload' : 'breaker-overload',
			over ? overloadText : withinText,
			breakerRule,
		);
		const amp = this.conductorAmpacityA === null ? null : (n[o + N_AMP] as number);
		const limit = this.smallConductorLimitA === null ? null : this.smallConductorLimitA.value;
		const motorOnly = (f & MOTOR_OR_AC_ONLY) !== 0 && (n[o + N_COUNT] as number) > 0;
		if (amp === null) {
			this.#add(out, counts, 'warning', 'ampacity-not-tabulated', notTabulatedText, R.ampacityTable);
		} else {
			const under = (n[o + N_CONDUCTOR_LOAD] as number) > amp + 1e-9;
			this.#add(
				out,
				counts,
				under ? 'violation' : 'ok',
				'conductor-undersized',
				under ? undersizedText : carriesText,
				conductorRule,
			);
			if (limit !== null && ratingA > limit) {
				if (motorOnly)
					this.#add(out, counts, 'note', 'small-conductor-limit', smallLimitNoteText, R.motorAcConductors);
				else this.#add(out, counts, 'violation', 'small-conductor-limit', smallLimitText, R.smallConductors);
			} else if (ratingA > amp) {
				const next = standardRatingAbove(amp);
				const nextOk =
					!isStandardRating(amp) && next === ratingA && ratingA <= 800 && (f & HAS_RECEPTACLES) === 0;
				if (nextOk) this.#add(out, counts, 'note', 'next-size-up', nextSizeText, R.nextSizeUp);
				else if (motorOnly)
					this.#add(out, counts, 'note', 'conductor-overcurrent', motorProtectionText, R.motorAcConductors);
				else
					this.#add(out, counts, 'violation', 'conductor-overcurrent', overcurrentText, R.ampacityNextSize);
			} else {
				this.#add(out, counts, 'ok', 'conductor-overcurrent', protectedText, R.smallConductors);
			}
		}
		if (ratingA === 10 && ed !== '2023') {
			this.#add(out, counts, 'warning', 'ten-amp-circuit', tenAmpText, section('tenAmpCircuits', '2023'));
		}
		if (!feeder && (f & GENERAL) !== 0) {
			if (ratingA > 20)
				this.#add(out, counts, 'violation', 'multioutlet-rating', multioutletText, R.multioutlet);
			if ((f & FASTENED_OVER) !== 0)
				this.#add(out, counts, 'violation', 'fastened-over-50', fastenedText, R.fastenedInPlace);
		}
		if (!feeder && (f & CORD_OVER) !== 0)
			this.#add(out, counts, 'violation', 'cord-and-plug-over-80', cordText, R.cordAndPlug);
		const other = this.#other;
		if (other)
			for (const o of other) {
				if (out) out.push(otherVoltageFinding(this, o, this.target));
				else if (counts) counts[1] = (counts[1] as number) + 1;
			}
		if ((n[o + N_VD_PERCENT] as number) > (feeder ? 2 : 3)) {
			this.#add(out, counts, 'note', 'voltage-drop', feeder ? feederDropText : branchDropText, R.voltageDrop);
		} else if (!feeder) {
			this.#add(out, counts, 'ok', 'voltage-drop', dropWithinText, R.voltageDrop);
		}
		if (this.circuit.label.trim().length === 0) {
			this.#add(out, counts, 'violation', 'label-missing', labelMissingText, R.circuitDirectory);
		}
		if (!feeder && n[o + N_COUNT] === 0)
			this.#add(out, counts, 'note', 'no-loads', noLoadsText, COMMON_PRACTICE);
		const extra = this.#extra;
		if (extra) {
			if (out) for (const x of extra) out.push(x);
			else if (counts)
				for (const x of extra) {
					const i = severityIndex(x.severity);
					counts[i] = (counts[i] as number) + 1;
				}
		}
		const afciOk = this.shared.afciOkText;
		if ((f & AFCI_OK) !== 0 && afciOk) this.#add(out, counts, 'ok', 'afci-required', afciOk, this.afciRule);
		if ((f & TOTAL_NOTE) !== 0)
			this.#add(out, counts, 'note', 'voltage-drop-total', totalDropNoteText, R.voltageDrop);
	}
	toJSON(): CircuitResult {
		return {
			circuitId: this.circuitId,
			panelId: this.panelId,
			label: this.label,
			status: this.status,
			positions: this.positions,
			legs: this.legs,
			feedsPanelId: this.feedsPanelId,
			voltage: this.voltage,
			connectedVA: this.connectedVA,
			amps: this.amps,
			breakerLoadA: this.breakerLoadA,
			conductorLoadA: this.conductorLoadA,
			breakerA: this.breakerA,
			conductorAmpacityA: this.conductorAmpacityA,
			smallConductorLimitA: this.smallConductorLimitA,
			voltageDrop: this.voltageDrop,
			voltageDropTotal: this.voltageDropTotal,
			legAmps: this.legAmps,
			findings: this.findings,
		};
	}
}

/**
 * All checks of one circuit. `feeder` is set when the circuit supplies a subpanel; `t`, the result,
 * also gathers the values the texts read (its name fields come from the circuit).
 */
export function checkCircuit(
	c: Circuit,
	panel: Panel,
	stats: CircuitLoadStats,
	ctx: CircuitContext,
	feeder: FeederLoad | null,
	legs: Leg[],
	positions: number[],
	t: CircuitChecks = new CircuitChecks(c, circuitShared(ctx.edition)),
): CircuitChecks {
	const ed = ctx.edition;
	const R = rulesFor(ed);
	const ratingA = c.ratingA;
	const poles = c.poles;
	const system = panel.voltageSystem;
	const v = circuitVoltage(poles, system);
	const divisor = poles === 3 ? v * Math.sqrt(3) : v;
	// Numbers go straight into the job's array (see N_CONNECTED).
	const n = t.n;
	const o = t.o;
	n[o + N_V] = v;
	n[o + N_DIVISOR] = divisor;
	let flags = 0;
	const voltage =
		sharedFigure(ctx, VOLTAGE, system, 10 + poles) ??
		shareFigure(
			ctx,
			VOLTAGE,
			system,
			10 + poles,
			fig(v, 'V', 'nominal system voltage', `${poles}-pole breaker in a ${system} panelboard → ${v} V`),
		);

	const connected = feeder ? feeder.connectedVA : stats.connectedVA;
	n[o + N_CONNECTED] = connected;
	n[o + N_COUNT] = stats.count;
	if (feeder) {
		flags |= FEEDER;
		t.feederPanelName = feeder.panelName;
		n[o + N_FEEDER_CALCULATED_VA] = feeder.calculatedVA;
	}
	const ampsValue = connected / divisor;
	n[o + N_AMPS_VALUE] = ampsValue;

	let breakerLoad: number;
	let conductorLoad: number;
	if (feeder) {
		breakerLoad = feeder.calculatedVA / divisor;
		n[o + N_BREAKER_LOAD] = breakerLoad;
		conductorLoad = breakerLoad;
	} else if (stats.onlyCooking && stats.count > 0 && stats.cookingKW.some((k) => k >= 8.75)) {
		// A household range of 8.75 kW or more: the branch-circuit load may be taken from Table 220.55.
		flags |= COOKING;
		const d = cookingDemand(stats.cookingKW);
		breakerLoad = d.va / divisor;
		n[o + N_BREAKER_LOAD] = breakerLoad;
		n[o + N_COOKING_VA] = d.va;
		t.cookingWorking = d.working;
		conductorLoad = breakerLoad;
	} else {
		const continuousVA = stats.continuousVA;
		const largestMotorVA = stats.largestMotorVA;
		const nonc = stats.connectedVA - continuousVA;
		const va = nonc + 1.25 * continuousVA;
		const load = va / divisor;
		breakerLoad = load;
		n[o + N_CONTINUOUS_VA] = continuousVA;
		n[o + N_LARGEST_MOTOR_VA] = largestMotorVA;
		n[o + N_NONC] = nonc;
		n[o + N_VA] = va;
		n[o + N_BREAKER_LOAD] = load;
		conductorLoad = load + (0.25 * largestMotorVA) / divisor;
		if (largestMotorVA > 0) flags |= MOTOR;
	}
	n[o + N_CONDUCTOR_LOAD] = conductorLoad;

	const breakerType = c.breakerType;
	const breakerA =
		sharedFigure(ctx, BREAKER, breakerType, ratingA * 10 + poles) ??
		shareFigure(
			ctx,
			BREAKER,
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
	const wire = wireText(c.conductor);
	n[o + N_COLUMN] = column;
	const ampacityKey = insulationC * 10_000 + terminalC * 10 + (ed === '2017' ? 0 : ed === '2020' ? 1 : 2);
	const conductorAmpacityA =
		amp === null
			? null
			: (sharedFigure(ctx, AMPACITY, wire, ampacityKey) ??
				shareFigure(
					ctx,
					AMPACITY,
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
			: (sharedFigure(ctx, LIMIT, wire, 5) ??
				shareFigure(
					ctx,
					LIMIT,
					wire,
					5,
					fig(limit, 'A', R.smallConductors, `${wire}: overcurrent protection not over ${q(limit, 'A')}`),
				));

	if (amp !== null) {
		n[o + N_AMP] = amp;
		if (limit !== null && ratingA > limit) n[o + N_LIMIT] = limit;
	}
	if (stats.motorOrAcOnly) flags |= MOTOR_OR_AC_ONLY;
	if (stats.hasReceptacles) flags |= HAS_RECEPTACLES;
	if (!feeder && stats.hasGeneralOutlets) {
		flags |= GENERAL;
		const fastenedA = stats.fastenedVA / divisor;
		if (fastenedA > 0.5 * ratingA + 1e-9) {
			n[o + N_FASTENED_A] = fastenedA;
			flags |= FASTENED_OVER;
		}
	}
	if (!feeder && stats.largestCordVA > 0) {
		const cordA = stats.largestCordVA / divisor;
		if (cordA > 0.8 * ratingA + 1e-9) {
			n[o + N_CORD_A] = cordA;
			flags |= CORD_OVER;
		}
	}

	setDrop(t, feeder ? breakerLoad : ampsValue, c.lengthFt, c.conductor, poles, v);

	let feederLegs: number[] | null = null;
	if (feeder) {
		feederLegs = [];
		for (let i = 0; i < legs.length; i++) feederLegs.push(feeder.legAmps[i] ?? 0);
	}

	t.set(
		flags,
		positions,
		legs,
		feeder ? feeder.panelId : null,
		feederLegs,
		voltage,
		breakerA,
		conductorAmpacityA,
		smallLimit,
		stats.otherVoltages,
	);
	return t;
}
