import type {
	BreakerType,
	Circuit,
	Conductor,
	LoadKind,
	Panel,
	Room,
	VoltageSystem,
} from '../electrical/schema';
import type { JobStatus } from '../schemas/job';

/** A job as the API returns it. */
export interface JobRecord {
	id: string;
	firmId: string;
	propertyId: string | null;
	jurisdictionId: string | null;
	jurisdictionName: string | null;
	name: string;
	address: string;
	homeownerName: string;
	homeownerEmail: string;
	codeEdition: '2017' | '2020' | '2023';
	scopeOfWork: string;
	permitNumber: string;
	status: JobStatus;
	serviceRatingA: number;
	voltageSystem: VoltageSystem;
	terminalTemperatureC: 60 | 75 | 90;
	floorAreaFt2: number | null;
	existingPeakDemandKW: number | null;
	/** The inspector who took the review, if any. */
	assignedInspectorId: string | null;
	/** When the latest revision was submitted (the review queue counts days waiting from it). */
	submittedAt: string | null;
	/** The number of the latest submitted revision; 0 before the first submission. */
	currentRevision: number;
	version: number;
	createdBy: string | null;
	createdAt: string;
	updatedAt: string;
}

export type RoomRecord = Room & { jobId: string; version: number };
export type PanelRecord = Panel & { jobId: string; version: number };
export type CircuitRecord = Circuit & { jobId: string; version: number };

/** A load as the API returns it (the engine's load, with nulls for the ratings not given). */
export interface LoadRecord {
	id: string;
	circuitId: string;
	jobId: string;
	kind: LoadKind;
	description: string;
	quantity: number;
	va: number | null;
	watts: number | null;
	hp: string | null;
	voltage: 120 | 208 | 240;
	continuous: boolean;
	cordAndPlug: boolean;
	status: 'existing' | 'new' | null;
	spaceHeating: 'central' | 'room-units' | 'heat-pump-supplemental' | 'thermal-storage' | null;
	roomIds: string[];
	version: number;
}

// Raw rows as PostgreSQL returns them.
type Row = Record<string, unknown>;

const iso = (v: unknown): string => (v instanceof Date ? v.toISOString() : String(v));
const num = (v: unknown): number => Number(v);
const numOrNull = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

export const JOB_COLUMNS = ['jobs.*', 'jurisdictions.name as jurisdiction_name'] as const;

export function jobFromRow(r: Row): JobRecord {
	return {
		id: r.id as string,
		firmId: r.firm_id as string,
		propertyId: (r.property_id as string | null) ?? null,
		jurisdictionId: (r.jurisdiction_id as string | null) ?? null,
		jurisdictionName: (r.jurisdiction_name as string | null) ?? null,
		name: r.name as string,
		address: r.address as string,
		homeownerName: r.homeowner_name as string,
		homeownerEmail: r.homeowner_email as string,
		codeEdition: r.code_edition as JobRecord['codeEdition'],
		scopeOfWork: r.scope_of_work as string,
		permitNumber: r.permit_number as string,
		status: r.status as JobStatus,
		serviceRatingA: num(r.service_rating_a),
		voltageSystem: r.voltage_system as VoltageSystem,
		terminalTemperatureC: num(r.terminal_temperature_c) as JobRecord['terminalTemperatureC'],
		floorAreaFt2: numOrNull(r.floor_area_ft2),
		existingPeakDemandKW: numOrNull(r.existing_peak_demand_kw),
		assignedInspectorId: (r.assigned_inspector_id as string | null) ?? null,
		submittedAt: r.submitted_at ? iso(r.submitted_at) : null,
		currentRevision: num(r.current_revision ?? 0),
		version: num(r.version),
		createdBy: (r.created_by as string | null) ?? null,
		createdAt: iso(r.created_at),
		updatedAt: iso(r.updated_at),
	};
}

/** Job fields (API names) → columns. */
export const JOB_FIELD_COLUMNS = {
	name: 'name',
	address: 'address',
	homeownerName: 'homeowner_name',
	homeownerEmail: 'homeowner_email',
	jurisdictionId: 'jurisdiction_id',
	codeEdition: 'code_edition',
	scopeOfWork: 'scope_of_work',
	serviceRatingA: 'service_rating_a',
	voltageSystem: 'voltage_system',
	terminalTemperatureC: 'terminal_temperature_c',
	floorAreaFt2: 'floor_area_ft2',
	existingPeakDemandKW: 'existing_peak_demand_kw',
} as const;

export function roomFromRow(r: Row): RoomRecord {
	return {
		id: r.id as string,
		jobId: r.job_id as string,
		name: r.name as string,
		type: r.type as Room['type'],
		floor: num(r.floor),
		areaFt2: num(r.area_ft2),
		inFloorArea: (r.in_floor_area as boolean | null) ?? null,
		version: num(r.version),
	};
}

export function roomToRow(room: Omit<Room, 'id'>): Row {
	return {
		name: room.name,
		type: room.type,
		floor: room.floor,
		area_ft2: room.areaFt2,
		in_floor_area: room.inFloorArea,
	};
}

export function panelFromRow(r: Row): PanelRecord {
	return {
		id: r.id as string,
		jobId: r.job_id as string,
		name: r.name as string,
		location: r.location as string,
		kind: r.kind as Panel['kind'],
		fedFromCircuitId: (r.fed_from_circuit_id as string | null) ?? null,
		voltageSystem: r.voltage_system as VoltageSystem,
		busRatingA: num(r.bus_rating_a),
		mainBreakerA: numOrNull(r.main_breaker_a) as Panel['mainBreakerA'],
		spaces: num(r.spaces),
		version: num(r.version),
	};
}

export function panelToRow(p: Omit<Panel, 'id'>): Row {
	return {
		name: p.name,
		location: p.location,
		kind: p.kind,
		fed_from_circuit_id: p.fedFromCircuitId,
		voltage_system: p.voltageSystem,
		bus_rating_a: p.busRatingA,
		main_breaker_a: p.mainBreakerA,
		spaces: p.spaces,
	};
}

/** A circuit row (with job_id joined from its panel) and its room ids. */
export function circuitFromRow(r: Row, roomIds: string[]): CircuitRecord {
	return {
		id: r.id as string,
		panelId: r.panel_id as string,
		jobId: r.job_id as string,
		position: num(r.position),
		poles: num(r.poles) as Circuit['poles'],
		ratingA: num(r.rating_a) as Circuit['ratingA'],
		breakerType: r.breaker_type as BreakerType,
		conductor: {
			size: r.conductor_size as Conductor['size'],
			material: r.conductor_material as Conductor['material'],
			insulationC: num(r.conductor_insulation_c) as Conductor['insulationC'],
		},
		lengthFt: num(r.length_ft),
		label: r.label as string,
		roomIds,
		status: r.status as Circuit['status'],
		multiwireWith: (r.multiwire_with_id as string | null) ?? null,
		gfciAtDevice: r.gfci_at_device as boolean,
		afciAtDevice: r.afci_at_device as boolean,
		version: num(r.version),
	};
}

export function circuitToRow(c: Omit<Circuit, 'id' | 'panelId' | 'roomIds'>): Row {
	return {
		position: c.position,
		poles: c.poles,
		rating_a: c.ratingA,
		breaker_type: c.breakerType,
		conductor_size: c.conductor.size,
		conductor_material: c.conductor.material,
		conductor_insulation_c: c.conductor.insulationC,
		length_ft: c.lengthFt,
		label: c.label,
		status: c.status,
		multiwire_with_id: c.multiwireWith,
		gfci_at_device: c.gfciAtDevice,
		afci_at_device: c.afciAtDevice,
	};
}

export function loadFromRow(r: Row, roomIds: string[]): LoadRecord {
	return {
		id: r.id as string,
		circuitId: r.circuit_id as string,
		jobId: r.job_id as string,
		kind: r.kind as LoadKind,
		description: r.description as string,
		quantity: num(r.quantity),
		va: numOrNull(r.va),
		watts: numOrNull(r.watts),
		hp: (r.hp as string | null) ?? null,
		voltage: num(r.voltage) as LoadRecord['voltage'],
		continuous: r.continuous as boolean,
		cordAndPlug: r.cord_and_plug as boolean,
		status: (r.status as LoadRecord['status']) ?? null,
		spaceHeating: (r.space_heating as LoadRecord['spaceHeating']) ?? null,
		roomIds,
		version: num(r.version),
	};
}

type LoadFields = Omit<
	LoadRecord,
	'id' | 'circuitId' | 'jobId' | 'roomIds' | 'version' | 'va' | 'watts' | 'hp'
> & {
	va?: number | null;
	watts?: number | null;
	hp?: string | null;
};

export function loadToRow(l: LoadFields): Row {
	return {
		kind: l.kind,
		description: l.description,
		quantity: l.quantity,
		va: l.va ?? null,
		watts: l.watts ?? null,
		hp: l.hp ?? null,
		voltage: l.voltage,
		continuous: l.continuous,
		cord_and_plug: l.cordAndPlug,
		status: l.status,
		space_heating: l.spaceHeating,
	};
}
