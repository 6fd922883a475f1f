import type { Knex } from 'knex';
import { assertJobAccess, type JobAccess } from './access';
import { AppError, errors } from './errors';
import { getSketch, type SketchRow } from './repositories/sketches';
import type { CurrentUser } from './roles';

/** Loads a sketch the user may reach through its job; 404 when it is missing or out of reach,
 * 403 when the user may look but not change. */
export async function assertSketchAccess(
	knex: Knex,
	user: CurrentUser,
	id: string,
	access: JobAccess,
): Promise<SketchRow> {
	const sketch = await getSketch(knex, id);
	if (!sketch) throw errors.notFound('sketch');
	try {
		await assertJobAccess(knex, user, sketch.job_id, access);
	} catch (err) {
		if (err instanceof AppError && err.code === 'not_found') throw errors.notFound('sketch');
		throw err;
	}
	return sketch;
}
