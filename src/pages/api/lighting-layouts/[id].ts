import { json, route } from '../../../lib/api';
import { assertJobAccess } from '../../../lib/access';
import { db } from '../../../lib/db';
import { AppError, errors } from '../../../lib/errors';
import { deleteLightingLayout, lightingLayoutJobId } from '../../../lib/repositories/lighting-layouts';
import { requireUser } from '../../../lib/roles';

/** Removes a lighting layout from the job's packet. */
export const DELETE = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const jobId = await lightingLayoutJobId(db(), params.id ?? '');
	if (!jobId) throw errors.notFound('lighting layout');
	try {
		await assertJobAccess(db(), user, jobId, 'write');
	} catch (err) {
		if (err instanceof AppError && err.code === 'not_found') throw errors.notFound('lighting layout');
		throw err;
	}
	await deleteLightingLayout(db(), params.id!);
	return json({ deleted: true });
});
