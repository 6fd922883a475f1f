import type { Knex } from 'knex';
import { errors } from '../errors';
import type { JobTree } from '../job-document';
import type { CurrentUser } from '../roles';
import type { JobCreate, JobListQuery, JobPatch } from '../schemas/job';
import { recordAudit } from './audit';
import { ruleOptionsForJurisdiction } from './jurisdictions';
import {
	circuitFromRow,
	JOB_COLUMNS,
	JOB_FIELD_COLUMNS,
	jobFromRow,
	loadFromRow,
	panelFromRow,
	roomFromRow,
	type JobRecord,
} from './rows';
import { bump, inTransaction, lockVersion, type Actor } from './versioned';

function jobQuery(knex: Knex) {
	return knex('jobs')
		.leftJoin('jurisdictions', 'jurisdictions.id', 'jobs.jurisdiction_id')
		.whereNull('jobs.deleted_at')
		.select(...JOB_COLUMNS);
}

/** A job that is not deleted, or null. */
export async function getJob(knex: Knex, id: string): Promise<JobRecord | null> {
	const row = await jobQuery(knex).where('jobs.id', id).first();
	return row ? jobFromRow(row) : null;
}

type Order = { column: string; order: 'asc' | 'desc' };
const SORTS: Record<JobListQuery['sort'], Order[]> = {
	updated: [{ column: 'jobs.updated_at', order: 'desc' }],
	created: [{ column: 'jobs.created_at', order: 'desc' }],
	name: [{ column: 'jobs.name', order: 'asc' }],
	status: [
		{ column: 'jobs.status', order: 'asc' },
		{ column: 'jobs.updated_at', order: 'desc' },
	],
};

/** The jobs a user reaches (their firms' jobs, their homes' jobs; every job for an administrator), a page at a time. */
export async function listJobs(
	knex: Knex,
	user: CurrentUser,
	query: JobListQuery,
): Promise<{ items: JobRecord[]; total: number; page: number; pageSize: number }> {
	const base = knex('jobs').whereNull('jobs.deleted_at');
	if (!user.roles.includes('administrator')) {
		const firmIds = user.firms.map((f) => f.id);
		base.where((w) => {
			w.whereIn('jobs.firm_id', firmIds).orWhereIn('jobs.property_id', user.propertyIds);
		});
	}
	if (query.status) base.where('jobs.status', query.status);
	if (query.q) {
		const like = `%${query.q.replace(/[\\%_]/g, (c) => '\\' + c)}%`;
		base.where((w) => {
			for (const col of ['jobs.name', 'jobs.address', 'jobs.homeowner_name', 'jobs.permit_number']) {
				w.orWhereILike(col, like);
			}
		});
	}
	const [{ count }] = (await base.clone().count({ count: '*' })) as [{ count: string }];
	const rows = await base
		.leftJoin('jurisdictions', 'jurisdictions.id', 'jobs.jurisdiction_id')
		.select(...JOB_COLUMNS)
		.orderBy([...SORTS[query.sort], { column: 'jobs.id', order: 'asc' }])
		.limit(query.pageSize)
		.offset((query.page - 1) * query.pageSize);
	return { items: rows.map(jobFromRow), total: Number(count), page: query.page, pageSize: query.pageSize };
}

/**
 * The property a job's address belongs to: the one with the same address (ignoring case and outer
 * spaces), or a new one. No address, no property.
 */
export async function propertyForAddress(
	trx: Knex.Transaction,
	address: string,
	jurisdictionId: string | null,
): Promise<string | null> {
	const clean = address.trim();
	if (!clean) return null;
	const found = await trx('properties')
		.whereRaw('lower(trim(address)) = lower(?)', [clean])
		.orderBy('created_at')
		.first('id');
	if (found) return found.id;
	const [created] = await trx('properties')
		.insert({ address: clean, jurisdiction_id: jurisdictionId })
		.returning('id');
	return created.id;
}

async function assertJurisdiction(knex: Knex, id: string | null | undefined): Promise<void> {
	if (!id) return;
	const found = await knex('jurisdictions').where({ id }).first('id');
	if (!found)
		throw errors.invalid('Some fields need attention.', { jurisdictionId: ['no such jurisdiction'] });
}

/** Creates a job for a firm (status draft, version 1), linked to the property at its address, with its audit row. */
export async function createJob(
	knex: Knex,
	actor: Actor,
	firmId: string,
	input: Omit<JobCreate, 'firmId'>,
): Promise<JobRecord> {
	await assertJurisdiction(knex, input.jurisdictionId);
	return inTransaction(knex, async (trx) => {
		const row: Record<string, unknown> = { firm_id: firmId, created_by: actor.id };
		for (const [field, column] of Object.entries(JOB_FIELD_COLUMNS)) {
			row[column] = input[field as keyof typeof JOB_FIELD_COLUMNS];
		}
		row.property_id = await propertyForAddress(trx, input.address, input.jurisdictionId);
		const [{ id }] = await trx('jobs').insert(row).returning('id');
		const job = (await getJob(trx, id))!;
		await recordAudit(trx, {
			jobId: id,
			userId: actor.id,
			entity: 'job',
			entityId: id,
			action: 'create',
			before: null,
			after: job,
		});
		return job;
	});
}

/** Changes a job's fields; a stale version is a 409 with the job as it is. A new address re-links the property. */
export async function updateJob(knex: Knex, actor: Actor, id: string, patch: JobPatch): Promise<JobRecord> {
	await assertJurisdiction(knex, patch.jurisdictionId);
	return inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'jobs', id, patch.version, () => getJob(trx, id), 'job');
		// Submitted revisions belong to the AHJ that received them: moving the job would hand them to another.
		if (
			patch.jurisdictionId !== undefined &&
			patch.jurisdictionId !== before.jurisdictionId &&
			before.currentRevision > 0
		) {
			throw errors.invalid('The jurisdiction cannot change once the job has been submitted.', {
				jurisdictionId: ['fixed since the first submission: its revisions went to this jurisdiction'],
			});
		}
		const changes: Record<string, unknown> = {};
		for (const [field, column] of Object.entries(JOB_FIELD_COLUMNS)) {
			const value = patch[field as keyof typeof JOB_FIELD_COLUMNS];
			if (value !== undefined) changes[column] = value;
		}
		if (
			patch.address !== undefined &&
			patch.address.trim().toLowerCase() !== before.address.trim().toLowerCase()
		) {
			changes.property_id = await propertyForAddress(
				trx,
				patch.address,
				patch.jurisdictionId !== undefined ? patch.jurisdictionId : before.jurisdictionId,
			);
		}
		await trx('jobs')
			.where({ id })
			.update({ ...changes, ...bump(trx) });
		const after = (await getJob(trx, id))!;
		await recordAudit(trx, {
			jobId: id,
			userId: actor.id,
			entity: 'job',
			entityId: id,
			action: 'update',
			before,
			after,
		});
		return after;
	});
}

/** Soft-deletes a job (it disappears from every route; its rows and audit trail stay). */
export async function deleteJob(knex: Knex, actor: Actor, id: string, version: number): Promise<void> {
	await inTransaction(knex, async (trx) => {
		const before = await lockVersion(trx, 'jobs', id, version, () => getJob(trx, id), 'job');
		await trx('jobs')
			.where({ id })
			.update({ deleted_at: trx.fn.now(), ...bump(trx) });
		await recordAudit(trx, {
			jobId: id,
			userId: actor.id,
			entity: 'job',
			entityId: id,
			action: 'delete',
			before,
			after: null,
		});
	});
}

/** Room ids of circuits or loads, keyed by owner, in the order they were given. */
async function roomLinks(knex: Knex, table: 'circuit_rooms' | 'load_rooms', column: string, ids: string[]) {
	const links = new Map<string, string[]>();
	if (ids.length === 0) return links;
	const rows = await knex(table)
		.whereIn(column, ids)
		.orderBy([column, 'ordinal', 'room_id'])
		.select(column, 'room_id');
	for (const r of rows) {
		const list = links.get(r[column]) ?? [];
		list.push(r.room_id);
		links.set(r[column], list);
	}
	return links;
}

/** A job with its rooms, panels, circuits (by panel and position) and loads, or null when it is missing or deleted. */
export async function loadJobTree(knex: Knex, jobId: string): Promise<JobTree | null> {
	const job = await getJob(knex, jobId);
	if (!job) return null;
	const [rooms, panels, circuitRows, loadRows] = await Promise.all([
		knex('rooms').where({ job_id: jobId }).orderBy('seq'),
		knex('panels').where({ job_id: jobId }).orderBy('seq'),
		knex('circuits as c')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('p.job_id', jobId)
			.orderBy([{ column: 'p.seq' }, { column: 'c.position' }])
			.select('c.*', 'p.job_id'),
		knex('loads as l')
			.join('circuits as c', 'c.id', 'l.circuit_id')
			.join('panels as p', 'p.id', 'c.panel_id')
			.where('p.job_id', jobId)
			.orderBy('l.seq')
			.select('l.*', 'p.job_id'),
	]);
	const [circuitRooms, loadRooms] = await Promise.all([
		roomLinks(
			knex,
			'circuit_rooms',
			'circuit_id',
			circuitRows.map((r) => r.id),
		),
		roomLinks(
			knex,
			'load_rooms',
			'load_id',
			loadRows.map((r) => r.id),
		),
	]);
	return {
		job,
		rooms: rooms.map(roomFromRow),
		panels: panels.map(panelFromRow),
		circuits: circuitRows.map((r) => circuitFromRow(r, circuitRooms.get(r.id) ?? [])),
		loads: loadRows.map((r) => loadFromRow(r, loadRooms.get(r.id) ?? [])),
		ruleOptions: await ruleOptionsForJurisdiction(knex, job.jurisdictionId),
	};
}

/** Replaces the room links of a circuit or load, keeping the given order. */
export async function setRoomLinks(
	trx: Knex.Transaction,
	table: 'circuit_rooms' | 'load_rooms',
	column: 'circuit_id' | 'load_id',
	ownerId: string,
	roomIds: readonly string[],
): Promise<void> {
	await trx(table)
		.where({ [column]: ownerId })
		.delete();
	if (roomIds.length) {
		await trx(table).insert(
			roomIds.map((roomId, ordinal) => ({ [column]: ownerId, room_id: roomId, ordinal })),
		);
	}
}

/** 400 naming each listed room id that is not a room of the job. */
export async function assertRoomsOfJob(knex: Knex, jobId: string, roomIds: readonly string[]): Promise<void> {
	if (roomIds.length === 0) return;
	const found = new Set(await knex('rooms').where({ job_id: jobId }).whereIn('id', roomIds).pluck('id'));
	const fields: Record<string, string[]> = {};
	roomIds.forEach((id, i) => {
		if (!found.has(id)) fields[`roomIds.${i}`] = ['no room of this job has this id'];
	});
	if (Object.keys(fields).length) throw errors.invalid('Some rooms are not rooms of this job.', fields);
}
