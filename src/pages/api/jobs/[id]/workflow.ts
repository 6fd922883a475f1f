import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertJobParam } from '../../../../lib/job-scope';
import { requireUser } from '../../../../lib/roles';
import { workflowState } from '../../../../lib/workflow/simple-moves';

/** The job's place in the permit workflow: status, revision, permit number, this user's moves, and the history. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	return json(await workflowState(db(), user, ref));
});
