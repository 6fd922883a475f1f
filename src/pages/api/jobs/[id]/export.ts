import { route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { jobDocumentFromRows } from '../../../../lib/job-document';
import { assertJobParam } from '../../../../lib/job-scope';
import { loadJobTree } from '../../../../lib/repositories/jobs';
import { requireUser } from '../../../../lib/roles';

/** The job as a job document (engine format), as a download. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const tree = await loadJobTree(db(), ref.id);
	if (!tree) throw errors.notFound('job');
	const slug =
		tree.job.name
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-|-$/g, '') || 'job';
	return new Response(JSON.stringify(jobDocumentFromRows(tree), null, 2), {
		headers: {
			'content-type': 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="${slug}.ampledger.json"`,
		},
	});
});
