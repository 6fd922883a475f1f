import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { createCircuitWithLoads } from '../../../../lib/repositories/circuit-save';
import { requireUser } from '../../../../lib/roles';
import { circuitWithLoadsInputSchema } from '../../../../lib/schemas/circuit';

/** Adds a breaker to the panel, with its loads when the body lists them, in one transaction. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'panel', params.id, 'write');
	const input = await parseBody(request, circuitWithLoadsInputSchema);
	return json(await createCircuitWithLoads(db(), user, params.id!, input), 201);
});
