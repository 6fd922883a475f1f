import { route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { requireUser } from '../../../../lib/roles';
import { assertSketchAccess } from '../../../../lib/sketch-access';
import { sketchFileResponse } from '../../../../lib/sketch-download';

/** The sketch's thumbnail (PNG), to anyone who may read its job. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const sketch = await assertSketchAccess(db(), user, params.id ?? '', 'read');
	return sketchFileResponse(sketch, 'thumbnail');
});
