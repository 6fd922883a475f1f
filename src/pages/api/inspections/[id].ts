import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { assertInspectionAccess } from '../../../lib/inspection-access';
import { getInspectionRecord, scheduleInspection } from '../../../lib/repositories/inspections';
import { requireUser } from '../../../lib/roles';
import { inspectionScheduleSchema } from '../../../lib/schemas/inspection';

/** One inspection with its items and photos, to anyone who may read its job. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'inspection', params.id, 'read');
	return json({ inspection: await getInspectionRecord(db(), params.id!) });
});

/** The inspector of the jurisdiction sets (or moves) the date of the visit. */
export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'inspection', params.id, 'inspector');
	const input = await parseBody(request, inspectionScheduleSchema);
	await db().transaction((trx) => scheduleInspection(trx, user, params.id!, input));
	return json({ inspection: await getInspectionRecord(db(), params.id!) });
});
