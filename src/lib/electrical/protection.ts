/** GFCI and AFCI requirements by room type and edition (210.8(A), 210.12), and the required dwelling circuits (210.11(C)). */
import { finding } from './format';
import type { Circuit, Load, Room, RoomType } from './schema';
import { section } from './sections';
import type { Edition, Finding } from './types';

const RECEPTACLE_KINDS = new Set(['receptacles', 'small-appliance', 'laundry']);

/** Whether a load is supplied through a receptacle outlet. */
export function isReceptacleLoad(load: Load): boolean {
	return RECEPTACLE_KINDS.has(load.kind) || load.cordAndPlug;
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

/** GFCI and AFCI findings for one circuit. */
export function protectionFindings(
	c: Circuit,
	loads: readonly Load[],
	roomsById: ReadonlyMap<string, Room>,
	edition: Edition,
	name: string,
): Finding[] {
	const out: Finding[] = [];
	const target = { kind: 'circuit', id: c.id } as const;
	if (c.poles === 3) return out;
	// Room lists are short: arrays kept in first-seen order, as a Set would be, cost less than Sets.
	const roomIds: string[] = [];
	for (const r of c.roomIds) if (!roomIds.includes(r)) roomIds.push(r);
	for (const l of loads) for (const r of l.roomIds) if (!roomIds.includes(r)) roomIds.push(r);
	if (roomIds.length === 0) return out;
	// Receptacles are placed by their own rooms where recorded, else by the circuit's rooms.
	const receptacleRooms: string[] = [];
	let receptacleLoads = 0;
	let countertop = false;
	for (const l of loads) {
		if (!isReceptacleLoad(l)) continue;
		receptacleLoads++;
		if (l.kind === 'small-appliance') countertop = true;
		for (const r of l.roomIds.length > 0 ? l.roomIds : c.roomIds)
			if (!receptacleRooms.includes(r)) receptacleRooms.push(r);
	}
	const existing = c.status === 'existing';

	// GFCI: receptacles; 2017 only 125 V 15/20 A, from 2020 125–250 V on single-phase circuits.
	const gfciVoltageOk = edition === '2017' ? c.poles === 1 && c.ratingA <= 20 : true;
	if (receptacleLoads > 0 && gfciVoltageOk) {
		let need: GfciNeed = 'no';
		const where: string[] = [];
		for (const id of receptacleRooms) {
			const room = roomsById.get(id);
			if (!room) continue;
			const n = gfciNeed(room.type, edition, countertop);
			if (n === 'no') continue;
			where.push(`${room.name} (${room.type})`);
			if (n === 'required' || need === 'no') need = n;
		}
		const rule = section('gfci', edition);
		if (need !== 'no') {
			if (hasGfci(c)) {
				out.push(
					finding(
						'ok',
						'gfci-required',
						() => `${name} has GFCI protection for receptacles in ${where.join(', ')}.`,
						rule,
						target,
					),
				);
			} else {
				const sev = existing ? 'note' : need === 'if-unfinished' ? 'warning' : 'violation';
				const msg =
					`${name} supplies receptacles in ${where.join(', ')} without GFCI protection` +
					(need === 'if-unfinished' ? '; required if the basement is unfinished' : '') +
					(existing ? '; an existing circuit, required when it is extended or modified' : '') +
					'.';
				out.push(finding(sev, 'gfci-required', msg, rule, target));
			}
		}
	}

	// AFCI: 120 V, 15 and 20 A circuits (10 A from 2023) supplying outlets or devices in the listed rooms.
	const afciRatings = edition === '2023' ? c.ratingA <= 20 : c.ratingA === 15 || c.ratingA === 20;
	if (c.poles === 1 && afciRatings) {
		const where: string[] = [];
		for (const id of roomIds) {
			const room = roomsById.get(id);
			if (room && afciRoom(room.type)) where.push(`${room.name} (${room.type})`);
		}
		if (where.length > 0) {
			const rule = section('afci', edition);
			if (c.breakerType === 'afci' || c.breakerType === 'dual-function') {
				out.push(
					finding(
						'ok',
						'afci-required',
						() => `${name} has AFCI protection for outlets in ${where.join(', ')}.`,
						rule,
						target,
					),
				);
			} else if (c.afciAtDevice) {
				out.push(
					finding(
						'note',
						'afci-required',
						() =>
							`${name} relies on an outlet branch-circuit AFCI device; permitted only under the conditions listed in ${rule} (wiring method and length to the first outlet).`,
						rule,
						target,
					),
				);
			} else {
				out.push(
					finding(
						existing ? 'note' : 'violation',
						'afci-required',
						() =>
							`${name} supplies outlets in ${where.join(', ')} without AFCI protection` +
							(existing ? '; an existing circuit, required when it is extended or modified.' : '.'),
						rule,
						target,
					),
				);
			}
		}
	}
	return out;
}

/** Per-circuit facts the required-circuit checks need, gathered in the main pass. */
export interface RequiredCircuitFacts {
	smallAppliance: { id: string; name: string; ratingA: number }[];
	laundry: { id: string; name: string; ratingA: number }[];
	/** 120 V 20 A circuits with receptacles, by room id served. */
	receptacle20ARooms: Set<string>;
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

	for (const c of facts.smallAppliance) {
		if (c.ratingA !== 20) {
			out.push(
				finding(
					'violation',
					'small-appliance-rating',
					() =>
						`${c.name} supplies small-appliance receptacles but is rated ${c.ratingA} A; these circuits are 20 A.`,
					section('requiredSmallAppliance', edition),
					{ kind: 'circuit', id: c.id },
				),
			);
		}
	}
	for (const c of facts.laundry) {
		if (c.ratingA !== 20) {
			out.push(
				finding(
					'violation',
					'laundry-rating',
					() =>
						`${c.name} supplies the laundry receptacles but is rated ${c.ratingA} A; the laundry circuit is 20 A.`,
					section('requiredLaundry', edition),
					{ kind: 'circuit', id: c.id },
				),
			);
		}
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

	const bathRule = section('requiredBathroom', edition);
	const baths = rooms.filter((r) => r.type === 'bathroom');
	if (baths.length > 0) {
		if (baths.some((r) => facts.receptacle20ARooms.has(r.id))) {
			out.push(
				finding(
					'ok',
					'bathroom-circuit',
					'A 120 V 20 A circuit supplies bathroom receptacles.',
					bathRule,
					job,
				),
			);
		} else
			out.push(
				finding(
					missing,
					'bathroom-circuit',
					'No 120 V 20 A circuit supplies the bathroom receptacles.',
					bathRule,
					job,
				),
			);
	}
	const garageRule = section('requiredGarage', edition);
	const garages = rooms.filter((r) => r.type === 'garage');
	if (garages.length > 0) {
		if (garages.some((r) => facts.receptacle20ARooms.has(r.id))) {
			out.push(
				finding(
					'ok',
					'garage-circuit',
					'A 120 V 20 A circuit supplies the garage receptacles.',
					garageRule,
					job,
				),
			);
		} else
			out.push(
				finding(
					missing,
					'garage-circuit',
					'No 120 V 20 A circuit supplies the garage receptacles.',
					garageRule,
					job,
				),
			);
	}
	return out;
}
