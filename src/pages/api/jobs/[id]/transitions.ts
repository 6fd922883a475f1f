import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { assertJobParam } from '../../../../lib/job-scope';
import { requireUser } from '../../../../lib/roles';
import { transitionSchema } from '../../../../lib/schemas/submission';
import { moveJob } from '../../../../lib/workflow/simple-moves';

/** The moves that need no other work: withdraw (contractor), start-review and close (inspector). */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const input = await parseBody(request, transitionSchema);
	const moved = await moveJob(db(), user, ref, input);
	if (!moved) throw errors.notFound('job');
	return json(moved);
});
