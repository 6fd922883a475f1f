/** The homeowner's panel map as plain data for the page: panels, positions, circuits with rooms and loads. */
import type { JobDocument, JobResult } from '../electrical';

export interface MapLoad {
	description: string;
	kind: string;
	va: number | null;
	quantity: number;
}

export interface MapSlot {
	position: number;
	kind: 'circuit' | 'continuation' | 'space';
	/** The breaker's first position (the number printed on the card). */
	breaker: number | null;
	label: string;
	spare: boolean;
	ratingA: number | null;
	poles: number | null;
	breakerType: string | null;
	rooms: string[];
	loads: MapLoad[];
	/** Words searched: label, rooms, room types, load descriptions and kinds. */
	search: string;
	feedsPanel: string | null;
}

export interface MapPanel {
	id: string;
	name: string;
	location: string;
	mainBreakerA: number | null;
	busRatingA: number;
	slots: MapSlot[];
}

export interface MapSketch {
	id: string;
	caption: string;
	thumbnailUrl: string | null;
	fileUrl: string;
	contentType: string;
}

export interface PanelMapData {
	jobName: string;
	address: string;
	panels: MapPanel[];
	sketches: MapSketch[];
	/** Where the printable directory card is. */
	cardUrl: string;
}

const KIND_WORDS: Record<string, string> = {
	'small-appliance': 'small appliance kitchen counter',
	'fixed-appliance': 'appliance',
	'hvac-heat': 'heating heater furnace',
	'hvac-cool': 'air conditioning cooling',
	'heat-pump': 'heat pump',
	'water-heater': 'water heater',
	'ev-charger': 'ev car charger electric vehicle',
	range: 'range stove oven cooktop',
	dryer: 'dryer clothes laundry',
	lighting: 'lights lighting',
	receptacles: 'receptacles outlets plugs',
};

/** Builds the map from the engine's document and result. */
export function panelMapData(
	doc: JobDocument,
	result: JobResult,
	sketches: MapSketch[],
	cardUrl: string,
): PanelMapData {
	const rooms = new Map(doc.rooms.map((r) => [r.id, r]));
	const circuits = new Map(doc.circuits.map((c) => [c.id, c]));
	const panelNames = new Map(doc.panels.map((p) => [p.id, p.name]));
	const loadsBy = new Map<string, MapLoad[]>();
	const loadWords = new Map<string, string[]>();
	for (const l of doc.loads) {
		const list = loadsBy.get(l.circuitId) ?? [];
		list.push({
			description: l.description || l.kind.replace(/-/g, ' '),
			kind: l.kind,
			va: l.va ?? l.watts ?? null,
			quantity: l.quantity,
		});
		loadsBy.set(l.circuitId, list);
		const words = loadWords.get(l.circuitId) ?? [];
		words.push(
			l.description,
			l.kind.replace(/-/g, ' '),
			KIND_WORDS[l.kind] ?? '',
			...l.roomIds.map((id) => rooms.get(id)?.name ?? ''),
		);
		loadWords.set(l.circuitId, words);
	}
	const feeds = new Map(
		result.circuits
			.filter((c) => c.feedsPanelId)
			.map((c) => [c.circuitId, panelNames.get(c.feedsPanelId!) ?? '']),
	);
	const panels: MapPanel[] = result.panels.map((p) => {
		const panel = doc.panels.find((x) => x.id === p.panelId)!;
		const slots: MapSlot[] = p.positions.map((slot) => {
			const c = slot.circuitId ? circuits.get(slot.circuitId) : undefined;
			if (!c) {
				return {
					position: slot.position,
					kind: 'space',
					breaker: null,
					label: 'Space',
					spare: false,
					ratingA: null,
					poles: null,
					breakerType: null,
					rooms: [],
					loads: [],
					search: 'space empty',
					feedsPanel: null,
				};
			}
			const roomList = c.roomIds.map((id) => rooms.get(id)).filter((r) => r !== undefined);
			const spare = /\bspare\b/i.test(c.label);
			const search = [
				c.label,
				...roomList.flatMap((r) => [r.name, r.type.replace(/-/g, ' ')]),
				...(loadWords.get(c.id) ?? []),
				feeds.has(c.id) ? `subpanel ${feeds.get(c.id)}` : '',
				spare ? 'spare' : '',
			]
				.join(' ')
				.toLowerCase();
			return {
				position: slot.position,
				kind: slot.position === c.position ? 'circuit' : 'continuation',
				breaker: c.position,
				label: c.label.trim() || 'No label',
				spare,
				ratingA: c.ratingA,
				poles: c.poles,
				breakerType: c.breakerType,
				rooms: roomList.map((r) => r.name),
				loads: loadsBy.get(c.id) ?? [],
				search,
				feedsPanel: feeds.get(c.id) ?? null,
			};
		});
		return {
			id: p.panelId,
			name: p.name,
			location: panel.location,
			mainBreakerA: p.mainBreakerA,
			busRatingA: p.busRatingA,
			slots,
		};
	});
	return { jobName: doc.name, address: doc.address, panels, sketches, cardUrl };
}

/**
 * Which slots a search matches: "breaker 14", "#14" or "14" find position 14 (and the breaker
 * holding it); words find labels, rooms and loads (every word must appear).
 */
export function matchSlots(panel: MapPanel, query: string): Set<number> {
	const q = query.trim().toLowerCase();
	const hits = new Set<number>();
	if (!q) return hits;
	const number = /^(?:breaker|circuit|position|ckt|no\.?|#)?\s*#?\s*(\d{1,3})$/.exec(q);
	if (number) {
		const n = Number(number[1]);
		const slot = panel.slots.find((s) => s.position === n);
		if (slot) {
			const breaker = slot.breaker;
			for (const s of panel.slots)
				if (s.position === n || (breaker !== null && s.breaker === breaker)) hits.add(s.position);
		}
		return hits;
	}
	const words = q.split(/\s+/).filter(Boolean);
	for (const s of panel.slots) {
		if (s.kind === 'space') continue;
		if (words.every((w) => s.search.includes(w) || s.search.includes(w.replace(/s$/, ''))))
			hits.add(s.position);
	}
	return hits;
}
