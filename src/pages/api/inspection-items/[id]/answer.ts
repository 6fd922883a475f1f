import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertInspectionAccess } from '../../../../lib/inspection-access';
import { answerInspectionItem, getInspectionItem } from '../../../../lib/repositories/inspections';
import { requireUser } from '../../../../lib/roles';
import { inspectionItemAnswerSchema } from '../../../../lib/schemas/inspection';

/** The contractor answers a correction item of a failed inspection. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertInspectionAccess(db(), user, 'item', params.id, 'contractor');
	const input = await parseBody(request, inspectionItemAnswerSchema);
	await db().transaction((trx) => answerInspectionItem(trx, user, params.id!, input));
	return json({ item: await getInspectionItem(db(), params.id!) });
});
