import type { Knex } from 'knex';
import { positionsTaken } from '../electrical/positions';
import { AppError, errors } from '../errors';
import type { CircuitPatch } from '../schemas/circuit';
import { recordAudit } from './audit';
import { consistencyGuard } from './consistency';
import { assertRoomsOfJob, setRoomLinks } from './jobs';
import { listLoadsOfCircuits } from './loads';
import { circuitFromRow, circuitToRow, panelFromRow, type CircuitRecord, type PanelRecord } from './rows';
import { bump, inTransaction, lockVersion, type Actor } from './versioned';

async function withRooms(knex: Knex, rows: Record<string, unknown>[]): Promise<CircuitRecord[]> {
	const ids = rows.map((r) => r.id as string);
	const links = ids.length
		? await knex('circuit_rooms').whereIn('circuit_id', ids).orderBy(['circuit_id', 'ordinal', 'room_id'])
		: [];
	return rows.map((r) =>
		circuitFromRow(
			r,
			links.filter((l) => l.circuit_id === r.id).map((l) => l.room_id as string),
		),
	);
}

/** A panel's circuits by position. */
export async function listCircuits(knex: Knex, panelId: string): Promise<CircuitRecord[]> {
	const rows = await knex('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where('c.panel_id', panelId)
		.orderBy('c.position')
		.select('c.*', 'p.job_id');
	return withRooms(knex, rows);
}

export async function getCircuit(knex: Knex, id: string): Promise<CircuitRecord | null> {
	const row = await knex('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where('c.id', id)
		.first('c.*', 'p.job_id');
	return row ? (await withRooms(knex, [row]))[0]! : null;
}

/** The job a circuit belongs to, or null. */
export async function circuitJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await knex('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where('c.id', id)
		.first('p.job_id');
	return row?.job_id ?? null;
}

/**
 * Checks that a breaker at `position` with `poles` fits the panel and finds no other breaker there:
 * 400 on the position field when beyond the spaces, 409 naming the breaker that holds a position.
 * Call with the panel row locked so two writers cannot both take a free position.
 */
export async function assertPositionFree(
	trx: Knex.Transaction,
	panel: PanelRecord,
	position: number,
	poles: 1 | 2 | 3,
	exceptId: string | null,
): Promise<void> {
	const wanted = positionsTaken(position, poles);
	const last = wanted[wanted.length - 1]!;
	if (last > panel.spaces) {
		const takes = poles === 1 ? `position ${position}` : `positions ${wanted.join(' and ')}`;
		throw errors.invalid(
			`Panel “${panel.name}” has ${panel.spaces} spaces; this breaker would take ${takes}.`,
			{
				position: [
					`a ${poles}-pole breaker at position ${position} takes ${takes}, beyond the panel’s ${panel.spaces} spaces`,
				],
			},
		);
	}
	const others = await trx('circuits')
		.where({ panel_id: panel.id })
		.modify((q) => {
			if (exceptId) q.whereNot({ id: exceptId });
		})
		.select('id', 'position', 'poles', 'label');
	for (const o of others) {
		const held = positionsTaken(o.position, o.poles);
		const clash = wanted.find((p) => held.includes(p));
		if (clash !== undefined) {
			const name = o.label ? `“${o.label}”` : 'another breaker';
			const msg = `position ${clash} is taken by ${name} (the ${o.poles}-pole breaker at position ${o.position})`;
			throw new AppError(
				'conflict',
				`Position ${clash} of panel “${panel.name}” is taken by ${name}. Choose a free position or move that breaker first.`,
				{ fields: { position: [msg] } },
			);
		}
	}
}

/** Reads a panel and locks its row for the rest of the transaction (positions are checked under this lock). */
export async function lockPanel(trx: Knex.Transaction, panelId: string): Promise<PanelRecord | null> {
	const row = await trx('panels').where({ id: panelId }).forUpdate().first();
	return row ? panelFromRow(row) : null;
}

/** A multiwire partner must be a circuit of the same job (400 on `multiwireWith` otherwise). */
export async function assertMultiwirePartner(
	trx: Knex.Transaction,
	jobId: string,
	partner: string | null,
): Promise<void> {
	if (partner === null) return;
	const found = await trx('circuits as c')
		.join('panels as p', 'p.id', 'c.panel_id')
		.where({ 'c.id': partner, 'p.job_id': jobId })
		.first('c.id');
	if (!found)
		throw errors.invalid('Some fields need attention.', {
			multiwireWith: ['no circuit of this job has this id'],
		});
}

/** Locks a circuit's panel, then the circuit at the version the client read (404 when gone, 409 when stale). */
async function lockCircuitAndPanel(
	trx: Knex.Transaction,
	id: string,
	version: number,
): Promise<{ panel: PanelRecord; before: CircuitRecord }> {
	const current = await getCircuit(trx, id);
	if (!current) throw errors.notFound('circuit');
	const panel = (await lockPanel(trx, current.panelId))!;
	const before = await lockVersion(trx, 'circuits', id, version, () => getCircuit(trx, id), 'circuit');
	return { panel, before };
}

/**
 * The circuit with the fields given (undefined ones left as they are), after checking its rooms,
 * its multiwire partner and, when position or poles change, the positions it would take.
 */
export async function mergeCircuitChanges(
	trx: Knex.Transaction,
	panel: PanelRecord,
	before: CircuitRecord,
	fields: Omit<CircuitPatch, 'version'>,
): Promise<CircuitRecord> {
	const merged = {
		...before,
		...Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined)),
	} as CircuitRecord;
	if (fields.roomIds) await assertRoomsOfJob(trx, before.jobId, fields.roomIds);
	if (fields.multiwireWith !== undefined)
		await assertMultiwirePartner(trx, before.jobId, merged.multiwireWith);
	if (merged.position !== before.position || merged.poles !== before.poles)
		await assertPositionFree(trx, panel, merged.position, merged.poles, before.id);
	return merged;
}

/** Changes a circuit (position and poles included, checked like a move); a stale version is a 409. */
export async function updateCircuit(
	knex: Knex,
	actor: Actor,
	id: string,
	patch: CircuitPatch,
): Promise<CircuitRecord> {
	return inTransaction(knex, async (trx) => {
		const { panel, before } = await lockCircuitAndPanel(trx, id, patch.version);
		const { version: _v, ...fields } = patch;
		const merged = await mergeCircuitChanges(trx, panel, before, fields);
		const guard = await consistencyGuard(trx, before.jobId);
		await trx('circuits')
			.where({ id })
			.update({ ...circuitToRow(merged), ...bump(trx) });
		if (fields.roomIds) await setRoomLinks(trx, 'circuit_rooms', 'circuit_id', id, fields.roomIds);
		await guard.check(id);
		const after = (await getCircuit(trx, id))!;
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'circuit',
			entityId: id,
			action: 'update',
			before,
			after,
		});
		return after;
	});
}

/** Moves a breaker to another position of its panel: 409 when taken, 400 when beyond the panel's spaces. */
export async function moveCircuit(
	knex: Knex,
	actor: Actor,
	id: string,
	position: number,
	version: number,
): Promise<CircuitRecord> {
	return inTransaction(knex, async (trx) => {
		const { panel, before } = await lockCircuitAndPanel(trx, id, version);
		await assertPositionFree(trx, panel, position, before.poles, id);
		await trx('circuits')
			.where({ id })
			.update({ position, ...bump(trx) });
		const after = (await getCircuit(trx, id))!;
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'circuit',
			entityId: id,
			action: 'move',
			before,
			after,
		});
		return after;
	});
}

/** Deletes a circuit and its loads (an audit row each); refused (409) while it feeds a subpanel. */
export async function deleteCircuit(
	knex: Knex,
	actor: Actor,
	id: string,
	version: number,
): Promise<{ loads: number }> {
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'circuits', id, version, () => getCircuit(trx, id), 'circuit');
		const fed = await trx('panels').where({ fed_from_circuit_id: id }).first('name');
		if (fed) {
			throw errors.conflict(
				`This circuit feeds subpanel “${fed.name}”. Delete that subpanel, or feed it from another circuit, first.`,
			);
		}
		const loads = await listLoadsOfCircuits(trx, [id]);
		const audit = { jobId: before.jobId, userId: actor.id, action: 'delete' as const, after: null };
		for (const l of loads) await recordAudit(trx, { ...audit, entity: 'load', entityId: l.id, before: l });
		await trx('circuits').where({ id }).delete();
		await recordAudit(trx, { ...audit, entity: 'circuit', entityId: id, before });
		return { loads: loads.length };
	});
}
