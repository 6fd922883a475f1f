/** computeJob: every check of a job document in one pass over its records. */
import {
	CircuitChecks,
	TEXT_NUMBERS,
	checkCircuit,
	circuitName,
	emptyStats,
	severityIndex,
} from './circuit-checks';
import type {
	CircuitContext,
	CircuitLoadStats,
	CircuitResult,
	CircuitShared,
	FeederLoad,
} from './circuit-checks';
import {
	addLoad,
	ampsFigures,
	cloneBucket,
	emptyBucket,
	existingAddedMethod,
	measuredDemandMethod,
	mergeBucket,
	optionalMethod,
	standardMethod,
} from './dwelling';
import type { GeneralLoadOptions, LoadBucket, Supply } from './dwelling';
import { fig, finding, num, q, roundTo } from './format';
import { isContinuous, isMotor, unitVA } from './load-values';
import { circuitVoltage, legOf, legsOf, positionsTaken, rowOf, sideOf } from './positions';
import {
	afciOkText,
	isReceptacleLoad,
	protectionEditions,
	protectionFindings,
	requiredCircuitFindings,
	type ProtectionEditions,
} from './protection';
import type { RequiredCircuitFacts, RoomLookup } from './protection';
import type { Circuit, JobDocument, Load, Panel, Room, VoltageSystem } from './schema';
import { COMMON_PRACTICE, section } from './sections';
import { MIN_SERVICE_ONE_FAMILY_A, nextStandardRatingA } from './tables';
import type { Edition, Figure, Finding, Leg, Line, Severity, Target } from './types';

export interface PositionSlot {
	position: number;
	row: number;
	side: 'left' | 'right';
	leg: Leg;
	/** The circuit in the position, or null when free. */
	circuitId: string | null;
}

export interface LegLoad {
	leg: Leg;
	amps: Figure;
	va: Figure;
}

export interface PanelResult {
	panelId: string;
	name: string;
	kind: Panel['kind'];
	voltageSystem: VoltageSystem;
	spaces: number;
	positions: PositionSlot[];
	used: number;
	free: number;
	freePositions: number[];
	legs: LegLoad[];
	imbalance: Figure;
	connectedVA: Figure;
	connectedA: Figure;
	/** Standard-method load of everything this panel supplies. */
	calculation: Line[];
	calculatedVA: Figure;
	calculatedA: Figure;
	busRatingA: number;
	mainBreakerA: number | null;
	/** For a subpanel: its feeder circuit; null for a main panel. */
	feederCircuitId: string | null;
	findings: Finding[];
}

export type MethodId = 'standard' | 'optional' | 'existing-added' | 'measured-demand';

export interface MethodResult {
	method: MethodId;
	title: string;
	rule: string;
	applicable: boolean;
	/** Why the method applies or does not. */
	reason: string;
	lines: Line[];
	totalVA: Figure | null;
	amps: Figure | null;
	ampsRounded: Figure | null;
	minimumServiceA: Figure | null;
	headroomA: Figure | null;
	headroomVA: Figure | null;
	withinService: boolean | null;
}

export interface ServiceResult {
	ratingA: number;
	voltageSystem: VoltageSystem;
	floorArea: Figure;
	methods: MethodResult[];
	neutral: { lines: Line[]; totalVA: Figure; amps: Figure; ampsRounded: Figure };
	/** The applicable method giving the lowest load, or null. */
	lowestMethod: MethodId | null;
	minimumServiceA: Figure;
	findings: Finding[];
}

export interface JobResult {
	job: {
		id: string | null;
		name: string;
		address: string;
		codeEdition: Edition;
		terminalTemperatureC: number;
	};
	circuits: CircuitResult[];
	panels: PanelResult[];
	/** Job-level protection and required-circuit findings (per-circuit GFCI/AFCI findings sit on the circuits). */
	protection: Finding[];
	service: ServiceResult;
	/** Every finding, flattened. */
	findings: Finding[];
	summary: Record<Severity, number>;
}

/** Clears the load statistics for the next circuit. */
function resetStats(s: CircuitLoadStats): void {
	s.count = 0;
	s.connectedVA = 0;
	s.continuousVA = 0;
	s.largestMotorVA = 0;
	s.hasGeneralOutlets = false;
	s.hasReceptacles = false;
	s.fastenedVA = 0;
	s.largestCordVA = 0;
	s.motorOrAcOnly = true;
	s.otherVoltages = null;
	if (s.cookingKW.length > 0) s.cookingKW = [];
	s.onlyCooking = true;
}

/** Everything computeJob keeps while it checks the circuits one by one. */
interface CircuitPass {
	ed: Edition;
	ctx: CircuitContext;
	shared: CircuitShared;
	resultAt: (CircuitChecks | undefined)[];
	grouped: Load[];
	loadStart: Int32Array;
	/** 1 at the index of each circuit that feeds a panel. */
	feedsPanel: Uint8Array;
	/** The job's rooms by id. */
	rooms: RoomFinder;
	/** 1 at the index in doc.rooms of each room a circuit or load names. */
	served: Uint8Array;
	stats: CircuitLoadStats;
	facts: RequiredCircuitFacts;
	panelFedBy: ReadonlyMap<string, string>;
	work: ReadonlyMap<string, PanelWork>;
	circuitResults: Map<string, CircuitChecks>;
	/** Findings protectionFindings makes for the current circuit. */
	extra: Finding[];
	/** The GFCI and AFCI editions and rules (the job's, or a local amendment's). */
	protection: ProtectionEditions;
}

/** The job's rooms found by id; loads mostly repeat the room of the one before, so the last is kept. */
class RoomFinder implements RoomLookup {
	#lastId: string | null = null;
	#lastAt = -1;
	constructor(
		readonly rooms: readonly Room[],
		readonly byId: ReadonlyMap<string, number>,
	) {}
	/** Index in doc.rooms of room `id`, -1 for no room. */
	at(id: string): number {
		if (id === this.#lastId) return this.#lastAt;
		const i = this.byId.get(id) ?? -1;
		this.#lastId = id;
		this.#lastAt = i;
		return i;
	}
	get(id: string): Room | undefined {
		const i = this.at(id);
		return i < 0 ? undefined : this.rooms[i];
	}
}

/** Marks the rooms of `ids` served. */
function markServed(s: CircuitPass, ids: readonly string[]): void {
	for (let j = 0; j < ids.length; j++) {
		const i = s.rooms.at(ids[j] as string);
		if (i >= 0) s.served[i] = 1;
	}
}

/** Checks circuit `c` (at `index` in doc.circuits) of panel `w` and adds its loads to the panel's. */
function runCircuit(
	s: CircuitPass,
	w: PanelWork,
	legIndex: readonly Leg[],
	places: Map<number, { positions: number[]; legs: Leg[] }>,
	c: Circuit,
	index: number,
): void {
	const { ed, ctx, shared, resultAt, grouped, loadStart, stats, facts, panelFedBy, work } = s;
	const p = w.panel;
	const t = new CircuitChecks(c, shared, index * TEXT_NUMBERS);
	const from = loadStart[index] as number;
	const to = loadStart[index + 1] as number;
	t.loadsFrom = from;
	const v = circuitVoltage(c.poles, p.voltageSystem);
	resetStats(stats);
	let firstSA = true;
	let firstLaundry = true;
	let hasReceptacle = false;
	const served = s.served;
	markServed(s, c.roomIds);
	for (let k = from; k < to; k++) {
		const l = grouped[k] as Load;
		const each = unitVA(l);
		const total = each * l.quantity;
		stats.count++;
		stats.connectedVA += total;
		if (isContinuous(l)) stats.continuousVA += total;
		if (isMotor(l) && each > stats.largestMotorVA) stats.largestMotorVA = each;
		const general =
			l.kind === 'lighting' ||
			l.kind === 'receptacles' ||
			l.kind === 'small-appliance' ||
			l.kind === 'laundry';
		if (general) stats.hasGeneralOutlets = true;
		if (isReceptacleLoad(l)) {
			stats.hasReceptacles = true;
			hasReceptacle = true;
		}
		if (l.cordAndPlug && each > stats.largestCordVA) stats.largestCordVA = each;
		if (!general && !l.cordAndPlug) stats.fastenedVA += total;
		if (!(isMotor(l) || l.kind === 'hvac-cool' || l.kind === 'heat-pump')) stats.motorOrAcOnly = false;
		if (l.voltage !== v && l.voltage !== 120) (stats.otherVoltages ??= new Set()).add(l.voltage);
		if (l.kind === 'range') for (let i = 0; i < l.quantity; i++) stats.cookingKW.push(each / 1000);
		else stats.onlyCooking = false;
		const added = (l.status ?? (c.status === 'new' ? 'new' : 'existing')) === 'new';
		const bucket = added ? w.own.added : w.own.existing;
		// Rooms served by general lighting and receptacle loads go with the load into its bucket (addLoad).
		const kind = l.kind;
		const roomsCount = kind === 'lighting' || kind === 'receptacles' || kind === 'small-appliance';
		const ids = l.roomIds;
		for (let j = 0; j < ids.length; j++) {
			const i = s.rooms.at(ids[j] as string);
			if (i < 0) continue;
			served[i] = 1;
			if (roomsCount) bucket.rooms.addIndex(i);
		}
		const first = kind === 'small-appliance' ? firstSA : kind === 'laundry' ? firstLaundry : false;
		addLoad(bucket, l, ed, first, each);
		if (l.kind === 'small-appliance') firstSA = false;
		if (l.kind === 'laundry') firstLaundry = false;
	}
	if (!firstSA) facts.smallAppliance.push(t);
	if (!firstLaundry) facts.laundry.push(t);
	if (hasReceptacle && c.poles === 1 && c.ratingA === 20) {
		const rooms = facts.receptacle20ARooms;
		for (const r of c.roomIds) {
			const i = s.rooms.at(r);
			if (i >= 0) rooms[i] = 1;
		}
		for (let k = from; k < to; k++) {
			const l = grouped[k] as Load;
			if (isReceptacleLoad(l))
				for (const r of l.roomIds) {
					const i = s.rooms.at(r);
					if (i >= 0) rooms[i] = 1;
				}
		}
	}

	const subId = s.feedsPanel[index] === 1 ? panelFedBy.get(c.id) : undefined;
	const sub = subId !== undefined ? work.get(subId) : undefined;
	const feeder: FeederLoad | null = sub
		? {
				panelId: sub.panel.id,
				panelName: sub.panel.name,
				connectedVA: sub.connectedVA,
				calculatedVA: sub.calculatedVA,
				legAmps: sub.legAmps,
			}
		: null;
	const key = c.position * 4 + c.poles;
	let place = places.get(key);
	if (!place) {
		const positions = positionsTaken(c.position, c.poles);
		place = { positions, legs: positions.map((pos) => legOf(pos, p.voltageSystem)) };
		places.set(key, place);
	}
	const { positions, legs } = place;
	const r = checkCircuit(c, p, stats, ctx, feeder, legs, positions, t);
	const extra = s.extra;
	const afciOk = protectionFindings(c, grouped, from, to, s.rooms, s.protection, t, r, extra);
	if (extra.length > 0) {
		r.addFindings(extra);
		extra.length = 0;
	}
	if (afciOk) r.addAfciOk();
	resultAt[index] = r;
	if (sub) s.circuitResults.set(c.id, r);
	w.connectedVA += r.connectedValue;
	for (let i = 0; i < legs.length; i++) {
		const li = legIndex.indexOf(legs[i] as Leg);
		if (li >= 0) w.legAmps[li] = (w.legAmps[li] ?? 0) + r.legAmp(i);
	}
}

/** Finds a circuit of the job by id. */
interface CircuitLookup {
	get(id: string): Circuit | undefined;
}

/**
 * Index in doc.circuits of a circuit id. Indexing every circuit of a large job costs more than the
 * rest of its setup, so only the ids other records name (feeders, multiwire partners) are indexed
 * up front. Loads usually name their circuits in document order: `find` looks from where the last
 * one was found, and builds the full index only once such searches have compared as many ids as
 * there are circuits.
 */
class CircuitIndex {
	#named = new Map<string, number>();
	#all: Map<string, number> | null = null;
	#budget: number;
	constructor(readonly circuits: readonly Circuit[]) {
		this.#budget = circuits.length;
	}
	/** Indexes a circuit named by another record. */
	name(id: string, i: number): void {
		this.#named.set(id, i);
	}
	get(id: string): number | undefined {
		return this.#named.get(id) ?? this.#full().get(id);
	}
	/** The index of `id`, looked for from `start` on first. */
	find(id: string, start: number): number | undefined {
		if (this.#all === null) {
			const cs = this.circuits;
			for (let i = start; i < cs.length && this.#budget > 0; i++, this.#budget--)
				if ((cs[i] as Circuit).id === id) return i;
		}
		return this.#full().get(id);
	}
	#full(): Map<string, number> {
		if (this.#all === null) {
			this.#all = new Map();
			for (let i = 0; i < this.circuits.length; i++) this.#all.set((this.circuits[i] as Circuit).id, i);
		}
		return this.#all;
	}
}

const NO_ORDER = new Int32Array(0);

const EXCLUDED_FROM_AREA = new Set(['garage', 'outdoor', 'attic', 'crawl-space']);

function roomCounts(r: Room): boolean {
	return r.inFloorArea ?? !EXCLUDED_FROM_AREA.has(r.type);
}

function supplyOf(system: VoltageSystem): Supply {
	return system === '120/240-1ph-3w'
		? { divisor: 240, label: '240 V' }
		: { divisor: 208 * Math.sqrt(3), label: '(208 V × √3 = 360.27 V)' };
}

interface PanelWork {
	panel: Panel;
	/** Index of this work in the job's list of them. */
	ordinal: number;
	/**
	 * The panel's circuits, in document order: the k-th (k < count) is all[order[from + k]]. One
	 * list for the job's circuits grouped by panel, rather than two growing arrays per panel.
	 */
	all: readonly Circuit[];
	order: Int32Array;
	from: number;
	count: number;
	own: { existing: LoadBucket; added: LoadBucket };
	subtree: LoadBucket | null;
	connectedVA: number;
	legAmps: number[];
	calculatedVA: number;
	result: PanelResult | null;
}

/** Runs every check on a validated job document. Pure: the same document always gives the same result. */
export function computeJob(doc: JobDocument): JobResult {
	const ed = doc.codeEdition;
	const ctx: CircuitContext = { edition: ed, terminalC: doc.terminalTemperatureC, figures: new Map() };
	const jobId = doc.id ?? doc.name;
	const roomIds = new Map<string, number>();
	for (let i = 0; i < doc.rooms.length; i++) roomIds.set((doc.rooms[i] as Room).id, i);
	const rooms = new RoomFinder(doc.rooms, roomIds);
	const roomCount = doc.rooms.length;

	const work = new Map<string, PanelWork>();
	const works: PanelWork[] = [];
	for (const p of doc.panels) {
		const w: PanelWork = {
			panel: p,
			ordinal: works.length,
			all: doc.circuits,
			order: NO_ORDER,
			from: 0,
			count: 0,
			own: { existing: emptyBucket(roomCount), added: emptyBucket(roomCount) },
			subtree: null,
			connectedVA: 0,
			legAmps: legsOf(p.voltageSystem).map(() => 0),
			calculatedVA: 0,
			result: null,
		};
		works.push(w);
		work.set(p.id, w);
	}
	const panelFedBy = new Map<string, string>(); // circuit id → sub panel id
	for (const p of doc.panels) if (p.fedFromCircuitId !== null) panelFedBy.set(p.fedFromCircuitId, p.id);

	// Circuits by id as their index in doc.circuits; loads by that index.
	const named = new Set<string>(panelFedBy.keys());
	for (const c of doc.circuits) if (c.multiwireWith !== null) named.add(c.multiwireWith);
	const index = new CircuitIndex(doc.circuits);
	const circuitsById: CircuitLookup = {
		get: (id) => {
			const i = index.get(id);
			return i === undefined ? undefined : doc.circuits[i];
		},
	};
	let existingDwelling = false;
	// Circuits of one panel usually follow each other: the lookup is skipped for a repeated panel.
	let lastPanelId: string | null = null;
	let lastWork: PanelWork | undefined;
	// The ordinal of the work of each circuit's panel; -1 for a removed circuit or one in no panel.
	const panelAt = new Int32Array(doc.circuits.length);
	let listed = 0;
	for (let i = 0; i < doc.circuits.length; i++) {
		const c = doc.circuits[i] as Circuit;
		if (named.size > 0 && named.has(c.id)) index.name(c.id, i);
		panelAt[i] = -1;
		if (c.status === 'removed') continue;
		if (c.status === 'existing' || c.status === 'modified') existingDwelling = true;
		const w = c.panelId === lastPanelId ? lastWork : work.get(c.panelId);
		lastPanelId = c.panelId;
		lastWork = w;
		if (w) {
			panelAt[i] = w.ordinal;
			w.count++;
			listed++;
		}
	}
	// Each panel's circuits in one list, in document order.
	const order = new Int32Array(listed);
	const fillAt = new Int32Array(works.length);
	let start = 0;
	for (const w of works) {
		w.order = order;
		w.from = start;
		fillAt[w.ordinal] = start;
		start += w.count;
	}
	for (let i = 0; i < doc.circuits.length; i++) {
		const at = panelAt[i] as number;
		if (at < 0) continue;
		order[fillAt[at] as number] = i;
		fillAt[at] = (fillAt[at] as number) + 1;
	}
	const feedsPanel = new Uint8Array(doc.circuits.length);
	for (const id of panelFedBy.keys()) {
		const i = index.get(id);
		if (i !== undefined) feedsPanel[i] = 1;
	}
	// Loads grouped by circuit in one list, in document order: circuit i's are from loadStart[i] to before loadStart[i + 1].
	const loadCircuit = new Int32Array(doc.loads.length);
	const loadStart = new Int32Array(doc.circuits.length + 1);
	// Loads of one circuit usually follow each other: the lookup is skipped for a repeated id.
	let lastId: string | null = null;
	let lastIndex: number | undefined;
	// Whether the document already lists the loads by circuit, in the circuits' order.
	let inOrder = true;
	for (let k = 0; k < doc.loads.length; k++) {
		const id = (doc.loads[k] as Load).circuitId;
		const i = id === lastId ? lastIndex : index.find(id, lastIndex === undefined ? 0 : lastIndex + 1);
		if (i === undefined || (lastIndex !== undefined && i < lastIndex)) inOrder = false;
		lastId = id;
		lastIndex = i;
		loadCircuit[k] = i === undefined ? -1 : i;
		if (i !== undefined) loadStart[i + 1] = (loadStart[i + 1] as number) + 1;
	}
	for (let i = 0; i < doc.circuits.length; i++)
		loadStart[i + 1] = (loadStart[i + 1] as number) + (loadStart[i] as number);
	let grouped: Load[] = doc.loads;
	if (!inOrder) {
		grouped = new Array(loadStart[doc.circuits.length] as number);
		const fill = loadStart.slice(0, doc.circuits.length);
		for (let k = 0; k < doc.loads.length; k++) {
			const i = loadCircuit[k] as number;
			if (i < 0) continue;
			grouped[fill[i] as number] = doc.loads[k] as Load;
			fill[i] = (fill[i] as number) + 1;
		}
	}

	// Panels children first, so a feeder circuit sees its subpanel's totals.
	const children = new Map<string, string[]>();
	const roots: string[] = [];
	for (const p of doc.panels) {
		const up = p.fedFromCircuitId !== null ? circuitsById.get(p.fedFromCircuitId)?.panelId : undefined;
		if (up === undefined) roots.push(p.id);
		else {
			const list = children.get(up);
			if (list) list.push(p.id);
			else children.set(up, [p.id]);
		}
	}
	const preOrder: string[] = [];
	const stack = [...roots].reverse();
	while (stack.length > 0) {
		const id = stack.pop() as string;
		preOrder.push(id);
		const kids = children.get(id);
		if (kids) for (let i = kids.length - 1; i >= 0; i--) stack.push(kids[i] as string);
	}
	const postOrder = [...preOrder].reverse();

	const facts: RequiredCircuitFacts = {
		smallAppliance: [],
		laundry: [],
		receptacle20ARooms: new Uint8Array(doc.rooms.length),
	};
	// Results by index in doc.circuits; feeders also by id, for their subpanels.
	const resultAt: (CircuitChecks | undefined)[] = new Array(doc.circuits.length);
	const protectionEds = protectionEditions(ed, doc.ruleOptions);
	const shared: CircuitShared = {
		ed,
		loads: grouped,
		rooms,
		n: new Float64Array(doc.circuits.length * TEXT_NUMBERS),
		afciOkText,
		afciRule: protectionEds.afci === ed ? null : protectionEds.afciRule,
	};
	// Positions and legs by first position and poles, shared by the circuits that take the same ones.
	const placesBySystem = new Map<VoltageSystem, Map<number, { positions: number[]; legs: Leg[] }>>();
	const stats: CircuitLoadStats = emptyStats();
	const circuitResults = new Map<string, CircuitChecks>();
	const jobArea = floorArea(doc);
	const soleRoot = roots.length === 1 ? roots[0] : undefined;
	const pass: CircuitPass = {
		ed,
		ctx,
		shared,
		resultAt,
		grouped,
		loadStart,
		feedsPanel,
		rooms,
		served: new Uint8Array(doc.rooms.length),
		stats,
		facts,
		panelFedBy,
		work,
		circuitResults,
		extra: [],
		protection: protectionEds,
	};

	for (const panelId of postOrder) {
		const w = work.get(panelId);
		if (!w) continue;
		const p = w.panel;
		const legIndex = legsOf(p.voltageSystem);
		let places = placesBySystem.get(p.voltageSystem);
		if (!places) {
			places = new Map();
			placesBySystem.set(p.voltageSystem, places);
		}
		for (let k = 0; k < w.count; k++) {
			const i = w.order[w.from + k] as number;
			runCircuit(pass, w, legIndex, places, doc.circuits[i] as Circuit, i);
		}
		// Everything this panel supplies, for its calculated load. The sole main panel's rooms are not
		// read (its area is the job's), so they are not gathered.
		const whole = panelId === soleRoot;
		const subtree = mergeBucket(cloneBucket(w.own.existing, !whole), w.own.added, !whole);
		for (const kid of children.get(panelId) ?? []) {
			const k = work.get(kid);
			if (k?.subtree) mergeBucket(subtree, k.subtree, !whole);
		}
		w.subtree = subtree;
		let area = 0;
		if (!whole)
			for (const i of subtree.rooms.order) {
				const room = doc.rooms[i] as Room;
				if (roomCounts(room)) area += room.areaFt2;
			}
		const opts: GeneralLoadOptions = whole
			? { edition: ed, areaFt2: jobArea.value, areaSource: jobArea.source, minimumCircuits: true }
			: { edition: ed, areaFt2: area, areaSource: 'rooms this panel supplies', minimumCircuits: false };
		const calc = standardMethod(subtree, opts, supplyOf(p.voltageSystem));
		w.calculatedVA = calc.total.value;
		// The sole main panel carries the whole dwelling: it is judged by the service's lowest method, below.
		if (!whole) w.result = panelResult(w, calc.lines, ed, circuitsById, circuitResults);
	}

	// Voltage drop through feeders, service side first.
	const upstreamPct = new Map<string, number>();
	for (const panelId of preOrder) {
		const p = work.get(panelId)?.panel;
		if (!p) continue;
		const feederId = p.fedFromCircuitId;
		const feeder = feederId !== null ? circuitResults.get(feederId) : undefined;
		const up = feeder ? (upstreamPct.get(feeder.panelId) ?? 0) + feeder.dropPercentValue : 0;
		upstreamPct.set(panelId, up);
	}
	const circuits: CircuitChecks[] = [];
	// Findings by severity (ok, note, warning, violation), counted from the circuits' numbers: their
	// findings are made only when read.
	const counts = [0, 0, 0, 0];
	// Circuits of one panel usually follow each other: the lookup is skipped for a repeated panel.
	let upPanel: string | null = null;
	let up = 0;
	for (let i = 0; i < doc.circuits.length; i++) {
		const r = resultAt[i];
		if (!r) continue;
		const panelId = r.panelId;
		if (panelId !== upPanel) {
			up = upstreamPct.get(panelId) ?? 0;
			upPanel = panelId;
		}
		if (up > 0 && r.feedsPanelId === null) r.addUpstreamDrop(up);
		r.countFindings(counts);
		circuits.push(r);
	}

	// Service. Only the measured-demand method reads rooms (those with added loads).
	const all = emptyBucket(roomCount);
	const added = emptyBucket(roomCount);
	const addedRooms = doc.service.existingLoad !== null;
	for (const w of work.values()) {
		mergeBucket(all, w.own.existing, false);
		mergeBucket(all, w.own.added, false);
		mergeBucket(added, w.own.added, addedRooms);
	}
	const service = serviceResult(doc, all, added, existingDwelling, jobArea, jobId);
	const rootWork = soleRoot !== undefined ? work.get(soleRoot) : undefined;
	if (rootWork) {
		const lowest = service.methods.find((m) => m.method === service.lowestMethod);
		if (lowest?.totalVA) rootWork.calculatedVA = lowest.totalVA.value;
		rootWork.result = panelResult(rootWork, lowest?.lines ?? [], ed, circuitsById, circuitResults);
	}
	for (const root of roots) {
		const w = work.get(root);
		const main = w?.panel.mainBreakerA;
		if (w?.result && main !== null && main !== undefined && main > doc.service.ratingA) {
			w.result.findings.push(
				finding(
					'warning',
					'main-exceeds-service',
					() =>
						`Panel ${w.panel.name}: the ${main} A main breaker is larger than the ${doc.service.ratingA} A service rating.`,
					COMMON_PRACTICE,
					{ kind: 'panel', id: w.panel.id },
				),
			);
		}
	}

	const protection = requiredCircuitFindings(facts, doc.rooms, ed, existingDwelling, jobId);
	// Rooms of the circuits and loads the pass did not check: removed circuits' loads, circuits in no panel, loads of no circuit.
	for (let i = 0; i < doc.circuits.length; i++) {
		if (resultAt[i] !== undefined) continue;
		const c = doc.circuits[i] as Circuit;
		if (c.status !== 'removed') markServed(pass, c.roomIds);
		for (let k = loadStart[i] as number; k < (loadStart[i + 1] as number); k++)
			markServed(pass, (grouped[k] as Load).roomIds);
	}
	for (let k = 0; k < doc.loads.length; k++)
		if (loadCircuit[k] === -1) markServed(pass, (doc.loads[k] as Load).roomIds);
	for (let i = 0; i < doc.rooms.length; i++) {
		const room = doc.rooms[i] as Room;
		if (pass.served[i] === 0) {
			protection.push(
				finding(
					'note',
					'room-unserved',
					() => `${room.name} has no circuit or load recorded.`,
					COMMON_PRACTICE,
					{
						kind: 'room',
						id: room.id,
					},
				),
			);
		}
	}

	const panels: PanelResult[] = [];
	for (const p of doc.panels) {
		const r = work.get(p.id)?.result;
		if (r) panels.push(r);
	}
	const count = (list: readonly Finding[]) => {
		for (const f of list) {
			const i = severityIndex(f.severity);
			counts[i] = (counts[i] as number) + 1;
		}
	};
	for (const p of panels) count(p.findings);
	count(protection);
	count(service.findings);
	const summary: Record<Severity, number> = {
		ok: counts[0] as number,
		note: counts[1] as number,
		warning: counts[2] as number,
		violation: counts[3] as number,
	};

	return new JobResults(
		{
			id: doc.id,
			name: doc.name,
			address: doc.address,
			codeEdition: ed,
			terminalTemperatureC: doc.terminalTemperatureC,
		},
		circuits,
		panels,
		protection,
		service,
		summary,
	);
}

/** A job's results; `findings`, the flattened list, is made when first read. toJSON gives the plain object. */
class JobResults implements JobResult {
	#findings: Finding[] | null = null;
	constructor(
		readonly job: JobResult['job'],
		readonly circuits: CircuitResult[],
		readonly panels: PanelResult[],
		readonly protection: Finding[],
		readonly service: ServiceResult,
		readonly summary: Record<Severity, number>,
	) {}
	get findings(): Finding[] {
		if (this.#findings) return this.#findings;
		const findings: Finding[] = [];
		for (const r of this.circuits) for (const f of r.findings) findings.push(f);
		for (const p of this.panels) for (const f of p.findings) findings.push(f);
		for (const f of this.protection) findings.push(f);
		for (const f of this.service.findings) findings.push(f);
		return (this.#findings = findings);
	}
	toJSON(): JobResult {
		return {
			job: this.job,
			circuits: this.circuits,
			panels: this.panels,
			protection: this.protection,
			service: this.service,
			findings: this.findings,
			summary: this.summary,
		};
	}
}

function floorArea(doc: JobDocument): { value: number; source: string; figure: Figure } {
	const rule = section('generalLighting', doc.codeEdition);
	const given = doc.floorAreaFt2;
	if (given !== null) {
		return {
			value: given,
			source: 'floor area given',
			figure: fig(given, 'ft2', rule, `floor area given for the job: ${num(given)} ft²`),
		};
	}
	let sum = 0;
	let counted = 0;
	for (const r of doc.rooms) {
		if (roomCounts(r)) {
			sum += r.areaFt2;
			counted++;
		}
	}
	return {
		value: sum,
		source: 'sum of rooms',
		figure: fig(
			sum,
			'ft2',
			rule,
			() => `sum of ${counted} rooms (garage, outdoor, attic and crawl space not counted) = ${num(sum)} ft²`,
		),
	};
}

function panelResult(
	w: PanelWork,
	calculation: Line[],
	ed: Edition,
	circuitsById: CircuitLookup,
	circuitResults: ReadonlyMap<string, CircuitResult>,
): PanelResult {
	const p = w.panel;
	const target = { kind: 'panel', id: p.id } as const;
	const findings: Finding[] = [];
	// The circuit in each position (its k in the panel's list), -1 when free; the slots are listed when first read.
	const occupant = new Int32Array(p.spaces).fill(-1);
	for (let k = 0; k < w.count; k++) {
		const c = circuitAt(w, k);
		const last = c.position + 2 * (c.poles - 1);
		let ct: Target | null = null;
		if (last > p.spaces) {
			ct = { kind: 'circuit', id: c.id };
			findings.push(beyondSpaces(c, p, ct));
		}
		for (let t = c.position; t <= last; t += 2) {
			const at = occupant[t - 1];
			if (at === undefined) continue;
			if (at >= 0) {
				ct ??= { kind: 'circuit', id: c.id };
				findings.push(positionConflict(c, circuitAt(w, at), t, p, ct));
			} else occupant[t - 1] = k;
		}
		if (c.multiwireWith !== null && c.id < c.multiwireWith) {
			checkMultiwire(c, circuitsById.get(c.multiwireWith), p, ed, findings);
		} else if (c.multiwireWith !== null) {
			const other = circuitsById.get(c.multiwireWith);
			if (other && other.multiwireWith !== c.id) checkMultiwire(c, other, p, ed, findings);
		}
	}
	let free = 0;
	for (const at of occupant) if (at < 0) free++;
	const used = p.spaces - free;
	let slots: PositionSlot[] | null = null;
	let freePositions: number[] | null = null;
	if (free === 0) {
		findings.push(
			finding('note', 'panel-full', () => `Panel ${p.name} has no free positions.`, COMMON_PRACTICE, target),
		);
	}

	const legs = legsOf(p.voltageSystem);
	const legLoads: LegLoad[] = legs.map((leg, i) => {
		const a = w.legAmps[i] ?? 0;
		return {
			leg,
			amps: fig(roundTo(a, 3), 'A', 'sum of the breakers on the leg', () => `leg ${leg}: ${q(a, 'A')}`),
			va: fig(
				roundTo(a * 120, 3),
				'VA',
				'line-to-neutral VA',
				() => `${q(a, 'A')} × 120 V = ${q(a * 120, 'VA')}`,
			),
		};
	});
	let max = 0;
	let min = Number.POSITIVE_INFINITY;
	for (const a of w.legAmps) {
		if (a > max) max = a;
		if (a < min) min = a;
	}
	if (!Number.isFinite(min)) min = 0;
	const imb = max > 0 ? ((max - min) / max) * 100 : 0;
	const imbalance = fig(roundTo(imb, 2), '%', COMMON_PRACTICE, () =>
		max > 0
			? `(${q(max, 'A')} − ${q(min, 'A')}) ÷ ${q(max, 'A')} × 100 = ${q(imb, '%')}`
			: 'no load on any leg',
	);
	if (imb > 20 && max - min > 10) {
		findings.push(
			finding(
				'note',
				'leg-imbalance',
				() =>
					`Panel ${p.name}: legs differ by ${q(imb, '%')} (${q(max - min, 'A')}); moving circuits would even them out.`,
				COMMON_PRACTICE,
				target,
			),
		);
	}

	const supply = supplyOf(p.voltageSystem);
	// Plain values for the texts, which are written when first read.
	const connected = w.connectedVA;
	const calculated = w.calculatedVA;
	const circuitCount = w.count;
	const connectedVA = fig(
		roundTo(connected, 3),
		'VA',
		'sum of the circuits',
		() => `${circuitCount} circuits: ${q(connected, 'VA')}`,
	);
	const connectedA = fig(
		roundTo(connected / supply.divisor, 3),
		'A',
		'I = S ÷ V',
		() => `${q(connected, 'VA')} ÷ ${supply.label} = ${q(connected / supply.divisor, 'A')}`,
	);
	const total = calculation[calculation.length - 1];
	const calculatedVA = fig(
		calculated,
		'VA',
		total?.rule ?? `NEC ${ed} Article 220 Part III`,
		total ? () => total.working : '',
	);
	const calcA = calculated / supply.divisor;
	const calculatedA = fig(
		roundTo(calcA, 3),
		'A',
		'I = S ÷ V',
		() => `${q(calculated, 'VA')} ÷ ${supply.label} = ${q(calcA, 'A')}`,
	);

	const ratingRule = section('panelRating', ed);
	findings.push(
		calcA > p.busRatingA
			? finding(
					'violation',
					'panel-bus-overload',
					() => `Panel ${p.name}: calculated load ${q(calcA, 'A')} is more than the ${p.busRatingA} A bus.`,
					ratingRule,
					target,
				)
			: finding(
					'ok',
					'panel-bus-overload',
					() => `Panel ${p.name}: calculated load ${q(calcA, 'A')} is within the ${p.busRatingA} A bus.`,
					ratingRule,
					target,
				),
	);
	if (p.mainBreakerA !== null) {
		if (calcA > p.mainBreakerA) {
			findings.push(
				finding(
					'violation',
					'panel-main-overload',
					() =>
						`Panel ${p.name}: calculated load ${q(calcA, 'A')} is more than the ${p.mainBreakerA} A main breaker.`,
					ratingRule,
					target,
				),
			);
		}
		if (p.mainBreakerA > p.busRatingA) {
			findings.push(
				finding(
					'violation',
					'main-exceeds-bus',
					() =>
						`Panel ${p.name}: the ${p.mainBreakerA} A main breaker is larger than the ${p.busRatingA} A bus it protects.`,
					section('panelProtection', ed),
					target,
				),
			);
		}
	}
	let feederCircuitId: string | null = null;
	if (p.fedFromCircuitId !== null) {
		feederCircuitId = p.fedFromCircuitId;
		const feeder = circuitsById.get(p.fedFromCircuitId);
		const parentSystem = feeder ? circuitResults.get(feeder.id) : undefined;
		if (feeder && p.mainBreakerA === null && feeder.ratingA > p.busRatingA) {
			findings.push(
				finding(
					'violation',
					'feeder-exceeds-bus',
					() =>
						`Panel ${p.name} is main-lug: its ${feeder.ratingA} A feeder breaker is larger than the ${p.busRatingA} A bus.`,
					section('panelProtection', ed),
					target,
				),
			);
		}
		if (parentSystem && parentSystem.voltage.value !== (p.voltageSystem === '120/240-1ph-3w' ? 240 : 208)) {
			findings.push(
				finding(
					'warning',
					'voltage-system-mismatch',
					() =>
						`Panel ${p.name} is ${p.voltageSystem} but its feeder supplies ${parentSystem.voltage.value} V.`,
					COMMON_PRACTICE,
					target,
				),
			);
		}
	} else if (p.mainBreakerA === null) {
		findings.push(
			finding(
				'note',
				'main-lug',
				() => `Panel ${p.name} is main-lug; the service disconnect must be ahead of it.`,
				section('panelProtection', ed),
				target,
			),
		);
	}

	return {
		panelId: p.id,
		name: p.name,
		kind: p.kind,
		voltageSystem: p.voltageSystem,
		spaces: p.spaces,
		get positions() {
			return (slots ??= positionSlots(w, occupant));
		},
		used,
		free,
		get freePositions() {
			if (freePositions === null) {
				freePositions = [];
				for (let i = 0; i < occupant.length; i++) if ((occupant[i] as number) < 0) freePositions.push(i + 1);
			}
			return freePositions;
		},
		legs: legLoads,
		imbalance,
		connectedVA,
		connectedA,
		calculation,
		calculatedVA,
		calculatedA,
		busRatingA: p.busRatingA,
		mainBreakerA: p.mainBreakerA,
		feederCircuitId,
		findings,
	};
}

/** The k-th circuit of a panel's list. */
function circuitAt(w: PanelWork, k: number): Circuit {
	return w.all[w.order[w.from + k] as number] as Circuit;
}

/** The position slots of a panel from the circuit in each position (its k in the panel's list, -1 when free). */
function positionSlots(w: PanelWork, occupant: Int32Array): PositionSlot[] {
	const p = w.panel;
	const slots: PositionSlot[] = [];
	for (let pos = 1; pos <= p.spaces; pos++) {
		const at = occupant[pos - 1] as number;
		slots.push({
			position: pos,
			row: rowOf(pos),
			side: sideOf(pos),
			leg: legOf(pos, p.voltageSystem),
			circuitId: at < 0 ? null : circuitAt(w, at).id,
		});
	}
	return slots;
}

function beyondSpaces(c: Circuit, p: Panel, target: Target): Finding {
	const beyond = positionsTaken(c.position, c.poles).filter((t) => t > p.spaces);
	return finding(
		'violation',
		'position-beyond-spaces',
		() =>
			`${circuitName(c)} takes position ${beyond.join(', ')}, beyond the ${p.spaces} spaces of panel ${p.name}.`,
		COMMON_PRACTICE,
		target,
	);
}

function positionConflict(c: Circuit, other: Circuit, position: number, p: Panel, target: Target): Finding {
	return finding(
		'violation',
		'position-conflict',
		() => `${circuitName(c)} and ${circuitName(other)} both take position ${position} of panel ${p.name}.`,
		COMMON_PRACTICE,
		target,
	);
}

function checkMultiwire(
	c: Circuit,
	other: Circuit | undefined,
	p: Panel,
	ed: Edition,
	findings: Finding[],
): void {
	if (!other) return;
	const target = { kind: 'circuit', id: c.id } as const;
	if (other.panelId !== c.panelId) {
		findings.push(
			finding(
				'violation',
				'multiwire-panels',
				() => `${circuitName(c)} shares a neutral with ${circuitName(other)} in another panel.`,
				section('multiwire', ed),
				target,
			),
		);
		return;
	}
	const legA = legOf(c.position, p.voltageSystem);
	const legB = legOf(other.position, p.voltageSystem);
	if (legA === legB) {
		findings.push(
			finding(
				'violation',
				'multiwire-same-leg',
				() =>
					`${circuitName(c)} and ${circuitName(other)} share a neutral but both sit on leg ${legA}; the neutral would carry the sum of both currents.`,
				section('multiwireLegs', ed),
				target,
			),
		);
	} else {
		findings.push(
			finding(
				'ok',
				'multiwire-same-leg',
				() =>
					`${circuitName(c)} and ${circuitName(other)} share a neutral on opposite legs (${legA}, ${legB}).`,
				section('multiwireLegs', ed),
				target,
			),
		);
	}
	findings.push(
		finding(
			'note',
			'multiwire-disconnect',
			() =>
				`${circuitName(c)} and ${circuitName(other)} must open together: a 2-pole breaker or identified handle ties.`,
			section('multiwire', ed),
			target,
		),
	);
}

/** A method's result; `calc` is null where the method does not apply (`reason` says why). */
function methodResult(
	method: MethodId,
	title: string,
	rule: string,
	reason: string,
	calc: { lines: Line[]; total: Line } | null,
	ratingA: number,
	supply: Supply,
	ed: Edition,
): MethodResult {
	if (calc === null) {
		return {
			method,
			title,
			rule,
			applicable: false,
			reason,
			lines: [],
			totalVA: null,
			amps: null,
			ampsRounded: null,
			minimumServiceA: null,
			headroomA: null,
			headroomVA: null,
			withinService: null,
		};
	}
	const { lines, total } = calc;
	const { amps, ampsRounded } = ampsFigures(total.value, supply, ed);
	const next = nextStandardRatingA(ampsRounded.value);
	const min = Math.max(MIN_SERVICE_ONE_FAMILY_A, next);
	const minimumServiceA = fig(
		min,
		'A',
		`NEC ${ed} ${['230.79(C)', '240.6(A)'].join(', ')}`,
		() =>
			`${q(ampsRounded.value, 'A', 0)} → next standard rating ${q(next, 'A', 0)}; one-family dwelling at least 100 A → ${q(min, 'A', 0)}`,
	);
	const head = ratingA - ampsRounded.value;
	const headVA = ratingA * supply.divisor - total.value;
	return {
		method,
		title,
		rule,
		applicable: true,
		reason,
		lines,
		totalVA: { value: total.value, unit: 'VA', rule: total.rule, working: total.working },
		amps,
		ampsRounded,
		minimumServiceA,
		headroomA: fig(
			head,
			'A',
			'service rating less calculated load',
			() => `${q(ratingA, 'A', 0)} − ${q(ampsRounded.value, 'A', 0)} = ${q(head, 'A', 0)}`,
		),
		headroomVA: fig(
			roundTo(headVA, 3),
			'VA',
			'service rating less calculated load',
			() => `${q(ratingA, 'A', 0)} × ${supply.label} − ${q(total.value, 'VA')} = ${q(headVA, 'VA')}`,
		),
		withinService: head >= 0,
	};
}

function serviceResult(
	doc: JobDocument,
	all: LoadBucket,
	added: LoadBucket,
	existingDwelling: boolean,
	area: { value: number; source: string; figure: Figure },
	jobId: string,
): ServiceResult {
	const ed = doc.codeEdition;
	const svc = doc.service;
	const supply = supplyOf(svc.voltageSystem);
	const opts: GeneralLoadOptions = {
		edition: ed,
		areaFt2: area.value,
		areaSource: area.source,
		minimumCircuits: true,
	};
	const std = standardMethod(all, opts, supply);
	const measured = svc.existingLoad;
	let addedArea = 0;
	if (measured)
		for (const i of added.rooms.order) {
			const room = doc.rooms[i] as Room;
			if (roomCounts(room)) addedArea += room.areaFt2;
		}
	const singlePhase = svc.voltageSystem === '120/240-1ph-3w';
	const mdRule = section('measuredDemand', ed);
	const methods: MethodResult[] = [
		methodResult(
			'standard',
			'Standard method',
			`NEC ${ed} Article 220 Part III`,
			'Always permitted.',
			std,
			svc.ratingA,
			supply,
			ed,
		),
		methodResult(
			'optional',
			'Optional method',
			section('optional', ed),
			singlePhase
				? 'One-family dwelling on a 120/240 V 3-wire service.'
				: 'Applies to a 120/240 V or 208Y/120 V 3-wire service; this service is three-phase 4-wire.',
			singlePhase ? optionalMethod(all, opts) : null,
			svc.ratingA,
			supply,
			ed,
		),
		methodResult(
			'existing-added',
			'Existing dwelling with added loads',
			section('existingAdded', ed),
			existingDwelling
				? 'The job records existing circuits.'
				: 'No existing circuits are recorded: a new dwelling.',
			existingDwelling ? existingAddedMethod(all, added, opts) : null,
			svc.ratingA,
			supply,
			ed,
		),
		methodResult(
			'measured-demand',
			'Existing load from measured demand',
			mdRule,
			measured ? '12 months of maximum demand are recorded.' : 'No 12-month maximum-demand record is given.',
			measured ? measuredDemandMethod(measured.peakDemandKW, added, addedArea, ed) : null,
			svc.ratingA,
			supply,
			ed,
		),
	];

	const findings: Finding[] = [];
	const job = { kind: 'job', id: jobId } as const;
	let lowest: MethodResult | null = null;
	for (const m of methods)
		if (
			m.applicable &&
			m.ampsRounded &&
			(!lowest || (lowest.ampsRounded && m.ampsRounded.value < lowest.ampsRounded.value))
		)
			lowest = m;
	if (lowest?.ampsRounded) {
		const a = lowest.ampsRounded.value;
		findings.push(
			a <= svc.ratingA
				? finding(
						'ok',
						'service-capacity',
						() =>
							`The ${svc.ratingA} A service carries the calculated ${a} A (${lowest.title.toLowerCase()}), leaving ${svc.ratingA - a} A.`,
						lowest.rule,
						job,
					)
				: finding(
						'violation',
						'service-capacity',
						() =>
							`The calculated load is ${a} A by the lowest applicable method (${lowest.title.toLowerCase()}); the ${svc.ratingA} A service is too small.`,
						lowest.rule,
						job,
					),
		);
	}
	if (svc.ratingA < MIN_SERVICE_ONE_FAMILY_A) {
		findings.push(
			finding(
				'warning',
				'service-minimum',
				() => `A ${svc.ratingA} A service is below the 100 A minimum for a one-family dwelling.`,
				section('minimumService', ed),
				job,
			),
		);
	}
	if (measured) {
		findings.push(
			finding(
				'note',
				'measured-demand-conditions',
				'The measured-demand method needs the highest demand over a full year and does not apply where solar or peak-shaving equipment reduces the measured demand.',
				mdRule,
				job,
			),
		);
	}
	const minimum =
		lowest?.minimumServiceA ??
		fig(MIN_SERVICE_ONE_FAMILY_A, 'A', section('minimumService', ed), 'one-family dwelling: 100 A');

	const { amps, ampsRounded } = ampsFigures(std.neutralTotal.value, supply, ed);
	return {
		ratingA: svc.ratingA,
		voltageSystem: svc.voltageSystem,
		floorArea: area.figure,
		methods,
		neutral: { lines: [...std.neutralLines, std.neutralTotal], totalVA: std.neutralTotal, amps, ampsRounded },
		lowestMethod: lowest ? lowest.method : null,
		minimumServiceA: minimum,
		findings,
	};
}
