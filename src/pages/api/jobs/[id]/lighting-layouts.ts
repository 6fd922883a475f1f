import { json, parseBody, route } from '../../../../lib/api';
import { assertJobAccess } from '../../../../lib/access';
import { db } from '../../../../lib/db';
import { layoutRecessedLights } from '../../../../lib/electrical';
import { errors } from '../../../../lib/errors';
import { assertRoomsOfJob } from '../../../../lib/repositories/jobs';
import { createLightingLayout, listLightingLayouts } from '../../../../lib/repositories/lighting-layouts';
import { requireUser } from '../../../../lib/roles';
import { lightingLayoutInputSchema } from '../../../../lib/schemas/lighting-layout';

/** The job's lighting layouts that go into the permit packet. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'read');
	return json({ items: await listLightingLayouts(db(), job.id) });
});

/** Saves a layout for the packet; one the engine cannot lay out is a 400 saying why. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'write');
	const values = await parseBody(request, lightingLayoutInputSchema);
	if (values.roomId) await assertRoomsOfJob(db(), job.id, [values.roomId]);
	const laid = layoutRecessedLights(values.input);
	if (!laid.ok)
		throw errors.invalid(`The layout does not work out: ${laid.errors.join(' ')}`, { input: laid.errors });
	return json({ layout: await createLightingLayout(db(), job.id, user.id, values) }, 201);
});
