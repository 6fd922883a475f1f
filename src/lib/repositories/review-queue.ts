import type { Knex } from 'knex';
import { QUEUE_STATUSES, type JobStatus } from '../workflow/status';

export interface QueueItem {
	jobId: string;
	name: string;
	address: string;
	firmName: string;
	jurisdictionId: string;
	jurisdictionName: string;
	status: JobStatus;
	revision: number;
	permitNumber: string;
	submittedAt: string;
	/** Whole days since the latest submission (not since the last edit). */
	daysWaiting: number;
	assignedInspectorId: string | null;
	assignedInspectorName: string | null;
}

export const QUEUE_PAGE_SIZE = 25;

/**
 * Jobs submitted to any of the given jurisdictions, oldest submission first, optionally of one
 * status. Only jobs with at least one revision appear: a draft was never sent to the reviewer.
 */
export async function listReviewQueue(
	knex: Knex,
	jurisdictionIds: string[],
	options: { status?: JobStatus; page: number },
): Promise<{ items: QueueItem[]; total: number; page: number; pageSize: number }> {
	if (jurisdictionIds.length === 0)
		return { items: [], total: 0, page: options.page, pageSize: QUEUE_PAGE_SIZE };
	const base = knex('jobs as j')
		.whereIn('j.jurisdiction_id', jurisdictionIds)
		.where('j.current_revision', '>', 0)
		.whereNotNull('j.submitted_at')
		.whereNull('j.deleted_at')
		.whereIn('j.status', options.status ? [options.status] : [...QUEUE_STATUSES]);
	const [{ count }] = (await base.clone().count({ count: '*' })) as [{ count: string }];
	const rows = await base
		.clone()
		.join('firms as f', 'f.id', 'j.firm_id')
		.join('jurisdictions as ju', 'ju.id', 'j.jurisdiction_id')
		.leftJoin('users as u', 'u.id', 'j.assigned_inspector_id')
		.orderBy([{ column: 'j.submitted_at' }, { column: 'j.id' }])
		.limit(QUEUE_PAGE_SIZE)
		.offset((options.page - 1) * QUEUE_PAGE_SIZE)
		.select(
			'j.id',
			'j.name',
			'j.address',
			'j.status',
			'j.current_revision',
			'j.permit_number',
			'j.submitted_at',
			'j.jurisdiction_id',
			'j.assigned_inspector_id',
			'f.name as firm_name',
			'ju.name as jurisdiction_name',
			'u.name as inspector_name',
			knex.raw(`floor(extract(epoch from (now() - j.submitted_at)) / 86400)::int as days_waiting`),
		);
	return {
		items: rows.map((r) => ({
			jobId: r.id,
			name: r.name,
			address: r.address,
			firmName: r.firm_name,
			jurisdictionId: r.jurisdiction_id,
			jurisdictionName: r.jurisdiction_name,
			status: r.status,
			revision: r.current_revision,
			permitNumber: r.permit_number,
			submittedAt: new Date(r.submitted_at).toISOString(),
			daysWaiting: Math.max(0, Number(r.days_waiting)),
			assignedInspectorId: r.assigned_inspector_id ?? null,
			assignedInspectorName: r.inspector_name ?? null,
		})),
		total: Number(count),
		page: options.page,
		pageSize: QUEUE_PAGE_SIZE,
	};
}

/** The job facts the review screen heads with (the live job's status and permit, the firm, the reviewer). */
export async function reviewJobHeader(knex: Knex, jobId: string) {
	const r = await knex('jobs as j')
		.join('firms as f', 'f.id', 'j.firm_id')
		.leftJoin('users as u', 'u.id', 'j.assigned_inspector_id')
		.where('j.id', jobId)
		.first(
			'j.id',
			'j.name',
			'j.address',
			'j.status',
			'j.permit_number',
			'j.current_revision',
			'j.assigned_inspector_id',
			'f.name as firm_name',
			'u.name as inspector_name',
		);
	if (!r) return null;
	return {
		id: r.id as string,
		name: r.name as string,
		address: r.address as string,
		firmName: r.firm_name as string,
		status: r.status as JobStatus,
		permitNumber: r.permit_number as string,
		currentRevision: r.current_revision as number,
		assignedInspectorId: (r.assigned_inspector_id as string | null) ?? null,
		assignedInspectorName: (r.inspector_name as string | null) ?? null,
	};
}
