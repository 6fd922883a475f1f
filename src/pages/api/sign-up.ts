import { json, parseBody, route } from '../../lib/api';
import { db } from '../../lib/db';
import { createFirmWithOwner } from '../../lib/repositories/accounts';
import { signUpSchema } from '../../lib/schemas/account';

/** Registers a new contractor firm and its owner. */
export const POST = route(async ({ request }) => {
	const input = await parseBody(request, signUpSchema);
	const created = await createFirmWithOwner(db(), input);
	return json({ firmId: created.firmId, userId: created.userId }, 201);
});
