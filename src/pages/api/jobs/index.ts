import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { createJob, listJobs } from '../../../lib/repositories/jobs';
import { requireRole, requireUser } from '../../../lib/roles';
import { jobCreateSchema, jobListQuerySchema } from '../../../lib/schemas/job';

/** The jobs the user reaches, searched, filtered, sorted and a page at a time. */
export const GET = route(async ({ url, locals }) => {
	const user = requireUser(locals.user);
	const query = jobListQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) throw errors.validation(query.error);
	return json(await listJobs(db(), user, query.data));
});

/** Creates a job for one of the contractor's firms. */
export const POST = route(async ({ request, locals }) => {
	const user = requireRole(locals.user, 'contractor');
	const { firmId, ...input } = await parseBody(request, jobCreateSchema);
	const firm = firmId ?? (user.firms.length === 1 ? user.firms[0]!.id : undefined);
	if (!firm)
		throw errors.invalid('Choose the firm the job is for.', { firmId: ['choose one of your firms'] });
	if (!user.firms.some((f) => f.id === firm))
		throw errors.forbidden('You can only create jobs for your own firm.');
	return json({ job: await createJob(db(), user, firm, input) }, 201);
});
