import type { Knex } from 'knex';
import { errors } from '../errors';
import { loadInputSchema, type LoadInput, type LoadPatch } from '../schemas/load';
import { recordAudit } from './audit';
import { consistencyGuard } from './consistency';
import { assertRoomsOfJob, setRoomLinks } from './jobs';
import { loadFromRow, loadToRow, type LoadRecord } from './rows';
import { bump, inTransaction, lockVersion, type Actor } from './versioned';

function loadQuery(knex: Knex) {
	return knex('loads as l')
		.join('circuits as c', 'c.id', 'l.circuit_id')
		.join('panels as p', 'p.id', 'c.panel_id')
		.select('l.*', 'p.job_id');
}

async function withRooms(knex: Knex, rows: Record<string, unknown>[]): Promise<LoadRecord[]> {
	const ids = rows.map((r) => r.id as string);
	const links = ids.length
		? await knex('load_rooms').whereIn('load_id', ids).orderBy(['load_id', 'ordinal', 'room_id'])
		: [];
	return rows.map((r) =>
		loadFromRow(
			r,
			links.filter((l) => l.load_id === r.id).map((l) => l.room_id as string),
		),
	);
}

/** The loads of some circuits, as entered. */
export async function listLoadsOfCircuits(knex: Knex, circuitIds: string[]): Promise<LoadRecord[]> {
	if (circuitIds.length === 0) return [];
	const rows = await loadQuery(knex).whereIn('l.circuit_id', circuitIds).orderBy('l.seq');
	return withRooms(knex, rows);
}

export async function getLoad(knex: Knex, id: string): Promise<LoadRecord | null> {
	const row = await loadQuery(knex).where('l.id', id).first();
	return row ? (await withRooms(knex, [row]))[0]! : null;
}

/** The job a load belongs to, or null. */
export async function loadJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await loadQuery(knex).where('l.id', id).first('p.job_id');
	return row?.job_id ?? null;
}

/** Adds a load to a circuit, with its rooms and the audit row. */
export async function createLoad(
	knex: Knex,
	actor: Actor,
	circuitId: string,
	input: LoadInput,
): Promise<LoadRecord> {
	return inTransaction(knex, async (trx) => {
		const circuit = await trx('circuits as c')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('c.id', circuitId)
			.forUpdate()
			.first('p.job_id');
		if (!circuit) throw errors.notFound('circuit');
		const jobId = circuit.job_id as string;
		await assertRoomsOfJob(trx, jobId, input.roomIds);
		const guard = await consistencyGuard(trx, jobId);
		const [row] = await trx('loads')
			.insert({ circuit_id: circuitId, ...loadToRow(input) })
			.returning('id');
		await setRoomLinks(trx, 'load_rooms', 'load_id', row.id, input.roomIds);
		await guard.check(row.id);
		const load = (await getLoad(trx, row.id))!;
		await recordAudit(trx, {
			jobId,
			userId: actor.id,
			entity: 'load',
			entityId: load.id,
			action: 'create',
			before: null,
			after: load,
		});
		return load;
	});
}

/** Changes a load; the merged load must still give exactly one of va, watts, hp. A stale version is a 409. */
export async function updateLoad(
	knex: Knex,
	actor: Actor,
	id: string,
	patch: LoadPatch,
): Promise<LoadRecord> {
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'loads', id, patch.version, () => getLoad(trx, id), 'load');
		const { version: _v, ...fields } = patch;
		const { id: _id, circuitId: _c, jobId: _j, version: _ver, ...rest } = before;
		const mergedInput = {
			...rest,
			...Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined)),
		};
		const parsed = loadInputSchema.safeParse(mergedInput);
		if (!parsed.success) throw errors.validation(parsed.error);
		if (fields.roomIds) await assertRoomsOfJob(trx, before.jobId, fields.roomIds);
		const guard = await consistencyGuard(trx, before.jobId);
		await trx('loads')
			.where({ id })
			.update({ ...loadToRow(parsed.data), ...bump(trx) });
		if (fields.roomIds) await setRoomLinks(trx, 'load_rooms', 'load_id', id, fields.roomIds);
		await guard.check(id);
		const after = (await getLoad(trx, id))!;
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'load',
			entityId: id,
			action: 'update',
			before,
			after,
		});
		return after;
	});
}

export async function deleteLoad(knex: Knex, actor: Actor, id: string, version: number): Promise<void> {
	await inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'loads', id, version, () => getLoad(trx, id), 'load');
		await trx('loads').where({ id }).delete();
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'load',
			entityId: id,
			action: 'delete',
			before,
			after: null,
		});
	});
}
