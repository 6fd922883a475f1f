import { json, route } from '../../lib/api';
import { db } from '../../lib/db';

/** Liveness and database reachability. */
export const GET = route(async () => {
	await db().raw('select 1');
	return json({ ok: true });
});
