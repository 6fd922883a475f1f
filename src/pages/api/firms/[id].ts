import { z } from 'zod';
import { json, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { getFirm } from '../../../lib/repositories/accounts';
import { canReadFirm, requireUser } from '../../../lib/roles';

/** A firm with its members: for the firm's own people and administrators only. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const id = z.uuid().safeParse(params.id);
	if (!id.success || !canReadFirm(user, id.data)) throw errors.notFound('firm');
	const firm = await getFirm(db(), id.data);
	if (!firm) throw errors.notFound('firm');
	return json({ firm });
});
