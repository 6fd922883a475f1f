import { json, route } from '../../../../lib/api';
import { assertJobAccess } from '../../../../lib/access';
import { db } from '../../../../lib/db';
import { listSketches, toSketch } from '../../../../lib/repositories/sketches';
import { requireUser } from '../../../../lib/roles';

// Uploads (POST) are handled by Express with multer: server/sketch-upload.ts.

/** A job's sketches, for anyone who may read the job. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	const rows = await listSketches(db(), job.id);
	return json({ sketches: rows.map(toSketch) });
});
