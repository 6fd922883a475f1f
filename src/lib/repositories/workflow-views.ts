import type { Knex } from 'knex';
import { JOB_STATUSES, type JobStatus } from '../workflow/status';

/** A job's permit as a homeowner sees it: where it stands and the permit number. */
export interface PermitSummary {
	jobId: string;
	name: string;
	firmName: string;
	status: JobStatus;
	permitNumber: string;
	currentRevision: number;
	submittedAt: string | null;
}

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);

/** Every job at a property with its permit status and permit number (newest job first). */
export async function permitsAtProperty(knex: Knex, propertyId: string): Promise<PermitSummary[]> {
	const rows = await knex('jobs as j')
		.join('firms as f', 'f.id', 'j.firm_id')
		.where({ 'j.property_id': propertyId })
		.whereNull('j.deleted_at')
		.orderBy([{ column: 'j.updated_at', order: 'desc' }, { column: 'j.id' }])
		.limit(200)
		.select(
			'j.id',
			'j.name',
			'j.status',
			'j.permit_number',
			'j.current_revision',
			'j.submitted_at',
			'f.name as firm_name',
		);
	return rows.map((r) => ({
		jobId: r.id,
		name: r.name,
		firmName: r.firm_name,
		status: r.status,
		permitNumber: r.permit_number ?? '',
		currentRevision: Number(r.current_revision),
		submittedAt: iso(r.submitted_at),
	}));
}

/** One row of the administrator's list of every job. */
export interface AdminJobRow {
	id: string;
	name: string;
	address: string;
	firmName: string;
	jurisdictionName: string | null;
	status: JobStatus;
	currentRevision: number;
	permitNumber: string;
	submittedAt: string | null;
	updatedAt: string;
}

export const ADMIN_PAGE_SIZE = 50;

/** Every job on the installation (deleted ones left out), newest change first, optionally of one status; paged. */
export async function listAllJobs(
	knex: Knex,
	query: { status?: JobStatus | null; page?: number },
): Promise<{ items: AdminJobRow[]; total: number; page: number; pageSize: number }> {
	const page = Math.max(1, Math.min(10_000, Math.floor(query.page ?? 1)));
	const status =
		query.status && (JOB_STATUSES as readonly string[]).includes(query.status) ? query.status : null;
	const base = () => {
		const q = knex('jobs as j').whereNull('j.deleted_at');
		if (status) q.where('j.status', status);
		return q;
	};
	const [{ count }] = (await base().count({ count: '*' })) as [{ count: string }];
	const rows = await base()
		.join('firms as f', 'f.id', 'j.firm_id')
		.leftJoin('jurisdictions as g', 'g.id', 'j.jurisdiction_id')
		.orderBy([{ column: 'j.updated_at', order: 'desc' }, { column: 'j.id' }])
		.limit(ADMIN_PAGE_SIZE)
		.offset((page - 1) * ADMIN_PAGE_SIZE)
		.select(
			'j.id',
			'j.name',
			'j.address',
			'j.status',
			'j.current_revision',
			'j.permit_number',
			'j.submitted_at',
			'j.updated_at',
			'f.name as firm_name',
			'g.name as jurisdiction_name',
		);
	return {
		items: rows.map((r) => ({
			id: r.id,
			name: r.name,
			address: r.address,
			firmName: r.firm_name,
			jurisdictionName: r.jurisdiction_name ?? null,
			status: r.status,
			currentRevision: Number(r.current_revision),
			permitNumber: r.permit_number ?? '',
			submittedAt: iso(r.submitted_at),
			updatedAt: iso(r.updated_at)!,
		})),
		total: Number(count),
		page,
		pageSize: ADMIN_PAGE_SIZE,
	};
}

/** A stored revision as listed beside the job (the bytes stay in the database). */
export interface RevisionListing {
	number: number;
	submittedAt: string;
	submittedBy: string | null;
	packetPages: number;
	packetSha256: string;
	note: string;
}

/** A job's submitted revisions, newest first. */
export async function revisionListing(knex: Knex, jobId: string): Promise<RevisionListing[]> {
	const rows = await knex('job_revisions as r')
		.leftJoin('users as u', 'u.id', 'r.submitted_by')
		.where('r.job_id', jobId)
		.orderBy('r.number', 'desc')
		.limit(500)
		.select(
			'r.number',
			'r.submitted_at',
			'u.name as submitted_by',
			'r.packet_pages',
			'r.packet_sha256',
			'r.note',
		);
	return rows.map((r) => ({
		number: Number(r.number),
		submittedAt: iso(r.submitted_at)!,
		submittedBy: r.submitted_by ?? null,
		packetPages: Number(r.packet_pages),
		packetSha256: r.packet_sha256,
		note: r.note,
	}));
}

/** Names the job page shows beside the job's own record: its firm and the inspector who took the review. */
export async function jobPeopleNames(
	knex: Knex,
	job: { firmId: string; assignedInspectorId: string | null },
): Promise<{ firmName: string; inspectorName: string | null }> {
	const [firm, inspector] = await Promise.all([
		knex('firms').where({ id: job.firmId }).first('name'),
		job.assignedInspectorId ? knex('users').where({ id: job.assignedInspectorId }).first('name') : null,
	]);
	return { firmName: firm?.name ?? '', inspectorName: inspector?.name ?? null };
}
