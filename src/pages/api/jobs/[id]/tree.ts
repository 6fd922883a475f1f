import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { engineOutcome, jobDocumentFromRows } from '../../../../lib/job-document';
import { assertJobParam } from '../../../../lib/job-scope';
import { loadJobTree } from '../../../../lib/repositories/jobs';
import { requireUser } from '../../../../lib/roles';

/** The job with everything in it and the engine's results (or what is missing before it can compute). */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const tree = await loadJobTree(db(), ref.id);
	if (!tree) throw errors.notFound('job');
	return json({ ...tree, engine: engineOutcome(jobDocumentFromRows(tree)) });
});
