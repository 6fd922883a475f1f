/**
 * Dwelling load calculations of Article 220: the standard method (Part III), the optional method
 * (220.82), added loads to an existing dwelling (220.83) and existing load from measured demand
 * (220.87), with the neutral (220.61). Loads are first gathered into buckets (one pass), then each
 * method reads the buckets.
 */
import { fig, line, num, q, roundTo } from './format';
import { isMotor, unitVA } from './load-values';
import type { Load } from './schema';
import { section, sections } from './sections';
import { columnApct, columnBpct, columnCkW } from './tables';
import type { Edition, Figure, Line } from './types';

/**
 * A set of the job's rooms, kept as their indexes in doc.rooms in the order first added. A large
 * job has a few sets per panel, each of dozens of rooms: a bit per room costs less than a hash set.
 */
export class RoomSet {
	/** Indexes in doc.rooms, in the order first added. */
	readonly order: number[] = [];
	#bits: Uint32Array | null = null;
	/** `roomCount`: how many rooms the job has (doc.rooms.length). */
	constructor(readonly roomCount: number) {}
	/** Adds the room of index `i`. */
	addIndex(i: number): void {
		const bits = (this.#bits ??= new Uint32Array((this.roomCount >>> 5) + 1));
		const w = i >>> 5;
		const bit = 1 << (i & 31);
		if (((bits[w] as number) & bit) !== 0) return;
		bits[w] = (bits[w] as number) | bit;
		this.order.push(i);
	}
	/** Adds every room of `from`. */
	addAll(from: RoomSet): void {
		for (const i of from.order) this.addIndex(i);
	}
}

/** Loads of one part of the installation, gathered by how Article 220 treats them. */
export interface LoadBucket {
	/** Rooms served by general lighting and receptacle loads. */
	rooms: RoomSet;
	/** Connected VA of loads of kind lighting (compared with the unit load by area). */
	recordedLightingVA: number;
	smallApplianceCircuits: number;
	laundryCircuits: number;
	/** Appliances fastened in place that count toward the four of 220.53. */
	fixedCount: number;
	fixedVA: number;
	fixed120VA: number;
	/** The three largest items of the 220.53 group (VA each, largest first), and the same for 120 V items. */
	fixedTop3: number[];
	fixed120Top3: number[];
	/** Appliances below the 2020 threshold (1/4 hp or 500 W): taken at 100 %, not counted toward four. */
	smallFixedVA: number;
	smallFixed120VA: number;
	/** Nameplate kW of each household cooking appliance over 1.75 kW. */
	cookingKW: number[];
	/** Nameplate VA of each dryer. */
	dryerVA: number[];
	heatCentralVA: number;
	heatCentralUnits: number;
	heatRoomUnitsVA: number;
	heatRoomUnits: number;
	/** VA of the three largest separately controlled space-heating units (central and room units). */
	heatUnitTop3: number[];
	heatSupplementalVA: number;
	heatStorageVA: number;
	coolingVA: number;
	heatPumpVA: number;
	largestMotorVA: number;
	largestMotorName: string;
	/** Nameplate VA of each EVSE. */
	evVA: number[];
	ev120VA: number;
}

/** An empty bucket of a job of `roomCount` rooms. */
export function emptyBucket(roomCount: number): LoadBucket {
	return {
		rooms: new RoomSet(roomCount),
		recordedLightingVA: 0,
		smallApplianceCircuits: 0,
		laundryCircuits: 0,
		fixedCount: 0,
		fixedVA: 0,
		fixed120VA: 0,
		fixedTop3: [],
		fixed120Top3: [],
		smallFixedVA: 0,
		smallFixed120VA: 0,
		cookingKW: [],
		dryerVA: [],
		heatCentralVA: 0,
		heatCentralUnits: 0,
		heatRoomUnitsVA: 0,
		heatRoomUnits: 0,
		heatUnitTop3: [],
		heatSupplementalVA: 0,
		heatStorageVA: 0,
		coolingVA: 0,
		heatPumpVA: 0,
		largestMotorVA: 0,
		largestMotorName: '',
		evVA: [],
		ev120VA: 0,
	};
}

/** Adds `from` into `into` (mutates `into`); with `rooms` false the rooms are left out, for a bucket whose rooms are never read. */
export function mergeBucket(into: LoadBucket, from: LoadBucket, rooms = true): LoadBucket {
	if (rooms) into.rooms.addAll(from.rooms);
	into.recordedLightingVA += from.recordedLightingVA;
	into.smallApplianceCircuits += from.smallApplianceCircuits;
	into.laundryCircuits += from.laundryCircuits;
	into.fixedCount += from.fixedCount;
	into.fixedVA += from.fixedVA;
	into.fixed120VA += from.fixed120VA;
	for (const v of from.fixedTop3) pushTop3(into.fixedTop3, v);
	for (const v of from.fixed120Top3) pushTop3(into.fixed120Top3, v);
	into.smallFixedVA += from.smallFixedVA;
	into.smallFixed120VA += from.smallFixed120VA;
	for (const k of from.cookingKW) into.cookingKW.push(k);
	for (const d of from.dryerVA) into.dryerVA.push(d);
	into.heatCentralVA += from.heatCentralVA;
	into.heatCentralUnits += from.heatCentralUnits;
	into.heatRoomUnitsVA += from.heatRoomUnitsVA;
	into.heatRoomUnits += from.heatRoomUnits;
	for (const v of from.heatUnitTop3) pushTop3(into.heatUnitTop3, v);
	into.heatSupplementalVA += from.heatSupplementalVA;
	into.heatStorageVA += from.heatStorageVA;
	into.coolingVA += from.coolingVA;
	into.heatPumpVA += from.heatPumpVA;
	if (from.largestMotorVA > into.largestMotorVA) {
		into.largestMotorVA = from.largestMotorVA;
		into.largestMotorName = from.largestMotorName;
	}
	for (const e of from.evVA) into.evVA.push(e);
	into.ev120VA += from.ev120VA;
	return into;
}

/** Keeps the three largest values, largest first. */
function pushTop3(top: number[], v: number): void {
	if (top.length === 3 && v <= (top[2] as number)) return;
	// Insert in place, largest first: no sort (and no comparator made) for each load.
	let i = top.length < 3 ? top.length : 2;
	while (i > 0 && (top[i - 1] as number) < v) {
		top[i] = top[i - 1] as number;
		i--;
	}
	top[i] = v;
}

/**
 * 220.53 at 75 % for four or more appliances, but never below the three largest at 100 %: read
 * literally, a small fourth appliance would lower the load, which we do not show (our conservative reading).
 */
export function fastenedDemand(
	count: number,
	va: number,
	top3: readonly number[],
): { va: number; floored: boolean } {
	if (count < 4) return { va, floored: false };
	const three = top3.reduce((a, b) => a + b, 0);
	const d = va * 0.75;
	return d >= three ? { va: d, floored: false } : { va: three, floored: true };
}

/** Copy of a bucket (without its rooms when `rooms` is false). */
export function cloneBucket(b: LoadBucket, rooms = true): LoadBucket {
	return mergeBucket(emptyBucket(b.rooms.roomCount), b, rooms);
}

/**
 * Adds one load to a bucket, all but its rooms: the caller adds to `b.rooms` the rooms of lighting,
 * receptacle and small-appliance loads. `firstOfKindOnCircuit` says whether this is the circuit's first
 * small-appliance (or laundry) load, so each such circuit is counted once; `each` is the VA of one
 * item (unitVA), when the caller has it.
 */
export function addLoad(
	b: LoadBucket,
	load: Load,
	edition: Edition,
	firstOfKindOnCircuit: boolean,
	each = unitVA(load),
): void {
	const n = load.quantity;
	const total = each * n;
	if (isMotor(load) && each > b.largestMotorVA) {
		b.largestMotorVA = each;
		b.largestMotorName = load.description || load.id;
	}
	switch (load.kind) {
		case 'lighting':
			b.recordedLightingVA += total;
			return;
		case 'receptacles':
			// General-use receptacles of a dwelling are part of the 3 VA/ft² unit load.
			return;
		case 'small-appliance':
			if (firstOfKindOnCircuit) b.smallApplianceCircuits += 1;
			return;
		case 'laundry':
			if (firstOfKindOnCircuit) b.laundryCircuits += 1;
			return;
		case 'range':
			if (each > 1750) {
				for (let i = 0; i < n; i++) b.cookingKW.push(each / 1000);
				return;
			}
			break; // 1.75 kW or less: an ordinary fastened-in-place appliance
		case 'dryer':
			for (let i = 0; i < n; i++) b.dryerVA.push(each);
			return;
		case 'hvac-heat': {
			const type = load.spaceHeating ?? 'central';
			if (type === 'central') {
				b.heatCentralVA += total;
				b.heatCentralUnits += n;
			} else if (type === 'room-units') {
				b.heatRoomUnitsVA += total;
				b.heatRoomUnits += n;
			}
			if (type === 'central' || type === 'room-units') {
				for (let i = 0; i < Math.min(n, 3); i++) pushTop3(b.heatUnitTop3, each);
			} else if (type === 'heat-pump-supplemental') b.heatSupplementalVA += total;
			else b.heatStorageVA += total;
			return;
		}
		case 'hvac-cool':
			b.coolingVA += total;
			return;
		case 'heat-pump':
			b.heatPumpVA += total;
			return;
		case 'ev-charger':
			for (let i = 0; i < n; i++) b.evVA.push(each);
			if (load.voltage === 120) b.ev120VA += total;
			return;
		default:
			break;
	}
	// fixed-appliance, water-heater, motor, other, small cooking appliances: fastened in place (220.53).
	const counts = edition === '2017' || each >= 500 || (load.hp !== undefined && load.hp !== null);
	if (counts) {
		b.fixedCount += n;
		b.fixedVA += total;
		for (let i = 0; i < Math.min(n, 3); i++) pushTop3(b.fixedTop3, each);
		if (load.voltage === 120) {
			b.fixed120VA += total;
			for (let i = 0; i < Math.min(n, 3); i++) pushTop3(b.fixed120Top3, each);
		}
	} else {
		b.smallFixedVA += total;
		if (load.voltage === 120) b.smallFixed120VA += total;
	}
}

/** How amperes are reached from VA for a system. */
export interface Supply {
	/** Divisor: 240, 208, or 208 × √3. */
	divisor: number;
	/** Text of the divisor for the working. */
	label: string;
}

/** Amperes from VA as Informative Annex D gives them: a fraction below 0.5 dropped, 0.5 or more rounded up. */
export function roundAmpsAnnexD(amps: number): number {
	return Math.floor(roundTo(amps, 6) + 0.5);
}

export interface CookingDemand {
	va: number;
	working: string;
}

/** "Major fraction" of a kilowatt read as more than half (common practice). */
function kwOver12(avgKW: number): number {
	const over = roundTo(avgKW - 12, 6);
	if (over <= 0) return 0;
	const whole = Math.floor(over);
	return whole + (over - whole > 0.5 ? 1 : 0);
}

/** Table 220.55 demand for household cooking appliances over 1.75 kW (Column C with Notes 1 and 2; Note 3 for Columns A and B). */
export function cookingDemand(kws: readonly number[]): CookingDemand {
	const c: number[] = [];
	let aSum = 0;
	let aCount = 0;
	let bSum = 0;
	let bCount = 0;
	for (const k of kws) {
		if (k > 8.75) c.push(k);
		else if (k >= 3.5) {
			bSum += k;
			bCount++;
		} else {
			aSum += k;
			aCount++;
		}
	}
	const parts: string[] = [];
	let kw = 0;
	if (c.length > 0) {
		let avgSum = 0;
		for (const k of c) avgSum += Math.max(12, k);
		const avg = avgSum / c.length;
		const over = kwOver12(avg);
		const base = columnCkW(c.length);
		const d = base * (1 + 0.05 * over);
		kw += d;
		const what =
			c.length === 1
				? `one appliance of ${num(c[0] ?? 0)} kW`
				: `${c.length} appliances, average ${num(avg)} kW (12 kW used for any smaller)`;
		parts.push(
			over === 0
				? `${what} ≤ 12 kW: Column C ${num(base)} kW → ${q(d * 1000, 'VA')}`
				: `${what}: Column C ${num(base)} kW + 5 % × ${over} kW over 12 = ${num(base)} kW × ${num(1 + 0.05 * over)} → ${q(d * 1000, 'VA')}`,
		);
	}
	if (bCount > 0) {
		const pct = columnBpct(bCount);
		const d = (bSum * pct) / 100;
		kw += d;
		parts.push(`${bCount} at 3.5–8.75 kW, ${num(bSum)} kW × Column B ${pct} % → ${q(d * 1000, 'VA')}`);
	}
	if (aCount > 0) {
		const pct = columnApct(aCount);
		const d = (aSum * pct) / 100;
		kw += d;
		parts.push(`${aCount} under 3.5 kW, ${num(aSum)} kW × Column A ${pct} % → ${q(d * 1000, 'VA')}`);
	}
	if (parts.length === 0) return { va: 0, working: 'no cooking appliances over 1.75 kW' };
	return { va: roundTo(kw * 1000, 6), working: parts.join('; ') };
}

/** Table 220.54 demand factor for n dryers, percent (1 to 4 at 100 %; five or more from memory). */
export function dryerDemandPct(n: number): number {
	if (n <= 4) return 100;
	const t = [85, 75, 65, 60, 55, 50, 47];
	if (n <= 11) return t[n - 5] ?? 47;
	if (n <= 23) return 47 - (n - 11);
	if (n <= 42) return 35 - 0.5 * (n - 23);
	return 25;
}

/**
 * The largest demand any smaller group of the same dryers would give under Table 220.54. Read
 * literally, adding a small dryer can move the whole group to a lower factor and lower the demand;
 * adding a load must never lower the calculated load, so the group is taken at no less than this.
 */
export function dryerDemandFloor(eachVA: readonly number[]): { va: number; count: number } {
	const sorted = [...eachVA].sort((a, b) => b - a);
	let best = { va: 0, count: 0 };
	let running = 0;
	for (let k = 1; k <= sorted.length; k++) {
		running += sorted[k - 1] ?? 0;
		const va = roundTo((running * dryerDemandPct(k)) / 100, 6);
		if (va > best.va) best = { va, count: k };
	}
	return best;
}

/** Lighting demand of Table 220.42 / 220.45: first 3000 VA at 100 %, up to 120,000 VA at 35 %, rest at 25 %. */
export function lightingDemand(va: number): { va: number; working: string } {
	return { va: lightingDemandVA(va), working: lightingDemandText(va) };
}

function lightingDemandVA(va: number): number {
	const first = Math.min(va, 3000);
	const second = Math.max(0, Math.min(va, 120_000) - 3000);
	const third = Math.max(0, va - 120_000);
	return roundTo(first + second * 0.35 + third * 0.25, 6);
}

function lightingDemandText(va: number): string {
	const first = Math.min(va, 3000);
	const second = Math.max(0, Math.min(va, 120_000) - 3000);
	const third = Math.max(0, va - 120_000);
	const d = first + second * 0.35 + third * 0.25;
	let w = `first ${q(first, 'VA')} × 100 % = ${q(first, 'VA')}`;
	if (second > 0) w += `; next ${q(second, 'VA')} × 35 % = ${q(second * 0.35, 'VA')}`;
	if (third > 0) w += `; over 120,000 VA: ${q(third, 'VA')} × 25 % = ${q(third * 0.25, 'VA')}`;
	if (second > 0) w += `; total ${q(d, 'VA')}`;
	return w;
}

/** First `limit` VA at 100 %, the rest at 40 % (220.82(B), 220.83). */
function firstAtFullRestAt40(va: number, limit: number): { va: number; working: string } {
	const first = Math.min(va, limit);
	const rest = Math.max(0, va - limit);
	const d = first + rest * 0.4;
	return {
		va: roundTo(d, 6),
		working:
			rest > 0
				? `first ${q(first, 'VA')} × 100 % + ${q(rest, 'VA')} × 40 % = ${q(d, 'VA')}`
				: `${q(first, 'VA')} × 100 % = ${q(d, 'VA')} (not over ${q(limit, 'VA')})`,
	};
}

const sumOf = (xs: readonly number[]): number => {
	let s = 0;
	for (const x of xs) s += x;
	return s;
};

export interface GeneralLoadOptions {
	edition: Edition;
	/** Floor area for general lighting, ft². */
	areaFt2: number;
	/** Where the area comes from, for the working. */
	areaSource: string;
	/** Apply the minimum of two small-appliance circuits and one laundry circuit (a whole dwelling). */
	minimumCircuits: boolean;
}

// The lines' working texts are written when first read (see format.ts): a large job has a
// standard-method calculation per panel. They read only values fixed when the line is built.
function generalLines(b: LoadBucket, o: GeneralLoadOptions, rule: string): Line[] {
	const areaVA = o.areaFt2 * 3;
	const { areaFt2, areaSource } = o;
	const recorded = b.recordedLightingVA;
	const lighting =
		recorded > areaVA
			? line(
					'general-lighting',
					'General lighting and receptacles',
					recorded,
					'VA',
					rule,
					() =>
						`recorded lighting ${q(recorded, 'VA')} exceeds ${q(areaFt2, 'count')} ft² × 3 VA/ft² = ${q(areaVA, 'VA')}; the larger is used`,
				)
			: line(
					'general-lighting',
					'General lighting and receptacles',
					areaVA,
					'VA',
					rule,
					() => `${num(areaFt2)} ft² (${areaSource}) × 3 VA/ft² = ${q(areaVA, 'VA')}`,
				);
	const saRecorded = b.smallApplianceCircuits;
	const laRecorded = b.laundryCircuits;
	const sa = o.minimumCircuits ? Math.max(2, saRecorded) : saRecorded;
	const la = o.minimumCircuits ? Math.max(1, laRecorded) : laRecorded;
	return [
		lighting,
		line(
			'small-appliance',
			'Small-appliance circuits',
			sa * 1500,
			'VA',
			section('smallAppliance', o.edition),
			() =>
				`${sa} circuit${sa === 1 ? '' : 's'} × 1,500 VA = ${q(sa * 1500, 'VA')}` +
				(sa > saRecorded ? ` (${saRecorded} recorded; at least two, 210.11(C)(1))` : ''),
		),
		line(
			'laundry',
			'Laundry circuit',
			la * 1500,
			'VA',
			section('laundry', o.edition),
			() =>
				`${la} circuit${la === 1 ? '' : 's'} × 1,500 VA = ${q(la * 1500, 'VA')}` +
				(la > laRecorded ? ` (${laRecorded} recorded; at least one, 210.11(C)(2))` : ''),
		),
	];
}

function subtotal(key: string, label: string, parts: readonly Line[], rule: string): Line {
	let sum = 0;
	for (const p of parts) sum += p.value;
	const v = roundTo(sum, 6);
	return line(
		key,
		label,
		v,
		'VA',
		rule,
		() => `${parts.map((p) => num(p.value)).join(' + ')} = ${q(v, 'VA')}`,
	);
}

/** Amperes figure (exact) and the Annex D rounded figure. */
export function ampsFigures(
	va: number,
	supply: Supply,
	edition: Edition,
): { amps: Figure; ampsRounded: Figure } {
	const a = va / supply.divisor;
	const r = roundAmpsAnnexD(a);
	return {
		amps: fig(roundTo(a, 2), 'A', 'Ohm’s law, I = S ÷ V', `${q(va, 'VA')} ÷ ${supply.label} = ${q(a, 'A')}`),
		ampsRounded: fig(
			r,
			'A',
			section('roundingAmps', edition),
			`${q(a, 'A')} → ${q(r, 'A', 0)} (fraction below 0.5 dropped, 0.5 or more rounded up)`,
		),
	};
}

export interface StandardMethodResult {
	lines: Line[];
	total: Line;
	neutralLines: Line[];
	neutralTotal: Line;
}

/** Standard method, Article 220 Part III, for a dwelling service or a feeder. */
export function standardMethod(b: LoadBucket, o: GeneralLoadOptions, supply: Supply): StandardMethodResult {
	const ed = o.edition;
	const general = generalLines(b, o, section('generalLighting', ed));
	const sub = subtotal(
		'general-subtotal',
		'General lighting, small-appliance and laundry load',
		general,
		sections(['generalLighting', 'smallAppliance', 'laundry'], ed),
	);
	const subVA = sub.value;
	const demand = line(
		'general-demand',
		'After lighting demand factors',
		lightingDemandVA(subVA),
		'VA',
		section('lightingDemand', ed),
		() => lightingDemandText(subVA),
	);
	const lines: Line[] = [...general, sub, demand];
	const counted: Line[] = [demand];

	const fixed = fastenedDemand(b.fixedCount, b.fixedVA, b.fixedTop3);
	if (b.fixedCount > 0 || b.smallFixedVA > 0) {
		const { fixedCount, fixedVA, smallFixedVA } = b;
		const fixedDemand = fixed.va + smallFixedVA;
		const l = line(
			'fixed-appliances',
			'Appliances fastened in place',
			roundTo(fixedDemand, 6),
			'VA',
			section('fixedAppliances', ed),
			() =>
				(fixedCount >= 4
					? `${fixedCount} appliances fastened in place, ${q(fixedVA, 'VA')} × 75 % (four or more) = ${q(fixedVA * 0.75, 'VA')}` +
						(fixed.floored ? `; not less than the three largest at 100 %, ${q(fixed.va, 'VA')}` : '')
					: `${fixedCount} appliance${fixedCount === 1 ? '' : 's'} fastened in place (fewer than four) at 100 % = ${q(fixedVA, 'VA')}`) +
				(smallFixedVA > 0
					? `; under 500 W or 1/4 hp, not counted toward four, at 100 %: ${q(smallFixedVA, 'VA')}`
					: ''),
		);
		lines.push(l);
		counted.push(l);
	}
	const cook = cookingDemand(b.cookingKW);
	if (b.cookingKW.length > 0) {
		const l = line('cooking', 'Cooking appliances', cook.va, 'VA', section('cooking', ed), cook.working);
		lines.push(l);
		counted.push(l);
	}
	let dryerDemand = 0;
	if (b.dryerVA.length > 0) {
		const each = b.dryerVA.map((d) => Math.max(5000, d));
		const pct = dryerDemandPct(each.length);
		const literal = roundTo((sumOf(each) * pct) / 100, 6);
		const floor = dryerDemandFloor(each);
		dryerDemand = Math.max(literal, floor.va);
		const w =
			b.dryerVA
				.map((d) => (d >= 5000 ? `${q(d, 'W')} nameplate` : `${q(d, 'W')} nameplate, 5,000 W minimum`))
				.join(' + ') +
			(pct < 100 ? ` × ${pct} % (${each.length} dryers) = ${q(literal, 'VA')}` : '') +
			(floor.va > literal
				? `; not less than the ${floor.count} largest at ${dryerDemandPct(floor.count)} %, ${q(floor.va, 'VA')}`
				: '') +
			` → ${q(dryerDemand, 'VA')}`;
		const l = line('dryers', 'Clothes dryers', dryerDemand, 'VA', section('dryers', ed), w);
		lines.push(l);
		counted.push(l);
	}
	const heat = b.heatCentralVA + b.heatRoomUnitsVA + b.heatSupplementalVA + b.heatStorageVA + b.heatPumpVA;
	const cool = b.coolingVA + b.heatPumpVA;
	if (heat > 0 || cool > 0) {
		const larger = Math.max(heat, cool);
		const l = line(
			'heating-cooling',
			heat === cool
				? 'Heating or air conditioning (equal)'
				: heat > cool
					? 'Space heating (larger than cooling)'
					: 'Air conditioning (larger than heating)',
			larger,
			'VA',
			sections(['noncoincident', 'heating'], ed),
			() => `heating ${q(heat, 'VA')}, cooling ${q(cool, 'VA')}: the larger, ${q(larger, 'VA')}, at 100 %`,
		);
		lines.push(l);
		counted.push(l);
	}
	if (b.largestMotorVA > 0) {
		const { largestMotorVA, largestMotorName } = b;
		const add = roundTo(largestMotorVA * 0.25, 6);
		const l = line(
			'largest-motor',
			'25 % of the largest motor',
			add,
			'VA',
			section('motors', ed),
			() => `${largestMotorName}: ${q(largestMotorVA, 'VA')} × 25 % = ${q(add, 'VA')}`,
		);
		lines.push(l);
		counted.push(l);
	}
	if (b.evVA.length > 0) {
		const min = ed === '2017' ? 0 : 7200;
		const evVA = b.evVA.slice();
		const each = evVA.map((e) => Math.max(min, e));
		const v = sumOf(each);
		const l = line(
			'evse',
			'Electric vehicle supply equipment',
			v,
			'VA',
			section('evse', ed),
			() =>
				evVA
					.map((e) => (e >= min ? `${q(e, 'VA')} nameplate` : `${q(e, 'VA')} nameplate, 7,200 W minimum`))
					.join(' + ') + ` → ${q(v, 'VA')} at 100 %`,
		);
		lines.push(l);
		counted.push(l);
	}
	const total = subtotal('total', 'Calculated load', counted, `NEC ${ed} Article 220 Part III`);
	lines.push(total);

	// Neutral, 220.61: line-to-neutral loads only; ranges and dryers at 70 %.
	const demandVA = demand.value;
	const nl: Line[] = [
		line(
			'neutral-general',
			'General lighting, small-appliance and laundry (after demand)',
			demandVA,
			'VA',
			section('neutral', ed),
			() => `${q(demandVA, 'VA')} (all 120 V)`,
		),
	];
	const fixed120 = fastenedDemand(b.fixedCount, b.fixed120VA, b.fixed120Top3).va + b.smallFixed120VA;
	if (fixed120 > 0) {
		nl.push(
			line(
				'neutral-fixed',
				'120 V appliances fastened in place',
				roundTo(fixed120, 6),
				'VA',
				section('neutral', ed),
				() => `120 V part of the appliance line: ${q(fixed120, 'VA')}`,
			),
		);
	}
	if (cook.va > 0) {
		nl.push(
			line(
				'neutral-cooking',
				'Cooking appliances at 70 %',
				roundTo(cook.va * 0.7, 6),
				'VA',
				section('neutral', ed),
				`${q(cook.va, 'VA')} × 70 % = ${q(cook.va * 0.7, 'VA')}`,
			),
		);
	}
	if (dryerDemand > 0) {
		nl.push(
			line(
				'neutral-dryers',
				'Clothes dryers at 70 %',
				roundTo(dryerDemand * 0.7, 6),
				'VA',
				section('neutral', ed),
				`${q(dryerDemand, 'VA')} × 70 % = ${q(dryerDemand * 0.7, 'VA')}`,
			),
		);
	}
	if (b.ev120VA > 0) {
		nl.push(
			line(
				'neutral-evse',
				'120 V EVSE',
				b.ev120VA,
				'VA',
				section('neutral', ed),
				`${q(b.ev120VA, 'VA')} at 100 %`,
			),
		);
	}
	let nSum = 0;
	for (const l of nl) nSum += l.value;
	nSum = roundTo(nSum, 6);
	const limitVA = 200 * supply.divisor;
	const sum = () => `${nl.map((l) => num(l.value)).join(' + ')} = ${q(nSum, 'VA')}`;
	let neutralTotal: Line;
	if (nSum > limitVA) {
		const reduced = roundTo(limitVA + (nSum - limitVA) * 0.7, 6);
		neutralTotal = line(
			'neutral-total',
			'Neutral load',
			reduced,
			'VA',
			section('neutral', ed),
			() =>
				`${sum()}; above 200 A (${q(limitVA, 'VA')}) at 70 %: ${q(limitVA, 'VA')} + ${q(nSum - limitVA, 'VA')} × 70 % = ${q(reduced, 'VA')}`,
		);
	} else {
		neutralTotal = line('neutral-total', 'Neutral load', nSum, 'VA', section('neutral', ed), sum);
	}
	return { lines, total, neutralLines: nl, neutralTotal };
}

function nameplateAppliances(b: LoadBucket, ed: Edition, rule: string): Line | null {
	const cookingVA = sumOf(b.cookingKW) * 1000;
	const dryers = sumOf(b.dryerVA);
	const ev = sumOf(b.evVA);
	const fixed = b.fixedVA + b.smallFixedVA;
	const v = roundTo(fixed + cookingVA + dryers + ev, 6);
	if (v === 0) return null;
	const parts: string[] = [];
	if (fixed > 0) parts.push(`fastened in place ${q(fixed, 'VA')}`);
	if (cookingVA > 0) parts.push(`cooking ${q(cookingVA, 'VA')}`);
	if (dryers > 0) parts.push(`dryers ${q(dryers, 'VA')}`);
	if (ev > 0) parts.push(`EVSE ${q(ev, 'VA')}`);
	void ed;
	return line(
		'appliances',
		'Appliances at nameplate rating',
		v,
		'VA',
		rule,
		`${parts.join(' + ')} = ${q(v, 'VA')}`,
	);
}

export interface OptionalMethodResult {
	lines: Line[];
	total: Line;
}

/** Optional method for a one-family dwelling, 220.82. */
export function optionalMethod(b: LoadBucket, o: GeneralLoadOptions): OptionalMethodResult {
	const ed = o.edition;
	const rule = section('optionalGeneral', ed);
	const general = generalLines(b, o, `${rule}(1)`);
	const app = nameplateAppliances(b, ed, `${rule}(3), (4)`);
	const parts = app ? [...general, app] : general;
	const sub = subtotal('general-subtotal', 'General load', parts, rule);
	const fr = firstAtFullRestAt40(sub.value, 10_000);
	const demand = line('general-demand', 'General load after demand factors', fr.va, 'VA', rule, fr.working);
	const lines: Line[] = [...parts, sub, demand];

	const choices: { label: string; va: number; working: string }[] = [];
	const hp = b.heatPumpVA;
	const supp = b.heatSupplementalVA;
	const cool = b.coolingVA + hp;
	if (cool > 0)
		choices.push({
			label: '(C)(1) air conditioning and cooling at 100 %',
			va: cool,
			working: `${q(cool, 'VA')} × 100 %`,
		});
	if (hp > 0 && supp === 0)
		choices.push({
			label: '(C)(2) heat pump without supplemental heat at 100 %',
			va: hp,
			working: `${q(hp, 'VA')} × 100 %`,
		});
	if (hp > 0 && supp > 0) {
		const v = hp + supp * 0.65;
		choices.push({
			label: '(C)(3) heat pump at 100 % and supplemental heat at 65 %',
			va: v,
			working: `${q(hp, 'VA')} + ${q(supp, 'VA')} × 65 % = ${q(v, 'VA')}`,
		});
	}
	const spaceVA = b.heatCentralVA + b.heatRoomUnitsVA + (hp === 0 ? supp : 0);
	const units = b.heatCentralUnits + b.heatRoomUnits;
	if (spaceVA > 0) {
		if (units < 4)
			choices.push({
				label: '(C)(4) space heating, fewer than four units, at 65 %',
				va: spaceVA * 0.65,
				working: `${q(spaceVA, 'VA')} × 65 % = ${q(spaceVA * 0.65, 'VA')}`,
			});
		else {
			// Read literally, a fourth unit drops the group from 65 % to 40 % and can lower the load;
			// the group is taken at no less than its three largest units at 65 %.
			const top3 = sumOf(b.heatUnitTop3) + (hp === 0 ? supp : 0);
			const floored = top3 * 0.65 > spaceVA * 0.4;
			const va = Math.max(spaceVA * 0.4, top3 * 0.65);
			choices.push({
				label: '(C)(5) space heating, four or more units, at 40 %',
				va,
				working:
					`${q(spaceVA, 'VA')} × 40 % = ${q(spaceVA * 0.4, 'VA')}` +
					(floored ? `; not less than the three largest units at 65 %, ${q(va, 'VA')}` : ''),
			});
		}
	}
	if (b.heatStorageVA > 0)
		choices.push({
			label: '(C)(6) thermal storage heating at 100 %',
			va: b.heatStorageVA,
			working: `${q(b.heatStorageVA, 'VA')} × 100 %`,
		});
	const counted: Line[] = [demand];
	if (choices.length > 0) {
		let best = choices[0];
		for (const c of choices) if (best === undefined || c.va > best.va) best = c;
		if (best) {
			const l = line(
				'heating-cooling',
				`Heating or air conditioning, the largest: ${best.label}`,
				roundTo(best.va, 6),
				'VA',
				section('optionalHeatCool', ed),
				choices.map((c) => `${c.label}: ${c.working}`).join('; ') + ` → the largest, ${q(best.va, 'VA')}`,
			);
			lines.push(l);
			counted.push(l);
		}
	}
	const total = subtotal('total', 'Calculated load', counted, section('optional', ed));
	lines.push(total);
	return { lines, total };
}

/** Added loads to an existing dwelling, 220.83: (B) where heating or air conditioning is added, (A) otherwise. */
export function existingAddedMethod(
	all: LoadBucket,
	added: LoadBucket,
	o: GeneralLoadOptions,
): OptionalMethodResult {
	const ed = o.edition;
	const rule = section('existingAdded', ed);
	const addsHvac =
		added.coolingVA +
			added.heatPumpVA +
			added.heatCentralVA +
			added.heatRoomUnitsVA +
			added.heatSupplementalVA +
			added.heatStorageVA >
		0;
	const general = generalLines(all, o, rule);
	const app = nameplateAppliances(all, ed, rule);
	const parts = app ? [...general, app] : general;
	const heat =
		all.heatCentralVA + all.heatRoomUnitsVA + all.heatSupplementalVA + all.heatStorageVA + all.heatPumpVA;
	const cool = all.coolingVA + all.heatPumpVA;
	const hvac = Math.max(heat, cool);
	const hvacLine =
		hvac > 0
			? line(
					'heating-cooling',
					addsHvac
						? 'Heating or air conditioning at 100 % (the larger)'
						: 'Existing heating or air conditioning (the larger)',
					hvac,
					'VA',
					`${rule}(${addsHvac ? 'B' : 'A'}), ${section('noncoincident', ed).replace(`NEC ${ed} `, '')}`,
					`heating ${q(heat, 'VA')}, cooling ${q(cool, 'VA')}: the larger, ${q(hvac, 'VA')}`,
				)
			: null;
	const lines: Line[] = [...parts];
	let total: Line;
	if (addsHvac && hvacLine) {
		const sub = subtotal('other-subtotal', 'All other load', parts, `${rule}(B)`);
		const fr = firstAtFullRestAt40(sub.value, 8000);
		const demand = line(
			'other-demand',
			'Other load: first 8 kVA at 100 %, the rest at 40 %',
			fr.va,
			'VA',
			`${rule}(B)`,
			fr.working,
		);
		lines.push(sub, demand, hvacLine);
		total = subtotal('total', 'Calculated load', [demand, hvacLine], `${rule}(B)`);
	} else {
		const withHvac = hvacLine ? [...parts, hvacLine] : parts;
		if (hvacLine) lines.push(hvacLine);
		const sub = subtotal('other-subtotal', 'Existing and new load', withHvac, `${rule}(A)`);
		const fr = firstAtFullRestAt40(sub.value, 8000);
		lines.push(sub);
		total = line(
			'total',
			'Calculated load: first 8 kVA at 100 %, the rest at 40 %',
			fr.va,
			'VA',
			`${rule}(A)`,
			fr.working,
		);
	}
	lines.push(total);
	return { lines, total };
}

/** Existing load from 12 months of measured maximum demand at 125 %, plus the new load (220.87). */
export function measuredDemandMethod(
	peakKW: number,
	added: LoadBucket,
	addedAreaFt2: number,
	ed: Edition,
): OptionalMethodResult {
	const rule = section('measuredDemand', ed);
	const existing = roundTo(peakKW * 1000 * 1.25, 6);
	const lines: Line[] = [
		line(
			'existing',
			'Existing load: 12-month maximum demand × 125 %',
			existing,
			'VA',
			rule,
			`${num(peakKW)} kW × 1,000 × 125 % = ${q(existing, 'VA')} (kW taken as kVA)`,
		),
	];
	const newParts: Line[] = [];
	const areaVA = addedAreaFt2 * 3;
	const lighting = Math.max(areaVA, added.recordedLightingVA);
	if (lighting > 0) {
		newParts.push(
			line(
				'new-lighting',
				'New general lighting and receptacles',
				lighting,
				'VA',
				section('generalLighting', ed),
				areaVA >= added.recordedLightingVA
					? `${num(addedAreaFt2)} ft² of rooms with new lighting or receptacles × 3 VA/ft² = ${q(areaVA, 'VA')}`
					: `recorded ${q(added.recordedLightingVA, 'VA')} (more than ${q(areaVA, 'VA')} by area)`,
			),
		);
	}
	const circuits = added.smallApplianceCircuits + added.laundryCircuits;
	if (circuits > 0) {
		newParts.push(
			line(
				'new-circuits',
				'New small-appliance and laundry circuits',
				circuits * 1500,
				'VA',
				sections(['smallAppliance', 'laundry'], ed),
				`${circuits} × 1,500 VA = ${q(circuits * 1500, 'VA')}`,
			),
		);
	}
	const fixed = added.fixedVA + added.smallFixedVA;
	if (fixed > 0)
		newParts.push(
			line(
				'new-fixed',
				'New appliances fastened in place at nameplate',
				fixed,
				'VA',
				rule,
				`${q(fixed, 'VA')} at 100 %`,
			),
		);
	if (added.cookingKW.length > 0) {
		const c = cookingDemand(added.cookingKW);
		newParts.push(
			line('new-cooking', 'New cooking appliances', c.va, 'VA', section('cooking', ed), c.working),
		);
	}
	if (added.dryerVA.length > 0) {
		const v = sumOf(added.dryerVA.map((d) => Math.max(5000, d)));
		newParts.push(
			line(
				'new-dryers',
				'New clothes dryers',
				v,
				'VA',
				section('dryers', ed),
				`${added.dryerVA.map((d) => q(Math.max(5000, d), 'VA')).join(' + ')} = ${q(v, 'VA')} (5,000 W minimum each)`,
			),
		);
	}
	const heat =
		added.heatCentralVA +
		added.heatRoomUnitsVA +
		added.heatSupplementalVA +
		added.heatStorageVA +
		added.heatPumpVA;
	const cool = added.coolingVA + added.heatPumpVA;
	if (heat > 0 || cool > 0) {
		const v = Math.max(heat, cool);
		newParts.push(
			line(
				'new-heating-cooling',
				'New heating or air conditioning (the larger)',
				v,
				'VA',
				section('noncoincident', ed),
				`heating ${q(heat, 'VA')}, cooling ${q(cool, 'VA')} → ${q(v, 'VA')}`,
			),
		);
	}
	if (added.largestMotorVA > 0) {
		const v = roundTo(added.largestMotorVA * 0.25, 6);
		newParts.push(
			line(
				'new-largest-motor',
				'25 % of the largest new motor',
				v,
				'VA',
				section('motors', ed),
				`${q(added.largestMotorVA, 'VA')} × 25 % = ${q(v, 'VA')}`,
			),
		);
	}
	if (added.evVA.length > 0) {
		const min = ed === '2017' ? 0 : 7200;
		const v = sumOf(added.evVA.map((e) => Math.max(min, e)));
		newParts.push(
			line(
				'new-evse',
				'New EVSE',
				v,
				'VA',
				section('evse', ed),
				`${added.evVA.map((e) => q(Math.max(min, e), 'VA')).join(' + ')} = ${q(v, 'VA')}`,
			),
		);
	}
	lines.push(...newParts);
	const newTotal = roundTo(sumOf(newParts.map((p) => p.value)), 6);
	const total = line(
		'total',
		'Calculated load',
		roundTo(existing + newTotal, 6),
		'VA',
		rule,
		`${q(existing, 'VA')} existing + ${q(newTotal, 'VA')} new = ${q(existing + newTotal, 'VA')}`,
	);
	lines.push(total);
	return { lines, total };
}
