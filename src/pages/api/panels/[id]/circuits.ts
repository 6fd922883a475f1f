import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { createCircuit } from '../../../../lib/repositories/circuits';
import { requireUser } from '../../../../lib/roles';
import { circuitInputSchema } from '../../../../lib/schemas/circuit';

/** Adds a breaker to the panel. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'panel', params.id, 'write');
	const input = await parseBody(request, circuitInputSchema);
	return json({ circuit: await createCircuit(db(), user, params.id!, input) }, 201);
});
