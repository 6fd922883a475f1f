import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertJobParam } from '../../../../lib/job-scope';
import { requireUser } from '../../../../lib/roles';
import { submissionSchema } from '../../../../lib/schemas/submission';
import { submitJob } from '../../../../lib/workflow/submission';

/** Submits the job for plan review (or resubmits it after corrections) as its next revision. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const input = await parseBody(request, submissionSchema);
	return json(await submitJob(db(), user, ref, input), 201);
});
