import { json, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { jobTreeOr404 } from '../../../../lib/documents/job-documents';
import { assertJobParam } from '../../../../lib/job-scope';
import { requireUser } from '../../../../lib/roles';
import { loadReadiness } from '../../../../lib/workflow/readiness';

/** The readiness check on the live job, for the firm that would submit it. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const { items, action, canSubmit } = await loadReadiness(db(), await jobTreeOr404(db(), ref.id));
	return json({ items, action, canSubmit });
});
