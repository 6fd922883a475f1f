import type { Knex } from 'knex';
import type { JobRef } from '../access';
import { errors } from '../errors';
import type { CurrentUser } from '../roles';
import type {
	InspectionItemAnswerInput,
	InspectionKind,
	InspectionRequestInput,
	InspectionResultInput,
	InspectionScheduleInput,
	InspectionStatus,
} from '../schemas/inspection';
import { requestBlock } from '../workflow/inspection-rules';
import type { JobStatus } from '../workflow/status';
import { applyTransition } from '../workflow/transitions';
import { recordAudit } from './audit';

export interface InspectionItemRecord {
	id: string;
	inspectionId: string;
	body: string;
	status: 'open' | 'answered';
	answer: string;
	answeredAt: string | null;
	answeredByName: string | null;
	version: number;
}

export interface InspectionPhotoRecord {
	id: string;
	inspectionId: string;
	caption: string;
	originalName: string;
	contentType: string;
	size: number;
	sha256: string;
	width: number;
	height: number;
	urls: { file: string; thumbnail: string | null };
}

export interface InspectionRecord {
	id: string;
	jobId: string;
	kind: InspectionKind;
	status: InspectionStatus;
	preferredDates: string[];
	requestNote: string;
	requestedAt: string;
	requestedByName: string | null;
	scheduledFor: string | null;
	inspectorName: string | null;
	resultNotes: string;
	recordedAt: string | null;
	recordedByName: string | null;
	version: number;
	items: InspectionItemRecord[];
	photos: InspectionPhotoRecord[];
}

/** The row of an inspection photo, from which the file paths are built. */
export interface InspectionPhotoRow {
	id: string;
	inspection_id: string;
	job_id: string;
	caption: string;
	original_name: string;
	stored_name: string;
	content_type: 'image/png' | 'image/jpeg';
	size_bytes: number;
	sha256: string;
	width: number;
	height: number;
	has_thumbnail: boolean;
}

export type NewInspectionPhoto = Omit<InspectionPhotoRow, 'id' | 'inspection_id' | 'job_id'>;

const iso = (v: unknown) => (v === null || v === undefined ? null : new Date(v as string).toISOString());
// A DATE column comes back as a local-midnight Date from pg; its calendar day is what was stored.
const day = (v: unknown): string | null => {
	if (v === null || v === undefined) return null;
	if (v instanceof Date) {
		const y = v.getFullYear();
		const m = String(v.getMonth() + 1).padStart(2, '0');
		const d = String(v.getDate()).padStart(2, '0');
		return `${y}-${m}-${d}`;
	}
	return String(v).slice(0, 10);
};

/** The API shape of a photo row. */
export function toInspectionPhoto(r: InspectionPhotoRow): InspectionPhotoRecord {
	return {
		id: r.id,
		inspectionId: r.inspection_id,
		caption: r.caption,
		originalName: r.original_name,
		contentType: r.content_type,
		size: r.size_bytes,
		sha256: r.sha256,
		width: r.width,
		height: r.height,
		urls: {
			file: `/api/inspection-photos/${r.id}/file`,
			thumbnail: r.has_thumbnail ? `/api/inspection-photos/${r.id}/thumbnail` : null,
		},
	};
}

/** A job's inspections, oldest first, each with its correction items and photos. */
export async function listInspections(knex: Knex, jobId: string): Promise<InspectionRecord[]> {
	const rows = await knex('inspections as i')
		.leftJoin('users as rq', 'rq.id', 'i.requested_by')
		.leftJoin('users as ins', 'ins.id', 'i.inspector_id')
		.leftJoin('users as rec', 'rec.id', 'i.recorded_by')
		.where('i.job_id', jobId)
		.orderBy('i.seq')
		.select(
			'i.*',
			'rq.name as requested_by_name',
			'ins.name as inspector_name',
			'rec.name as recorded_by_name',
		);
	const items = await knex('inspection_items as it')
		.leftJoin('users as u', 'u.id', 'it.answered_by')
		.where('it.job_id', jobId)
		.orderBy('it.seq')
		.select('it.*', 'u.name as answered_by_name');
	const photos = await knex<InspectionPhotoRow>('inspection_photos').where({ job_id: jobId }).orderBy('seq');
	return rows.map((r) => ({
		id: r.id,
		jobId: r.job_id,
		kind: r.kind,
		status: r.status,
		preferredDates: r.preferred_dates ?? [],
		requestNote: r.request_note,
		requestedAt: iso(r.requested_at)!,
		requestedByName: r.requested_by_name ?? null,
		scheduledFor: day(r.scheduled_for),
		inspectorName: r.inspector_name ?? null,
		resultNotes: r.result_notes,
		recordedAt: iso(r.recorded_at),
		recordedByName: r.recorded_by_name ?? null,
		version: r.version,
		items: items
			.filter((it) => it.inspection_id === r.id)
			.map((it) => ({
				id: it.id,
				inspectionId: it.inspection_id,
				body: it.body,
				status: it.status,
				answer: it.answer,
				answeredAt: iso(it.answered_at),
				answeredByName: it.answered_by_name ?? null,
				version: it.version,
			})),
		photos: photos.filter((p) => p.inspection_id === r.id).map(toInspectionPhoto),
	}));
}

/** One inspection of a job, as the API returns it. */
export async function getInspectionRecord(knex: Knex, id: string): Promise<InspectionRecord | null> {
	const row = await knex('inspections').where({ id }).first('job_id');
	if (!row) return null;
	return (await listInspections(knex, row.job_id)).find((i) => i.id === id) ?? null;
}

/** The job an inspection belongs to, or null. */
export async function inspectionJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await knex('inspections').where({ id }).first('job_id');
	return row?.job_id ?? null;
}

/** The job a correction item belongs to, or null. */
export async function inspectionItemJobId(knex: Knex, id: string): Promise<string | null> {
	const row = await knex('inspection_items').where({ id }).first('job_id');
	return row?.job_id ?? null;
}

/** What blocks a request of each kind now (null when it may be requested). */
export async function requestBlocks(
	knex: Knex,
	jobId: string,
	status: JobStatus,
): Promise<Record<InspectionKind, string | null>> {
	const open = (await knex('inspections')
		.where({ job_id: jobId })
		.whereIn('status', ['requested', 'scheduled'])
		.pluck('kind')) as InspectionKind[];
	const [{ count }] = (await knex('inspection_items')
		.where({ job_id: jobId, status: 'open' })
		.count({ count: '*' })) as [{ count: string }];
	return {
		'rough-in': requestBlock('rough-in', status, open, Number(count)),
		final: requestBlock('final', status, open, Number(count)),
	};
}

/**
 * Records the contractor's request for an inspection, with the job row locked so two requests
 * cannot both pass the checks: 409 when the job is not at the step, a request of the kind is open,
 * or correction items are unanswered.
 */
export async function requestInspection(
	trx: Knex.Transaction,
	user: CurrentUser,
	jobId: string,
	input: InspectionRequestInput,
): Promise<string> {
	const job = await trx<JobRef>('jobs').where({ id: jobId }).forUpdate().first('id', 'status');
	if (!job) throw errors.notFound('job');
	const block = (await requestBlocks(trx, jobId, job.status))[input.kind];
	if (block) throw errors.conflict(block, { status: job.status });
	let id: string;
	try {
		[{ id }] = await trx('inspections')
			.insert({
				job_id: jobId,
				kind: input.kind,
				preferred_dates: JSON.stringify([...input.preferredDates].sort()),
				request_note: input.note,
				requested_by: user.id,
			})
			.returning('id');
	} catch (err) {
		if ((err as { code?: string }).code === '23505')
			throw errors.conflict('This kind of inspection is already requested.', { status: job.status });
		throw err;
	}
	await recordAudit(trx, {
		jobId,
		userId: user.id,
		entity: 'inspection',
		entityId: id,
		action: 'create',
		before: null,
		after: { kind: input.kind, preferredDates: input.preferredDates, note: input.note },
	});
	return id;
}

async function lockInspection(trx: Knex.Transaction, id: string) {
	const row = await trx('inspections').where({ id }).forUpdate().first();
	if (!row) throw errors.notFound('inspection');
	return row as {
		id: string;
		job_id: string;
		kind: InspectionKind;
		status: InspectionStatus;
		scheduled_for: unknown;
	};
}

/** Sets (or moves) the date of a requested or scheduled inspection; the inspector becomes its inspector. */
export async function scheduleInspection(
	trx: Knex.Transaction,
	user: CurrentUser,
	id: string,
	input: InspectionScheduleInput,
): Promise<void> {
	const row = await lockInspection(trx, id);
	if (row.status !== 'requested' && row.status !== 'scheduled') {
		throw errors.conflict('This inspection already has its result; it cannot be scheduled again.', {
			status: row.status,
		});
	}
	await trx('inspections')
		.where({ id })
		.update({
			status: 'scheduled',
			scheduled_for: input.scheduledFor,
			inspector_id: user.id,
			version: trx.raw('version + 1'),
			updated_at: trx.fn.now(),
		});
	await recordAudit(trx, {
		jobId: row.job_id,
		userId: user.id,
		entity: 'inspection',
		entityId: id,
		action: 'schedule',
		before: { status: row.status, scheduledFor: day(row.scheduled_for) },
		after: { status: 'scheduled', scheduledFor: input.scheduledFor },
	});
}

/** The firm withdraws a request that has no result yet; the kind may then be requested again. */
export async function cancelInspection(trx: Knex.Transaction, user: CurrentUser, id: string): Promise<void> {
	const row = await lockInspection(trx, id);
	if (row.status !== 'requested' && row.status !== 'scheduled') {
		throw errors.conflict(
			row.status === 'cancelled'
				? 'This request is already cancelled.'
				: 'This inspection already has its result; it cannot be cancelled.',
			{ status: row.status },
		);
	}
	await trx('inspections')
		.where({ id })
		.update({ status: 'cancelled', version: trx.raw('version + 1'), updated_at: trx.fn.now() });
	await recordAudit(trx, {
		jobId: row.job_id,
		userId: user.id,
		entity: 'inspection',
		entityId: id,
		action: 'update',
		before: { status: row.status, scheduledFor: day(row.scheduled_for) },
		after: { status: 'cancelled' },
	});
}

/**
 * Records a scheduled inspection's result and moves the job (rough-in or final, passed or failed)
 * in the same transaction; a failed one opens its correction items.
 */
export async function recordInspectionResult(
	trx: Knex.Transaction,
	user: CurrentUser,
	id: string,
	input: InspectionResultInput,
): Promise<void> {
	// The job row first, as a request does, so that a result and a request never wait on each other.
	const jobId = await inspectionJobId(trx, id);
	if (!jobId) throw errors.notFound('inspection');
	await trx('jobs').where({ id: jobId }).forUpdate().first('id');
	const row = await lockInspection(trx, id);
	if (row.status !== 'scheduled') {
		throw errors.conflict(
			row.status === 'requested'
				? 'Schedule the inspection before recording its result.'
				: 'This inspection already has its result.',
			{ status: row.status },
		);
	}
	const action =
		row.kind === 'rough-in'
			? input.result === 'pass'
				? 'pass-rough-in'
				: 'fail-rough-in'
			: input.result === 'pass'
				? 'pass-final'
				: 'fail-final';
	await applyTransition(trx, user, row.job_id, action, { note: input.notes || undefined });
	await trx('inspections')
		.where({ id })
		.update({
			status: input.result === 'pass' ? 'passed' : 'failed',
			result_notes: input.notes,
			recorded_by: user.id,
			recorded_at: trx.fn.now(),
			inspector_id: user.id,
			version: trx.raw('version + 1'),
			updated_at: trx.fn.now(),
		});
	if (input.items.length) {
		await trx('inspection_items').insert(
			input.items.map((body) => ({ inspection_id: id, job_id: row.job_id, body })),
		);
	}
	await recordAudit(trx, {
		jobId: row.job_id,
		userId: user.id,
		entity: 'inspection',
		entityId: id,
		action: 'record',
		before: { status: row.status },
		after: { status: input.result === 'pass' ? 'passed' : 'failed', notes: input.notes, items: input.items },
	});
}

/** The contractor's answer to a correction item (it may be rewritten until the next inspection is requested). */
export async function answerInspectionItem(
	trx: Knex.Transaction,
	user: CurrentUser,
	itemId: string,
	input: InspectionItemAnswerInput,
): Promise<void> {
	const item = await trx('inspection_items').where({ id: itemId }).forUpdate().first();
	if (!item) throw errors.notFound('correction item');
	const failed = await trx('inspections').where({ id: item.inspection_id }).first('kind', 'seq');
	const later = await trx('inspections')
		.where({ job_id: item.job_id, kind: failed.kind })
		.where('seq', '>', failed.seq)
		.whereNot({ status: 'cancelled' })
		.first('id');
	if (later) {
		throw errors.conflict(
			'The next inspection is already requested; this answer is part of the record now.',
			{
				status: item.status,
			},
		);
	}
	await trx('inspection_items')
		.where({ id: itemId })
		.update({
			status: 'answered',
			answer: input.answer,
			answered_by: user.id,
			answered_at: trx.fn.now(),
			version: trx.raw('version + 1'),
		});
	await recordAudit(trx, {
		jobId: item.job_id,
		userId: user.id,
		entity: 'inspection',
		entityId: itemId,
		action: 'reply',
		before: { status: item.status, answer: item.answer },
		after: { status: 'answered', answer: input.answer },
	});
}

/** One correction item, as the API returns it. */
export async function getInspectionItem(knex: Knex, id: string): Promise<InspectionItemRecord | null> {
	const it = await knex('inspection_items as it')
		.leftJoin('users as u', 'u.id', 'it.answered_by')
		.where('it.id', id)
		.first('it.*', 'u.name as answered_by_name');
	if (!it) return null;
	return {
		id: it.id,
		inspectionId: it.inspection_id,
		body: it.body,
		status: it.status,
		answer: it.answer,
		answeredAt: iso(it.answered_at),
		answeredByName: it.answered_by_name ?? null,
		version: it.version,
	};
}

export const MAX_PHOTOS_PER_INSPECTION = 40;

/** How many more photos an inspection takes. */
export async function photoRoomLeft(knex: Knex, inspectionId: string): Promise<number> {
	const [{ count }] = (await knex('inspection_photos')
		.where({ inspection_id: inspectionId })
		.count({ count: '*' })) as [{ count: string }];
	return MAX_PHOTOS_PER_INSPECTION - Number(count);
}

/** The row of an inspection (for the photo upload's checks), or null. */
export async function inspectionRow(
	knex: Knex,
	id: string,
): Promise<{ id: string; job_id: string; status: InspectionStatus } | null> {
	return (await knex('inspections').where({ id }).first('id', 'job_id', 'status')) ?? null;
}

/** Inserts photo rows of one inspection and their audit entry, inside the caller's transaction. */
export async function insertInspectionPhotos(
	trx: Knex.Transaction,
	inspection: { id: string; job_id: string },
	userId: string,
	photos: NewInspectionPhoto[],
): Promise<InspectionPhotoRow[]> {
	const rows = await trx<InspectionPhotoRow>('inspection_photos')
		.insert(
			photos.map((p) => ({
				...p,
				inspection_id: inspection.id,
				job_id: inspection.job_id,
				uploaded_by: userId,
			})),
		)
		.returning('*');
	await recordAudit(trx, {
		jobId: inspection.job_id,
		userId,
		entity: 'inspection',
		entityId: inspection.id,
		action: 'create',
		before: null,
		after: { photos: rows.map((r) => ({ id: r.id, name: r.original_name, sha256: r.sha256 })) },
	});
	return rows;
}

/** One photo row, or null. */
export async function getInspectionPhoto(knex: Knex, id: string): Promise<InspectionPhotoRow | null> {
	return (await knex<InspectionPhotoRow>('inspection_photos').where({ id }).first()) ?? null;
}
