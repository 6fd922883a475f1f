import { inspectsJob, jobPermits } from '../../../../lib/access';
import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertInspectionSide } from '../../../../lib/inspection-access';
import { assertJobParam } from '../../../../lib/job-scope';
import {
	getInspectionRecord,
	listInspections,
	requestBlocks,
	requestInspection,
} from '../../../../lib/repositories/inspections';
import { requireUser } from '../../../../lib/roles';
import { inspectionRequestSchema } from '../../../../lib/schemas/inspection';

/** A job's inspections with their items and photos, what may be requested now, and which side the reader is on. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobParam(db(), user, params.id, 'read');
	const contractor = jobPermits(user, job, 'write');
	return json({
		jobStatus: job.status,
		inspections: await listInspections(db(), job.id),
		requestBlocks: await requestBlocks(db(), job.id, job.status),
		sides: { contractor, inspector: inspectsJob(user, job) },
	});
});

/** The contractor requests a rough-in or final inspection with one to three preferred dates. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobParam(db(), user, params.id, 'read');
	assertInspectionSide(user, job, 'contractor');
	const input = await parseBody(request, inspectionRequestSchema);
	const id = await db().transaction((trx) => requestInspection(trx, user, job.id, input));
	return json({ inspection: await getInspectionRecord(db(), id) }, 201);
});
