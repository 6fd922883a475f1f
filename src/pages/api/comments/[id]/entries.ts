import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { addCommentEntry, commentJobId } from '../../../../lib/repositories/review-comments';
import { requireUser } from '../../../../lib/roles';
import { commentEntrySchema } from '../../../../lib/schemas/review-comment';
import { jobForReview } from '../../../../lib/workflow/review';

/** An entry in a comment's thread: an answer, "addressed" (contractor), "resolved" or "reopened" (reviewer). */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const jobId = await commentJobId(db(), params.id ?? '');
	if (!jobId) throw errors.notFound('comment');
	const { sides } = await jobForReview(db(), user, jobId, false);
	const input = await parseBody(request, commentEntrySchema);
	return json({ comment: await addCommentEntry(db(), user.id, sides, params.id!, input) }, 201);
});
