import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { assertEntityAccess } from '../../../lib/job-scope';
import { deleteCircuit, updateCircuit } from '../../../lib/repositories/circuits';
import { requireUser } from '../../../lib/roles';
import { circuitPatchSchema } from '../../../lib/schemas/circuit';
import { deleteSchema } from '../../../lib/schemas/common';

export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'circuit', params.id, 'write');
	const patch = await parseBody(request, circuitPatchSchema);
	return json({ circuit: await updateCircuit(db(), user, params.id!, patch) });
});

/** Deletes the circuit and its loads. */
export const DELETE = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'circuit', params.id, 'write');
	const { version } = await parseBody(request, deleteSchema);
	const counts = await deleteCircuit(db(), user, params.id!, version);
	return json({ deleted: true, ...counts });
});
