import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { assertJobParam } from '../../../../lib/job-scope';
import { listAudit } from '../../../../lib/repositories/audit';
import { requireUser } from '../../../../lib/roles';
import { jobListQuerySchema } from '../../../../lib/schemas/job';

const pageSchema = jobListQuerySchema.pick({ page: true, pageSize: true });

/** Who changed what in the job, newest first: for the firm's own people. */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const query = pageSchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) throw errors.validation(query.error);
	return json(await listAudit(db(), ref.id, query.data.page, query.data.pageSize));
});
