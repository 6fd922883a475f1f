import type { Knex } from 'knex';

/** One workflow move in a job's history: a status move, a submission, a comment or an inspection event. */
export interface TimelineEntry {
	id: string;
	at: string;
	entity: 'status' | 'revision' | 'comment' | 'inspection';
	action: string;
	user: { id: string; name: string } | null;
	before: unknown;
	after: unknown;
}

const WORKFLOW_ENTITIES = ['status', 'revision', 'comment', 'inspection'];

/** The job's workflow history from the audit trail, oldest first (at most the last 500 entries). */
export async function workflowTimeline(knex: Knex, jobId: string): Promise<TimelineEntry[]> {
	const rows = await knex('audit_log as a')
		.leftJoin('users as u', 'u.id', 'a.user_id')
		.where('a.job_id', jobId)
		.whereIn('a.entity', WORKFLOW_ENTITIES)
		.orderBy([
			{ column: 'a.at', order: 'desc' },
			{ column: 'a.id', order: 'desc' },
		])
		.limit(500)
		.select(
			'a.id',
			'a.at',
			'a.entity',
			'a.action',
			'a.user_id',
			'a.before',
			'a.after',
			'u.name as user_name',
		);
	return rows.reverse().map((r) => ({
		id: String(r.id),
		at: new Date(r.at).toISOString(),
		entity: r.entity,
		action: r.action,
		user: r.user_id ? { id: r.user_id, name: r.user_name ?? '' } : null,
		before: r.before,
		after: r.after,
	}));
}
