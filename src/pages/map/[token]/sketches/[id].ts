import { route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { jobIdForMapToken } from '../../../../lib/repositories/panel-map-tokens';
import { getSketch } from '../../../../lib/repositories/sketches';
import { sketchFileResponse } from '../../../../lib/sketch-download';

/** A sketch of the job a live panel map link opens (`?which=thumbnail|file`). */
export const GET = route(async ({ params, url }) => {
	const jobId = await jobIdForMapToken(db(), params.token ?? '');
	const sketch = jobId ? await getSketch(db(), params.id ?? '') : undefined;
	if (!sketch || sketch.job_id !== jobId) throw errors.notFound('sketch');
	const which = url.searchParams.get('which') === 'file' ? 'file' : 'thumbnail';
	return sketchFileResponse(sketch, which);
});
