import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { createLoad } from '../../../../lib/repositories/loads';
import { requireUser } from '../../../../lib/roles';
import { loadInputSchema } from '../../../../lib/schemas/load';

/** Adds a load to the circuit. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'circuit', params.id, 'write');
	const input = await parseBody(request, loadInputSchema);
	return json({ load: await createLoad(db(), user, params.id!, input) }, 201);
});
