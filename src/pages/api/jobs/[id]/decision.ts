import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { requireUser } from '../../../../lib/roles';
import { reviewDecisionSchema } from '../../../../lib/schemas/review-comment';
import { decide, jobForReview } from '../../../../lib/workflow/review';

/** The reviewer's decision: approve (issues the permit number) or request corrections (lists the open comments). */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const { job } = await jobForReview(db(), user, params.id ?? '', true);
	const input = await parseBody(request, reviewDecisionSchema);
	return json(await decide(db(), user, job.id, input));
});
