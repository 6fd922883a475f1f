import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { moveCircuit } from '../../../../lib/repositories/circuits';
import { requireUser } from '../../../../lib/roles';
import { circuitMoveSchema } from '../../../../lib/schemas/circuit';

/** Moves the breaker to another position of its panel. */
export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'circuit', params.id, 'write');
	const { position, version } = await parseBody(request, circuitMoveSchema);
	return json({ circuit: await moveCircuit(db(), user, params.id!, position, version) });
});
