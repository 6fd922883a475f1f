import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertInspectionAccess } from '../../../../lib/inspection-access';
import { getInspectionRecord, recordInspectionResult } from '../../../../lib/repositories/inspections';
import { requireUser } from '../../../../lib/roles';
import { inspectionResultSchema } from '../../../../lib/schemas/inspection';

/** The inspector records pass or fail (with correction items); the job moves in the same transaction. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'inspection', params.id, 'inspector');
	const input = await parseBody(request, inspectionResultSchema);
	await db().transaction((trx) => recordInspectionResult(trx, user, params.id!, input));
	return json({ inspection: await getInspectionRecord(db(), params.id!) });
});
