import type { Knex } from 'knex';

export type AuditEntity =
	'job' | 'room' | 'panel' | 'circuit' | 'load' | 'sketch' | 'status' | 'revision' | 'comment' | 'inspection';
export type AuditAction =
	| 'create'
	| 'update'
	| 'delete'
	| 'move'
	| 'import'
	| 'submit'
	| 'transition'
	| 'reply'
	| 'decide'
	| 'schedule'
	| 'record';

export interface AuditInput {
	jobId: string;
	userId: string | null;
	entity: AuditEntity;
	entityId: string;
	action: AuditAction;
	before: unknown;
	after: unknown;
}

export interface AuditEntry extends AuditInput {
	id: string;
	userName: string | null;
	at: string;
}

/** Writes one audit row (inside the caller's transaction) and marks the job as changed now. */
export async function recordAudit(trx: Knex, e: AuditInput): Promise<void> {
	await trx('audit_log').insert({
		job_id: e.jobId,
		user_id: e.userId,
		entity: e.entity,
		entity_id: e.entityId,
		action: e.action,
		before: e.before === null || e.before === undefined ? null : JSON.stringify(e.before),
		after: e.after === null || e.after === undefined ? null : JSON.stringify(e.after),
	});
	await trx('jobs').where({ id: e.jobId }).update({ updated_at: trx.fn.now() });
}

/** A job's audit trail, newest first. */
export async function listAudit(
	knex: Knex,
	jobId: string,
	page: number,
	pageSize: number,
): Promise<{ items: AuditEntry[]; total: number; page: number; pageSize: number }> {
	const [{ count }] = (await knex('audit_log').where({ job_id: jobId }).count({ count: '*' })) as [
		{ count: string },
	];
	const rows = await knex('audit_log as a')
		.leftJoin('users as u', 'u.id', 'a.user_id')
		.where('a.job_id', jobId)
		.orderBy([
			{ column: 'a.at', order: 'desc' },
			{ column: 'a.id', order: 'desc' },
		])
		.limit(pageSize)
		.offset((page - 1) * pageSize)
		.select('a.*', 'u.name as user_name');
	return {
		items: rows.map((r) => ({
			id: String(r.id),
			jobId: r.job_id,
			userId: r.user_id,
			userName: r.user_name ?? null,
			entity: r.entity,
			entityId: r.entity_id,
			action: r.action,
			before: r.before,
			after: r.after,
			at: r.at instanceof Date ? r.at.toISOString() : String(r.at),
		})),
		total: Number(count),
		page,
		pageSize,
	};
}
