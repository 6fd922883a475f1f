import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { saveCircuitWithLoads } from '../../../../lib/repositories/circuit-save';
import { requireUser } from '../../../../lib/roles';
import { circuitSaveSchema } from '../../../../lib/schemas/circuit';

/** Saves the circuit and its loads (changed, added, deleted) in one transaction. */
export const PUT = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'circuit', params.id, 'write');
	const body = await parseBody(request, circuitSaveSchema);
	return json(await saveCircuitWithLoads(db(), user, params.id!, body));
});
