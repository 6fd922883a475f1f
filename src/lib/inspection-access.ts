import type { Knex } from 'knex';
import { assertJobAccess, inspectsJob, jobPermits, type JobRef } from './access';
import { AppError, errors } from './errors';
import { getInspectionPhoto, inspectionItemJobId, inspectionJobId } from './repositories/inspections';
import type { CurrentUser } from './roles';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const WHAT = { inspection: 'inspection', item: 'correction item', photo: 'inspection photo' } as const;

/** Who may act: any reader of the job, only the job's firm, or only an inspector of its jurisdiction. */
export type InspectionSide = 'read' | 'contractor' | 'inspector';

/** Throws 403 unless the user is on the side that makes the move (readers of the job get here; others got 404). */
export function assertInspectionSide(user: CurrentUser, job: JobRef, side: InspectionSide): void {
	if (side === 'contractor' && !jobPermits(user, job, 'write'))
		throw errors.forbidden('Only the contractor’s firm requests inspections and answers correction items.');
	if (side === 'inspector' && !inspectsJob(user, job))
		throw errors.forbidden('Only an inspector of the job’s jurisdiction schedules and records inspections.');
}

/**
 * The job of an inspection, correction item or inspection photo, after checking the user reaches
 * it: 404 for an unknown id or a job out of reach (ids reveal nothing), 403 for a reader on the wrong side.
 */
export async function assertInspectionAccess(
	knex: Knex,
	user: CurrentUser,
	entity: keyof typeof WHAT,
	id: string | undefined,
	side: InspectionSide,
): Promise<JobRef> {
	if (!id || !UUID.test(id)) throw errors.notFound(WHAT[entity]);
	const jobId =
		entity === 'inspection'
			? await inspectionJobId(knex, id)
			: entity === 'item'
				? await inspectionItemJobId(knex, id)
				: ((await getInspectionPhoto(knex, id))?.job_id ?? null);
	if (!jobId) throw errors.notFound(WHAT[entity]);
	let job: JobRef;
	try {
		job = await assertJobAccess(knex, user, jobId, 'read');
	} catch (err) {
		if (err instanceof AppError && err.code === 'not_found') throw errors.notFound(WHAT[entity]);
		throw err;
	}
	assertInspectionSide(user, job, side);
	return job;
}
