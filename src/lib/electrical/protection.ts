/** GFCI and AFCI requirements by room type and edition (210.8(A), 210.12), and the required dwelling circuits (210.11(C)). */
import type { CircuitTexts } from './circuit-checks';
import { nameOf, rulesFor } from './circuit-checks';
import { finding, findingOf } from './format';
import type { TextOf } from './format';
import type { Circuit, Load, Room, RoomType, RuleOptions } from './schema';
import { section } from './sections';
import type { Edition, Finding, Target } from './types';

/** Finds a room of the job by id (a Map of the rooms will do). */
export interface RoomLookup {
	get(id: string): Room | undefined;
}

/** The editions whose GFCI and AFCI lists a job applies, with the rule labels its findings cite. */
export interface ProtectionEditions {
	gfci: Edition;
	afci: Edition;
	gfciRule: string;
	afciRule: string;
}

/**
 * The GFCI and AFCI editions of a job: its own edition unless a local amendment (the document's
 * ruleOptions) names another; an amended list's label says so.
 */
export function protectionEditions(
	edition: Edition,
	options: RuleOptions | null | undefined,
): ProtectionEditions {
	const gfci = options?.gfciEdition ?? edition;
	const afci = options?.afciEdition ?? edition;
	const amended = (rule: string, ed: Edition) => (ed === edition ? rule : `${rule} (local amendment)`);
	return {
		gfci,
		afci,
		gfciRule: amended(rulesFor(gfci).gfci, gfci),
		afciRule: amended(rulesFor(afci).afci, afci),
	};
}

/** Whether a load is supplied through a receptacle outlet. */
export function isReceptacleLoad(load: Load): boolean {
	const k = load.kind;
	return k === 'receptacles' || k === 'small-appliance' || k === 'laundry' || load.cordAndPlug;
}

/** Rooms whose outlets need AFCI protection on 120 V 15/20 A circuits (210.12(A) 2017/2020, 210.12(B) 2023). */
const AFCI_ROOMS: ReadonlySet<RoomType> = new Set([
	'kitchen',
	'living',
	'dining',
	'bedroom',
	'closet',
	'hallway',
	'laundry',
]);

type GfciNeed = 'required' | 'if-unfinished' | 'no';

/** GFCI need for receptacles in a room type; `countertop` says whether the receptacle serves a kitchen countertop. */
export function gfciNeed(type: RoomType, edition: Edition, countertop: boolean): GfciNeed {
	switch (type) {
		case 'bathroom':
		case 'garage':
		case 'outdoor':
		case 'crawl-space':
		case 'laundry':
			return 'required';
		case 'basement':
			return edition === '2017' ? 'if-unfinished' : 'required';
		case 'kitchen':
			return edition === '2023' || countertop ? 'required' : 'no';
		default:
			return 'no';
	}
}

/** Whether a room type needs AFCI protection for 120 V 15/20 A circuits. */
export function afciRoom(type: RoomType): boolean {
	return AFCI_ROOMS.has(type);
}

export function hasGfci(c: Circuit): boolean {
	return c.breakerType === 'gfci' || c.breakerType === 'dual-function' || c.gfciAtDevice;
}

export function hasAfci(c: Circuit): boolean {
	return c.breakerType === 'afci' || c.breakerType === 'dual-function' || c.afciAtDevice;
}

const roomList = (rooms: readonly Room[]) => rooms.map((r) => `${r.name} (${r.type})`).join(', ');
/** The rooms of `t.roomIds` that need AFCI protection. */
function afciRoomsOf(t: CircuitTexts): Room[] {
	const where: Room[] = [];
	for (const id of t.roomIds) {
		const room = t.rooms?.get(id);
		if (room && afciRoom(room.type)) where.push(room);
	}
	return where;
}
const gfciOkText = (t: CircuitTexts) =>
	`${nameOf(t)} has GFCI protection for receptacles in ${roomList(t.gfciRooms)}.`;
/** Message of the afci-required 'ok' finding, which the caller adds when protectionFindings returns true. */
export const afciOkText = (t: CircuitTexts) =>
	`${nameOf(t)} has AFCI protection for outlets in ${roomList(afciRoomsOf(t))}.`;
const afciDeviceText = (t: CircuitTexts) =>
	`${nameOf(t)} relies on an outlet branch-circuit AFCI device; permitted only under the conditions listed in ${t.afciRule} (wiring method and length to the first outlet).`;
const afciMissingText = (t: CircuitTexts) =>
	`${nameOf(t)} supplies outlets in ${roomList(afciRoomsOf(t))} without AFCI protection.`;
const afciMissingExistingText = (t: CircuitTexts) =>
	`${nameOf(t)} supplies outlets in ${roomList(afciRoomsOf(t))} without AFCI protection; an existing circuit, required when it is extended or modified.`;

/**
 * Adds the GFCI and AFCI findings of one circuit (its loads: `loads[from]` to before `loads[to]`) to `out`, except the AFCI 'ok' finding: returns true
 * when it is due, for the caller to add last (afciOkText, rule t.afciRule) when its findings are read.
 */
export function protectionFindings(
	c: Circuit,
	loads: readonly Load[],
	from: number,
	to: number,
	roomsById: RoomLookup,
	eds: ProtectionEditions,
	t: CircuitTexts,
	owner: { readonly target: Target },
	out: Finding[],
): boolean {
	const edition = eds.gfci;
	if (c.poles === 3) return false;
	// Room lists are short: arrays kept in first-seen order, as a Set would be, cost less than Sets.
	// Most circuits and their loads name the same one room: the list is made only when they differ.
	let roomIds: readonly string[] = c.roomIds;
	let own = false;
	for (let k = from; k < to; k++)
		for (const r of (loads[k] as Load).roomIds)
			if (!roomIds.includes(r)) {
				if (!own) {
					roomIds = dedupe(c.roomIds);
					own = true;
				}
				(roomIds as string[]).push(r);
			}
	if (!own && hasDuplicates(roomIds)) roomIds = dedupe(roomIds);
	if (roomIds.length === 0) return false;
	// Receptacles are placed by their own rooms where recorded, else by the circuit's rooms.
	let receptacleLoads = 0;
	let countertop = false;
	for (let k = from; k < to; k++) {
		const l = loads[k] as Load;
		if (!isReceptacleLoad(l)) continue;
		receptacleLoads++;
		if (l.kind === 'small-appliance') countertop = true;
	}
	const existing = c.status === 'existing';

	// GFCI: receptacles; 2017 only 125 V 15/20 A, from 2020 125–250 V on single-phase circuits.
	const gfciVoltageOk = edition === '2017' ? c.poles === 1 && c.ratingA <= 20 : true;
	// Most circuits need no GFCI: the room lists are made only when one does (duplicates do not change the need).
	if (
		receptacleLoads > 0 &&
		gfciVoltageOk &&
		gfciNeeded(c, loads, from, to, roomsById, edition, countertop)
	) {
		const receptacleRooms: string[] = [];
		for (let k = from; k < to; k++) {
			const l = loads[k] as Load;
			if (!isReceptacleLoad(l)) continue;
			for (const r of l.roomIds.length > 0 ? l.roomIds : c.roomIds)
				if (!receptacleRooms.includes(r)) receptacleRooms.push(r);
		}
		let need: GfciNeed = 'no';
		const where: Room[] = [];
		for (const id of receptacleRooms) {
			const room = roomsById.get(id);
			if (!room) continue;
			const n = gfciNeed(room.type, edition, countertop);
			if (n === 'no') continue;
			where.push(room);
			if (n === 'required' || need === 'no') need = n;
		}
		const rule = eds.gfciRule;
		if (need !== 'no') {
			if (hasGfci(c)) {
				t.gfciRooms = where;
				out.push(findingOf('ok', 'gfci-required', gfciOkText, t, rule, owner.target));
			} else {
				const sev = existing ? 'note' : need === 'if-unfinished' ? 'warning' : 'violation';
				const msg =
					`${nameOf(t)} supplies receptacles in ${roomList(where)} without GFCI protection` +
					(need === 'if-unfinished' ? '; required if the basement is unfinished' : '') +
					(existing ? '; an existing circuit, required when it is extended or modified' : '') +
					'.';
				out.push(finding(sev, 'gfci-required', msg, rule, owner.target));
			}
		}
	}

	// AFCI: 120 V, 15 and 20 A circuits (10 A from 2023) supplying outlets or devices in the listed rooms.
	const afciRatings = eds.afci === '2023' ? c.ratingA <= 20 : c.ratingA === 15 || c.ratingA === 20;
	if (c.poles === 1 && afciRatings) {
		let any = false;
		for (const id of roomIds) {
			const room = roomsById.get(id);
			if (room && afciRoom(room.type)) {
				any = true;
				break;
			}
		}
		if (any) {
			const rule = eds.afciRule;
			t.roomIds = roomIds;
			const x = t;
			if (c.breakerType === 'afci' || c.breakerType === 'dual-function') {
				return true;
			} else if (c.afciAtDevice) {
				out.push(findingOf('note', 'afci-required', afciDeviceText, x, rule, owner.target));
			} else {
				out.push(
					findingOf(
						existing ? 'note' : 'violation',
						'afci-required',
						existing ? afciMissingExistingText : afciMissingText,
						x,
						rule,
						owner.target,
					),
				);
			}
		}
	}
	return false;
}

/** Whether any room of the circuit's receptacle loads needs GFCI protection (gfciNeed). */
function gfciNeeded(
	c: Circuit,
	loads: readonly Load[],
	from: number,
	to: number,
	roomsById: RoomLookup,
	edition: Edition,
	countertop: boolean,
): boolean {
	for (let k = from; k < to; k++) {
		const l = loads[k] as Load;
		if (!isReceptacleLoad(l)) continue;
		for (const r of l.roomIds.length > 0 ? l.roomIds : c.roomIds) {
			const room = roomsById.get(r);
			if (room && gfciNeed(room.type, edition, countertop) !== 'no') return true;
		}
	}
	return false;
}

function hasDuplicates(ids: readonly string[]): boolean {
	for (let i = 1; i < ids.length; i++) if (ids.indexOf(ids[i] as string) < i) return true;
	return false;
}

function dedupe(ids: readonly string[]): string[] {
	const out: string[] = [];
	for (const r of ids) if (!out.includes(r)) out.push(r);
	return out;
}

/** Per-circuit facts the required-circuit checks need, gathered in the main pass. */
export interface RequiredCircuitFacts {
	smallAppliance: CircuitTexts[];
	laundry: CircuitTexts[];
	/** 1 at the index in doc.rooms of each room a 120 V 20 A circuit with receptacles serves. */
	receptacle20ARooms: Uint8Array;
}

const smallApplianceRatingText = (c: CircuitTexts) =>
	`${nameOf(c)} supplies small-appliance receptacles but is rated ${c.ratingA} A; these circuits are 20 A.`;
const laundryRatingText = (c: CircuitTexts) =>
	`${nameOf(c)} supplies the laundry receptacles but is rated ${c.ratingA} A; the laundry circuit is 20 A.`;

function ratingFinding(c: CircuitTexts, code: string, text: TextOf<CircuitTexts>, rule: string): Finding {
	return findingOf('violation', code, text, c, rule, { kind: 'circuit', id: c.id });
}

/** The required dwelling circuits of 210.11(C). */
export function requiredCircuitFindings(
	facts: RequiredCircuitFacts,
	rooms: readonly Room[],
	edition: Edition,
	existingDwelling: boolean,
	jobId: string,
): Finding[] {
	const out: Finding[] = [];
	const job = { kind: 'job', id: jobId } as const;
	const missing = existingDwelling ? 'warning' : 'violation';
	const hasType = (t: RoomType) => rooms.some((r) => r.type === t);

	// Indexed loops, and the messages made in a function of their own: a closure over the loop's
	// variable would cost a context for every circuit of the list.
	const sa20 = section('requiredSmallAppliance', edition);
	for (let i = 0; i < facts.smallAppliance.length; i++) {
		const c = facts.smallAppliance[i] as CircuitTexts;
		if (c.ratingA !== 20)
			out.push(ratingFinding(c, 'small-appliance-rating', smallApplianceRatingText, sa20));
	}
	const la20 = section('requiredLaundry', edition);
	for (let i = 0; i < facts.laundry.length; i++) {
		const c = facts.laundry[i] as CircuitTexts;
		if (c.ratingA !== 20) out.push(ratingFinding(c, 'laundry-rating', laundryRatingText, la20));
	}
	const sa = facts.smallAppliance.length;
	const saRule = section('requiredSmallAppliance', edition);
	if (sa >= 2)
		out.push(
			finding(
				'ok',
				'small-appliance-circuits',
				() => `${sa} small-appliance circuits recorded (at least two required).`,
				saRule,
				job,
			),
		);
	else if (hasType('kitchen')) {
		out.push(
			finding(
				missing,
				'small-appliance-circuits',
				() =>
					`${sa} small-appliance circuit${sa === 1 ? '' : 's'} recorded; a dwelling needs two or more 20 A small-appliance circuits.`,
				saRule,
				job,
			),
		);
	} else {
		out.push(
			finding(
				'note',
				'small-appliance-circuits',
				() => `No kitchen recorded; a dwelling needs two or more 20 A small-appliance circuits.`,
				saRule,
				job,
			),
		);
	}

	const laRule = section('requiredLaundry', edition);
	if (facts.laundry.length > 0)
		out.push(finding('ok', 'laundry-circuit', 'A laundry circuit is recorded.', laRule, job));
	else if (hasType('laundry'))
		out.push(
			finding(
				missing,
				'laundry-circuit',
				'A laundry room is recorded but no 20 A laundry circuit supplies it.',
				laRule,
				job,
			),
		);
	else
		out.push(
			finding(
				'note',
				'laundry-circuit',
				'No laundry circuit recorded; one is required unless laundry facilities are not provided.',
				laRule,
				job,
			),
		);

	// 210.11(C)(3) and (C)(4): a 120 V 20 A circuit for the bathroom and for the garage receptacles.
	const required20A = [
		['requiredBathroom', 'bathroom', 'bathroom-circuit', 'bathroom receptacles', 'the bathroom receptacles'],
		['requiredGarage', 'garage', 'garage-circuit', 'the garage receptacles', 'the garage receptacles'],
	] as const;
	for (const [key, type, code, okWhat, missingWhat] of required20A) {
		if (!rooms.some((r) => r.type === type)) continue;
		const rule = section(key, edition);
		out.push(
			rooms.some((r, i) => r.type === type && facts.receptacle20ARooms[i] === 1)
				? finding('ok', code, `A 120 V 20 A circuit supplies ${okWhat}.`, rule, job)
				: finding(missing, code, `No 120 V 20 A circuit supplies ${missingWhat}.`, rule, job),
		);
	}
	return out;
}
