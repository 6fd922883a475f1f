import { json, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { getAdminOverview } from '../../../lib/repositories/accounts';
import { requireRole } from '../../../lib/roles';

/** Firms, jurisdictions and accounts: administrators only. */
export const GET = route(async ({ locals }) => {
	requireRole(locals.user, 'administrator');
	return json(await getAdminOverview(db()));
});
