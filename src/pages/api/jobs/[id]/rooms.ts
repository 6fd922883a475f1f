import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertJobParam } from '../../../../lib/job-scope';
import { createRoom, listRooms } from '../../../../lib/repositories/rooms';
import { requireUser } from '../../../../lib/roles';
import { roomInputSchema } from '../../../../lib/schemas/room';

export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	return json({ items: await listRooms(db(), ref.id) });
});

export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const input = await parseBody(request, roomInputSchema);
	return json({ room: await createRoom(db(), user, ref.id, input) }, 201);
});
