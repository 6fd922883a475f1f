import type { Knex } from 'knex';
import type { RoomInput, RoomPatch } from '../schemas/room';
import { recordAudit } from './audit';
import { roomFromRow, roomToRow, type RoomRecord } from './rows';
import { bump, inTransaction, lockVersion, type Actor } from './versioned';

/** A job's rooms, as entered. */
export async function listRooms(knex: Knex, jobId: string): Promise<RoomRecord[]> {
	const rows = await knex('rooms').where({ job_id: jobId }).orderBy('seq');
	return rows.map(roomFromRow);
}

export async function getRoom(knex: Knex, id: string): Promise<RoomRecord | null> {
	const row = await knex('rooms').where({ id }).first();
	return row ? roomFromRow(row) : null;
}

/** The job a room belongs to, or null. */
export async function roomJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await knex('rooms').where({ id }).first('job_id');
	return row?.job_id ?? null;
}

export async function createRoom(
	knex: Knex,
	actor: Actor,
	jobId: string,
	input: RoomInput,
): Promise<RoomRecord> {
	return inTransaction(knex, async (trx) => {
		const [row] = await trx('rooms')
			.insert({ job_id: jobId, ...roomToRow(input) })
			.returning('*');
		const room = roomFromRow(row);
		await recordAudit(trx, {
			jobId,
			userId: actor.id,
			entity: 'room',
			entityId: room.id,
			action: 'create',
			before: null,
			after: room,
		});
		return room;
	});
}

/** Changes a room's fields; a stale version is a 409 with the room as it is. */
export async function updateRoom(
	knex: Knex,
	actor: Actor,
	id: string,
	patch: RoomPatch,
): Promise<RoomRecord> {
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'rooms', id, patch.version, () => getRoom(trx, id), 'room');
		const { version: _v, ...fields } = patch;
		const merged = {
			...before,
			...Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined)),
		};
		await trx('rooms')
			.where({ id })
			.update({ ...roomToRow(merged), ...bump(trx) });
		const after = (await getRoom(trx, id))!;
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'room',
			entityId: id,
			action: 'update',
			before,
			after,
		});
		return after;
	});
}

/** Deletes a room; circuits and loads stop listing it. */
export async function deleteRoom(knex: Knex, actor: Actor, id: string, version: number): Promise<void> {
	await inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'rooms', id, version, () => getRoom(trx, id), 'room');
		await trx('rooms').where({ id }).delete();
		await recordAudit(trx, {
			jobId: before.jobId,
			userId: actor.id,
			entity: 'room',
			entityId: id,
			action: 'delete',
			before,
			after: null,
		});
	});
}
