import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { assertEntityAccess } from '../../../lib/job-scope';
import { deleteLoad, updateLoad } from '../../../lib/repositories/loads';
import { requireUser } from '../../../lib/roles';
import { deleteSchema } from '../../../lib/schemas/common';
import { loadPatchSchema } from '../../../lib/schemas/load';

export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'load', params.id, 'write');
	const patch = await parseBody(request, loadPatchSchema);
	return json({ load: await updateLoad(db(), user, params.id!, patch) });
});

export const DELETE = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'load', params.id, 'write');
	const { version } = await parseBody(request, deleteSchema);
	await deleteLoad(db(), user, params.id!, version);
	return json({ deleted: true });
});
