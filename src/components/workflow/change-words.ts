/** Words for the changes between revisions: field names and values as a reviewer reads them. */
import { BREAKER_TYPE_LABELS } from '../../lib/schemas/circuit';
import type { FieldChange, RecordChange, RecordKind } from '../../lib/workflow/revision-diff';
import { ROOM_TYPE_LABELS } from '../job/RoomForm';
import { VOLTAGE_LABELS } from '../jobs/JobFields';
import { LOAD_KIND_LABELS } from '../panel-editor/LoadsTable';

const FIELD_LABELS: Record<string, string> = {
	name: 'name',
	address: 'address',
	codeEdition: 'NEC edition',
	floorAreaFt2: 'floor area',
	terminalTemperatureC: 'terminal temperature rating',
	'service.ratingA': 'service rating',
	'service.voltageSystem': 'service voltage system',
	'service.existingLoad': 'existing load',
	type: 'room type',
	floor: 'floor',
	areaFt2: 'area',
	inFloorArea: 'counted in the floor area',
	location: 'location',
	kind: 'kind',
	fedFromCircuitId: 'fed from',
	voltageSystem: 'voltage system',
	busRatingA: 'bus rating',
	mainBreakerA: 'main breaker',
	spaces: 'spaces',
	panelId: 'panel',
	position: 'position',
	poles: 'poles',
	ratingA: 'rating',
	breakerType: 'breaker type',
	conductor: 'conductor',
	lengthFt: 'length',
	label: 'label',
	roomIds: 'rooms',
	status: 'status',
	multiwireWith: 'multiwire partner',
	gfciAtDevice: 'GFCI protection at the device',
	afciAtDevice: 'AFCI protection at the device',
	circuitId: 'circuit',
	description: 'description',
	quantity: 'quantity',
	va: 'volt-amperes',
	watts: 'watts',
	hp: 'horsepower',
	voltage: 'voltage',
	continuous: 'continuous',
	cordAndPlug: 'cord-and-plug connected',
	spaceHeating: 'space heating',
};

const UNITS: Record<string, string> = {
	floorAreaFt2: 'ft²',
	areaFt2: 'ft²',
	terminalTemperatureC: '°C',
	'service.ratingA': 'A',
	busRatingA: 'A',
	mainBreakerA: 'A',
	ratingA: 'A',
	lengthFt: 'ft',
	va: 'VA',
	watts: 'W',
	voltage: 'V',
};

export function fieldLabel(field: string): string {
	return FIELD_LABELS[field] ?? field;
}

/** A number as the screens write it: thousands separated, at most two decimals. */
export function numberText(n: number): string {
	return n.toLocaleString('en-US', { maximumFractionDigits: 2 });
}

/** A field's value in words; ids are named through the revisions' names. */
export function valueText(field: string, value: unknown, names: Record<string, string>): string {
	if (value === null || value === undefined || value === '') return '—';
	if (typeof value === 'boolean') return value ? 'yes' : 'no';
	if (typeof value === 'number')
		return UNITS[field] ? `${numberText(value)} ${UNITS[field]}` : numberText(value);
	if (field === 'conductor' && typeof value === 'object') {
		const c = value as { size: string; material: string; insulationC: number };
		return `${c.size} AWG ${c.material === 'al' ? 'aluminum' : 'copper'}, ${c.insulationC} °C`;
	}
	if (field === 'service.existingLoad' && typeof value === 'object') {
		return `measured peak ${numberText((value as { peakDemandKW: number }).peakDemandKW)} kW`;
	}
	if (Array.isArray(value)) {
		return value.length ? value.map((v) => names[String(v)] ?? String(v)).join(', ') : 'none';
	}
	if (typeof value === 'string') {
		if (field === 'breakerType')
			return BREAKER_TYPE_LABELS[value as keyof typeof BREAKER_TYPE_LABELS] ?? value;
		if (field === 'type') return ROOM_TYPE_LABELS[value as keyof typeof ROOM_TYPE_LABELS] ?? value;
		if (field === 'kind') return LOAD_KIND_LABELS[value as keyof typeof LOAD_KIND_LABELS] ?? value;
		if (field === 'voltageSystem' || field === 'service.voltageSystem')
			return VOLTAGE_LABELS[value as keyof typeof VOLTAGE_LABELS] ?? value;
		if (['panelId', 'circuitId', 'fedFromCircuitId', 'multiwireWith'].includes(field))
			return names[value] ?? value;
		return value;
	}
	return JSON.stringify(value);
}

/** The fields worth showing for a whole added or removed record. */
const SUMMARY_FIELDS: Record<RecordKind, string[]> = {
	job: [],
	room: ['type', 'floor', 'areaFt2'],
	panel: ['kind', 'location', 'busRatingA', 'mainBreakerA', 'spaces'],
	circuit: ['panelId', 'poles', 'ratingA', 'breakerType', 'conductor', 'lengthFt', 'roomIds'],
	load: ['circuitId', 'kind', 'quantity', 'va', 'watts', 'hp', 'voltage'],
};

/** A whole record in one line ("rating 20 A, breaker type AFCI, ..."). */
export function recordSummary(
	kind: RecordKind,
	record: Record<string, unknown>,
	names: Record<string, string>,
): string {
	return SUMMARY_FIELDS[kind]
		.filter((f) => record[f] !== null && record[f] !== undefined && record[f] !== '')
		.map((f) => `${fieldLabel(f)} ${valueText(f, record[f], names)}`)
		.join('; ');
}

/** One change as a sentence: “Circuit 7 “Kitchen counter”: rating 20 A → 25 A”. */
export function changeSentence(r: RecordChange, f: FieldChange, names: Record<string, string>): string {
	return `${r.title}: ${fieldLabel(f.field)} ${valueText(f.field, f.before, names)} → ${valueText(f.field, f.after, names)}`;
}
