import { computeJob, parseJobDocument, type JobResult } from './electrical';
import type { Circuit, JobDocument, Load, Panel, Room, RuleOptions } from './electrical/schema';
import type { CircuitRecord, JobRecord, LoadRecord, PanelRecord, RoomRecord } from './repositories/rows';

/** A job with everything in it, as the API returns it. */
export interface JobTree {
	job: JobRecord;
	rooms: RoomRecord[];
	panels: PanelRecord[];
	circuits: CircuitRecord[];
	loads: LoadRecord[];
	/** The engine's rule options from the amendments of the job's jurisdiction (none when absent). */
	ruleOptions?: RuleOptions;
}

/** The engine's room, panel, circuit or load: the record without the API's bookkeeping fields. */
export function roomDoc(r: RoomRecord): Room {
	return {
		id: r.id,
		name: r.name,
		type: r.type,
		floor: r.floor,
		areaFt2: r.areaFt2,
		inFloorArea: r.inFloorArea,
	};
}

export function panelDoc(p: PanelRecord): Panel {
	return {
		id: p.id,
		name: p.name,
		location: p.location,
		kind: p.kind,
		fedFromCircuitId: p.fedFromCircuitId,
		voltageSystem: p.voltageSystem,
		busRatingA: p.busRatingA,
		mainBreakerA: p.mainBreakerA,
		spaces: p.spaces,
	};
}

export function circuitDoc(c: CircuitRecord): Circuit {
	return {
		id: c.id,
		panelId: c.panelId,
		position: c.position,
		poles: c.poles,
		ratingA: c.ratingA,
		breakerType: c.breakerType,
		conductor: { ...c.conductor },
		lengthFt: c.lengthFt,
		label: c.label,
		roomIds: [...c.roomIds],
		status: c.status,
		multiwireWith: c.multiwireWith,
		gfciAtDevice: c.gfciAtDevice,
		afciAtDevice: c.afciAtDevice,
	};
}

export function loadDoc(l: LoadRecord): Load {
	return {
		id: l.id,
		circuitId: l.circuitId,
		kind: l.kind,
		description: l.description,
		quantity: l.quantity,
		va: l.va,
		watts: l.watts,
		hp: l.hp as Load['hp'],
		voltage: l.voltage,
		continuous: l.continuous,
		cordAndPlug: l.cordAndPlug,
		status: l.status,
		spaceHeating: l.spaceHeating,
		roomIds: [...l.roomIds],
	};
}

/**
 * The engine's job document (format version 1) built from a job's rows, ids being the database ids.
 * It is what export writes and what computeJob reads.
 */
export function jobDocumentFromRows(tree: JobTree): JobDocument {
	const { job } = tree;
	return {
		formatVersion: 1,
		id: job.id,
		name: job.name,
		address: job.address,
		codeEdition: job.codeEdition,
		jurisdiction: job.jurisdictionName ? { name: job.jurisdictionName } : null,
		terminalTemperatureC: job.terminalTemperatureC,
		floorAreaFt2: job.floorAreaFt2,
		ruleOptions: tree.ruleOptions ?? { gfciEdition: null, afciEdition: null },
		service: {
			ratingA: job.serviceRatingA as JobDocument['service']['ratingA'],
			voltageSystem: job.voltageSystem,
			existingLoad:
				job.existingPeakDemandKW === null
					? null
					: { method: 'measured-peak', peakDemandKW: job.existingPeakDemandKW },
		},
		rooms: tree.rooms.map(roomDoc),
		panels: tree.panels.map(panelDoc),
		circuits: tree.circuits.map(circuitDoc),
		loads: tree.loads.map(loadDoc),
	};
}

/** The engine's answer for a job: its results, or what is missing before it can compute. */
export type EngineOutcome = { ok: true; results: JobResult } | { ok: false; errors: string[] };

/** Validates the job's document and runs computeJob on it. */
export function engineOutcome(doc: JobDocument): EngineOutcome {
	const parsed = parseJobDocument(doc);
	if (!parsed.ok) return { ok: false, errors: parsed.errors };
	return { ok: true, results: computeJob(parsed.doc) };
}

/**
 * Field errors keyed by dotted document path ("circuits.3.conductor.size", "_" for the document)
 * from the engine's "circuits[3].conductor.size: message" lines.
 */
export function documentFieldErrors(lines: readonly string[]): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	for (const line of lines) {
		const m = /^([^:\s]+): ([\s\S]*)$/.exec(line);
		const rawPath = m ? m[1]! : '(document)';
		const path = rawPath === '(document)' ? '_' : rawPath.replace(/\[(\d+)\]/g, '.$1').replace(/^\./, '');
		(fields[path] ??= []).push(m ? m[2]! : line);
	}
	return fields;
}
