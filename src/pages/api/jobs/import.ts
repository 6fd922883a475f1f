import { json, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { importJob } from '../../../lib/repositories/job-import';
import { requireRole } from '../../../lib/roles';

/** Creates a job from a job document (engine format), all records or none. */
export const POST = route(async ({ request, url, locals }) => {
	const user = requireRole(locals.user, 'contractor');
	const firm = url.searchParams.get('firmId') ?? (user.firms.length === 1 ? user.firms[0]!.id : undefined);
	if (!firm)
		throw errors.invalid('Choose the firm the job is for.', { firmId: ['choose one of your firms'] });
	if (!user.firms.some((f) => f.id === firm))
		throw errors.forbidden('You can only create jobs for your own firm.');
	let doc: unknown;
	try {
		doc = await request.json();
	} catch {
		throw errors.invalid('The job document must be JSON.');
	}
	return json(await importJob(db(), user, firm, doc), 201);
});
