import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { requireUser } from '../../../../lib/roles';
import { assignToMe, jobForReview } from '../../../../lib/workflow/review';

/** "Assign to me": the reviewer takes the job; a job waiting in the queue moves to plan review. */
export const POST = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const { job } = await jobForReview(db(), user, params.id ?? '', true);
	return json(await assignToMe(db(), user, job.id));
});
