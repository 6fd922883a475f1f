import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { deleteSketch, toSketch, updateSketch } from '../../../lib/repositories/sketches';
import { requireUser } from '../../../lib/roles';
import { sketchUpdateSchema } from '../../../lib/schemas/sketch';
import { assertSketchAccess } from '../../../lib/sketch-access';
import { removeSketchFiles } from '../../../lib/sketch-storage';

/** One sketch's record. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const sketch = await assertSketchAccess(db(), user, params.id ?? '', 'read');
	return json({ sketch: toSketch(sketch) });
});

/** Changes a sketch's caption or room; 409 when someone changed it since `version`. */
export const PATCH = route(async ({ params, locals, request }) => {
	const user = requireUser(locals.user);
	const sketch = await assertSketchAccess(db(), user, params.id ?? '', 'write');
	const input = await parseBody(request, sketchUpdateSchema);
	const updated = await updateSketch(db(), sketch.id, input, user.id);
	return json({ sketch: toSketch(updated) });
});

/** Deletes a sketch's record, then its file and thumbnail. */
export const DELETE = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const sketch = await assertSketchAccess(db(), user, params.id ?? '', 'write');
	const deleted = await deleteSketch(db(), sketch.id, user.id);
	await removeSketchFiles(deleted).catch((err) =>
		console.error('[ampledger] sketch files not removed', deleted.id, err),
	);
	return new Response(null, { status: 204 });
});
