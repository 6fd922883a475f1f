import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { assertEntityAccess } from '../../../lib/job-scope';
import { deleteRoom, updateRoom } from '../../../lib/repositories/rooms';
import { requireUser } from '../../../lib/roles';
import { deleteSchema } from '../../../lib/schemas/common';
import { roomPatchSchema } from '../../../lib/schemas/room';

export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'room', params.id, 'write');
	const patch = await parseBody(request, roomPatchSchema);
	return json({ room: await updateRoom(db(), user, params.id!, patch) });
});

export const DELETE = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'room', params.id, 'write');
	const { version } = await parseBody(request, deleteSchema);
	await deleteRoom(db(), user, params.id!, version);
	return json({ deleted: true });
});
