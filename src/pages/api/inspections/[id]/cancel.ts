import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertInspectionAccess } from '../../../../lib/inspection-access';
import { cancelInspection, getInspectionRecord } from '../../../../lib/repositories/inspections';
import { requireUser } from '../../../../lib/roles';

/** The firm cancels its request (requested or scheduled, no result yet). */
export const POST = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'inspection', params.id, 'contractor');
	await db().transaction((trx) => cancelInspection(trx, user, params.id!));
	return json({ inspection: await getInspectionRecord(db(), params.id!) });
});
