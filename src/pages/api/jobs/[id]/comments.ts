import { json, parseBody, route } from '../../../../lib/api';
import { assertJobAccess } from '../../../../lib/access';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { createComment, listComments } from '../../../../lib/repositories/review-comments';
import { requireUser } from '../../../../lib/roles';
import { reviewCommentSchema, THREAD_OPEN_STATUSES } from '../../../../lib/schemas/review-comment';
import { jobForReview, reviewSides } from '../../../../lib/workflow/review';

/** The job's review comments with their threads: for the firm, the jurisdiction's staff and administrators. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	if (reviewSides(user, job).length === 0 && !user.roles.includes('administrator')) {
		throw errors.forbidden('Review comments are between the contractor and the reviewer.');
	}
	return json({
		items: await listComments(db(), job.id),
		threadsOpen: THREAD_OPEN_STATUSES.includes(job.status),
	});
});

/** A reviewer's new comment on a submitted revision. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const { job } = await jobForReview(db(), user, params.id ?? '', true);
	const input = await parseBody(request, reviewCommentSchema);
	return json({ comment: await createComment(db(), user.id, job.id, input) }, 201);
});
