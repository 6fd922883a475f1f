import { z } from 'zod';
import { inspectsJob } from '../../../../../../lib/access';
import { json, route } from '../../../../../../lib/api';
import { db } from '../../../../../../lib/db';
import { errors } from '../../../../../../lib/errors';
import { assertJobParam } from '../../../../../../lib/job-scope';
import { commentsForDiff, revisionSnapshot } from '../../../../../../lib/repositories/revision-changes';
import { requireUser } from '../../../../../../lib/roles';
import { diffRevisions } from '../../../../../../lib/workflow/revision-diff';

const revisionNumber = z.coerce.number().int().min(1).max(100_000);

/**
 * What changed in revision n since revision n-1, with the review comments each change answers:
 * for the firm, the inspectors of the job's jurisdiction and administrators (others get 404).
 */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobParam(db(), user, params.id, 'read');
	const reader =
		user.firms.some((f) => f.id === job.firm_id) ||
		inspectsJob(user, job) ||
		user.roles.includes('administrator');
	if (!reader) throw errors.notFound('job');
	const n = revisionNumber.safeParse(params.n);
	if (!n.success) throw errors.notFound('revision');
	const after = await revisionSnapshot(db(), job.id, n.data);
	if (!after) throw errors.notFound('revision');
	const before = n.data > 1 ? await revisionSnapshot(db(), job.id, n.data - 1) : null;
	const comments = before ? await commentsForDiff(db(), job, before.number) : [];
	return json(diffRevisions(before, after, comments));
});
