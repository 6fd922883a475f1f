import { route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import { assertEntityAccess } from '../../../../lib/job-scope';
import { panelScheduleCsv } from '../../../../lib/panel-schedule-csv';
import { getPanelWithCircuits } from '../../../../lib/repositories/panels';
import { listRooms } from '../../../../lib/repositories/rooms';
import { requireUser } from '../../../../lib/roles';

/** The panel's circuits as a CSV download. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertEntityAccess(db(), user, 'panel', params.id, 'read');
	const found = await getPanelWithCircuits(db(), params.id!);
	if (!found) throw errors.notFound('panel');
	const csv = panelScheduleCsv(found.circuits, found.loads, await listRooms(db(), job.id));
	const slug =
		found.panel.name
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-|-$/g, '') || 'panel';
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${slug}-circuits.csv"`,
		},
	});
});
