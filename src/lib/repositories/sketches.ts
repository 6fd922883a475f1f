import type { Knex } from 'knex';
import { type AppError, errors } from '../errors';
import type { SketchUpdate } from '../schemas/sketch';
import { MAX_SKETCHES_PER_JOB, type SketchContentType } from '../sketch-storage';
import { recordAudit } from './audit';

export interface SketchRow {
	id: string;
	job_id: string;
	room_id: string | null;
	caption: string;
	original_name: string;
	stored_name: string;
	content_type: SketchContentType;
	size_bytes: number;
	sha256: string;
	width: number | null;
	height: number | null;
	page_count: number | null;
	has_thumbnail: boolean;
	uploaded_by: string | null;
	created_at: Date;
	updated_at: Date;
	version: number;
}

/** What a new sketch's row holds before the database gives it an id. */
export type NewSketch = Omit<
	SketchRow,
	'id' | 'job_id' | 'created_at' | 'updated_at' | 'version' | 'uploaded_by'
>;

/** A sketch as the API shows it. */
export function toSketch(row: SketchRow) {
	return {
		id: row.id,
		jobId: row.job_id,
		roomId: row.room_id,
		caption: row.caption,
		originalName: row.original_name,
		contentType: row.content_type,
		size: row.size_bytes,
		sha256: row.sha256,
		width: row.width,
		height: row.height,
		pageCount: row.page_count,
		hasThumbnail: row.has_thumbnail,
		uploadedBy: row.uploaded_by,
		createdAt: row.created_at,
		version: row.version,
		urls: {
			file: `/api/sketches/${row.id}/file`,
			thumbnail: row.has_thumbnail ? `/api/sketches/${row.id}/thumbnail` : null,
		},
	};
}
export type Sketch = ReturnType<typeof toSketch>;

function auditView(row: SketchRow) {
	const { urls: _urls, ...rest } = toSketch(row);
	return rest;
}

function audit(
	trx: Knex,
	row: SketchRow,
	userId: string,
	action: 'create' | 'update' | 'delete',
	before: SketchRow | null,
	after: SketchRow | null,
): Promise<void> {
	return recordAudit(trx, {
		jobId: row.job_id,
		userId,
		entity: 'sketch',
		entityId: row.id,
		action,
		before: before ? auditView(before) : null,
		after: after ? auditView(after) : null,
	});
}

/** A job's sketches in upload order. */
export async function listSketches(knex: Knex, jobId: string): Promise<SketchRow[]> {
	return knex<SketchRow>('sketches').where({ job_id: jobId }).orderBy('seq');
}

/** One sketch by id, or undefined (a malformed id is simply not found). */
export async function getSketch(knex: Knex, id: string): Promise<SketchRow | undefined> {
	if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) return undefined;
	return knex<SketchRow>('sketches').where({ id }).first();
}

/** Throws a 400 on roomId unless the room belongs to the job (no room is fine). */
export async function assertRoomOfJob(
	knex: Knex,
	roomId: string | null | undefined,
	jobId: string,
): Promise<void> {
	if (!roomId) return;
	const room = await knex('rooms').where({ id: roomId, job_id: jobId }).first('id');
	if (!room) {
		throw errors.invalid('That room is not part of this job.', {
			roomId: ['Choose one of this job’s rooms (or none).'],
		});
	}
}

/** How many sketches a job may still take. */
export async function sketchRoomLeft(knex: Knex, jobId: string): Promise<number> {
	const [{ count }] = (await knex('sketches').where({ job_id: jobId }).count('* as count')) as [
		{ count: string },
	];
	return MAX_SKETCHES_PER_JOB - Number(count);
}

/**
 * Records a set of uploaded sketches in one transaction, with an audit row each. The job row is
 * locked so that two uploads at once cannot pass the per-job limit together.
 */
export async function insertSketches(
	trx: Knex.Transaction,
	jobId: string,
	userId: string,
	sketches: NewSketch[],
): Promise<SketchRow[]> {
	await trx('jobs').where({ id: jobId }).forUpdate().first('id');
	const left = await sketchRoomLeft(trx, jobId);
	if (sketches.length > left) throw jobFull(left);
	await assertRoomOfJob(trx, sketches[0]?.room_id, jobId);
	const rows = (await trx('sketches')
		.insert(sketches.map((s) => ({ ...s, job_id: jobId, uploaded_by: userId })))
		.returning('*')) as SketchRow[];
	for (const row of rows) await audit(trx, row, userId, 'create', null, row);
	return rows;
}

/** The refusal when a job has no room for more sketches. */
export function jobFull(left: number): AppError {
	return errors.invalid(
		left <= 0
			? `This job already has ${MAX_SKETCHES_PER_JOB} sketches, the most a job can hold. Delete some before adding more.`
			: `This job can take only ${left} more sketch${left === 1 ? '' : 'es'} (at most ${MAX_SKETCHES_PER_JOB} a job).`,
	);
}

/** Changes a sketch's caption or room if nobody changed it since `version`; 409 with the current sketch otherwise. */
export async function updateSketch(
	knex: Knex,
	id: string,
	input: SketchUpdate,
	userId: string,
): Promise<SketchRow> {
	return knex.transaction(async (trx) => {
		const before = await trx<SketchRow>('sketches').where({ id }).forUpdate().first();
		if (!before) throw errors.notFound('sketch');
		if (before.version !== input.version) {
			throw errors.conflict(
				'Someone changed this sketch after you opened it. Look at the current version and try again.',
				toSketch(before),
			);
		}
		await assertRoomOfJob(trx, input.roomId, before.job_id);
		const changes: Partial<SketchRow> = {};
		if (input.caption !== undefined) changes.caption = input.caption;
		if (input.roomId !== undefined) changes.room_id = input.roomId;
		const [after] = (await trx('sketches')
			.where({ id })
			.update({ ...changes, version: before.version + 1, updated_at: trx.fn.now() })
			.returning('*')) as SketchRow[];
		await audit(trx, after!, userId, 'update', before, after!);
		return after!;
	});
}

/** Deletes a sketch's row (with its audit row) and returns it, so the caller can remove its files. */
export async function deleteSketch(knex: Knex, id: string, userId: string): Promise<SketchRow> {
	return knex.transaction(async (trx) => {
		const [row] = (await trx('sketches').where({ id }).delete().returning('*')) as SketchRow[];
		if (!row) throw errors.notFound('sketch');
		await audit(trx, row, userId, 'delete', row, null);
		return row;
	});
}
