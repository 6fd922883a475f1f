import { json, route } from '../../../../../lib/api';
import { db } from '../../../../../lib/db';
import { assertJobParam } from '../../../../../lib/job-scope';
import { listRevisions } from '../../../../../lib/repositories/revisions';
import { requireUser } from '../../../../../lib/roles';

/** The job's submitted revisions, first to latest: for everyone who reads the job. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	return json({ revisions: await listRevisions(db(), ref.id) });
});
