import { json, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { listReviewQueue } from '../../../lib/repositories/review-queue';
import { requireRole } from '../../../lib/roles';
import { queueQuerySchema } from '../../../lib/schemas/review-comment';

/** The inspector's queue: jobs submitted to their jurisdictions, oldest submission first. */
export const GET = route(async ({ url, locals }) => {
	const user = requireRole(locals.user, 'inspector');
	const query = queueQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) throw errors.validation(query.error);
	return json(
		await listReviewQueue(
			db(),
			user.jurisdictions.map((j) => j.id),
			query.data,
		),
	);
});
