import { stringify } from 'csv-stringify/sync';
import { unitVA } from './electrical/load-values';
import { positionsTaken } from './electrical/positions';
import { loadDoc } from './job-document';
import type { CircuitRecord, LoadRecord, RoomRecord } from './repositories/rows';

const BREAKER_WORDS: Record<CircuitRecord['breakerType'], string> = {
	standard: 'Standard',
	afci: 'AFCI',
	gfci: 'GFCI',
	'dual-function': 'AFCI/GFCI dual-function',
	gfpe: 'GFPE',
};

/** A panel's circuits as CSV, one row per breaker, with the connected load of each (VA, as entered). */
export function panelScheduleCsv(
	circuits: CircuitRecord[],
	loads: LoadRecord[],
	rooms: RoomRecord[],
): string {
	const roomName = new Map(rooms.map((r) => [r.id, r.name]));
	const rows = circuits.map((c) => {
		const va = loads
			.filter((l) => l.circuitId === c.id)
			.reduce((sum, l) => sum + unitVA(loadDoc(l)) * l.quantity, 0);
		return [
			positionsTaken(c.position, c.poles).join('/'),
			c.poles,
			c.ratingA,
			BREAKER_WORDS[c.breakerType],
			c.label,
			`${c.conductor.size} AWG ${c.conductor.material === 'cu' ? 'Cu' : 'Al'} ${c.conductor.insulationC} °C`,
			c.lengthFt,
			c.status,
			c.roomIds
				.map((id) => roomName.get(id) ?? '')
				.filter(Boolean)
				.join('; '),
			Math.round(va),
		];
	});
	return stringify(rows, {
		header: true,
		columns: [
			'Position',
			'Poles',
			'Rating A',
			'Breaker',
			'Label',
			'Conductor',
			'Length ft',
			'Status',
			'Rooms',
			'Load VA',
		],
		bom: false,
	});
}
