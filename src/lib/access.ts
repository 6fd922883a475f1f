import type { Knex } from 'knex';
import { errors } from './errors';
import type { CurrentUser } from './roles';
import type { JobStatus } from './workflow/status';

export type JobAccess = 'read' | 'write';

export interface JobRef {
	id: string;
	firm_id: string;
	property_id: string | null;
	jurisdiction_id: string | null;
	current_revision: number;
	status: JobStatus;
}

/** Whether the user is an inspector of the jurisdiction the job was submitted to (at least once). */
export function inspectsJob(user: CurrentUser, job: JobRef): boolean {
	return (
		job.current_revision > 0 &&
		job.jurisdiction_id !== null &&
		user.jurisdictions.some((j) => j.id === job.jurisdiction_id)
	);
}

/**
 * Whether a user may read or change a job: the job's firm's contractors read and write; the
 * homeowner of the job's property reads; administrators read; inspectors read what was submitted
 * to their jurisdiction (the review and inspection moves have their own rules, src/lib/workflow).
 */
export function jobPermits(user: CurrentUser, job: JobRef, access: JobAccess): boolean {
	const firmMember = user.firms.some((f) => f.id === job.firm_id);
	if (access === 'write') return firmMember;
	return (
		firmMember ||
		(job.property_id !== null && user.propertyIds.includes(job.property_id)) ||
		user.roles.includes('administrator') ||
		inspectsJob(user, job)
	);
}

/** Loads a job's ownership row and throws 404 when it is missing or the user may not reach it
 * (404 rather than 403, so that other firms' job ids reveal nothing), 403 when they may read but not write. */
export async function assertJobAccess(
	knex: Knex,
	user: CurrentUser,
	jobId: string,
	access: JobAccess,
): Promise<JobRef> {
	const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
	if (!uuid.test(jobId)) throw errors.notFound('job');
	const job = await knex<JobRef>('jobs')
		.where({ id: jobId })
		.whereNull('deleted_at')
		.first('id', 'firm_id', 'property_id', 'jurisdiction_id', 'current_revision', 'status');
	if (!job || !jobPermits(user, job, 'read')) throw errors.notFound('job');
	if (access === 'write' && !jobPermits(user, job, 'write')) {
		throw errors.forbidden('You can read this job but not change it.');
	}
	return job;
}
