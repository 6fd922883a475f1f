import { json, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { listJurisdictionChoices } from '../../../lib/repositories/jurisdiction-choices';
import { requireUser } from '../../../lib/roles';

/** The jurisdictions a job may name (id, name, adopted edition), for any signed-in user. */
export const GET = route(async ({ locals }) => {
	requireUser(locals.user);
	return json({ jurisdictions: await listJurisdictionChoices(db()) });
});
