import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { assertJobParam } from '../../../lib/job-scope';
import { deleteJob, getJob, updateJob } from '../../../lib/repositories/jobs';
import { requireUser } from '../../../lib/roles';
import { deleteSchema } from '../../../lib/schemas/common';
import { jobPatchSchema } from '../../../lib/schemas/job';

export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const job = await getJob(db(), ref.id);
	if (!job) throw errors.notFound('job');
	return json({ job });
});

export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const patch = await parseBody(request, jobPatchSchema);
	return json({ job: await updateJob(db(), user, ref.id, patch) });
});

/** Soft-deletes the job. */
export const DELETE = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const { version } = await parseBody(request, deleteSchema);
	await deleteJob(db(), user, ref.id, version);
	return json({ deleted: true });
});
