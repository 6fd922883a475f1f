import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { assertJobParam } from '../../../../lib/job-scope';
import { createPanel, listPanels } from '../../../../lib/repositories/panels';
import { requireUser } from '../../../../lib/roles';
import { panelInputSchema } from '../../../../lib/schemas/panel';

export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	return json({ items: await listPanels(db(), ref.id) });
});

export const POST = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'write');
	const input = await parseBody(request, panelInputSchema);
	return json({ panel: await createPanel(db(), user, ref.id, input) }, 201);
});
