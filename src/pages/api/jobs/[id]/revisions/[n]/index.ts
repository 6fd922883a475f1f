import { json, route } from '../../../../../../lib/api';
import { db } from '../../../../../../lib/db';
import { errors } from '../../../../../../lib/errors';
import { assertJobParam } from '../../../../../../lib/job-scope';
import { getRevision } from '../../../../../../lib/repositories/revisions';
import { requireUser } from '../../../../../../lib/roles';
import { revisionNumberParam } from '../../../../../../lib/workflow/revision-param';

/** One submitted revision as it was sent: document, results, facts, explanations, note and sha256s. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const revision = await getRevision(db(), ref.id, revisionNumberParam(params.n));
	if (!revision) throw errors.notFound('revision');
	return json({ revision });
});
