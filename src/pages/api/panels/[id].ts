import { json, parseBody, route } from '../../../lib/api';
import { db } from '../../../lib/db';
import { errors } from '../../../lib/errors';
import { assertEntityAccess } from '../../../lib/job-scope';
import { deletePanel, getPanelWithCircuits, updatePanel } from '../../../lib/repositories/panels';
import { requireUser } from '../../../lib/roles';
import { deleteSchema } from '../../../lib/schemas/common';
import { panelPatchSchema } from '../../../lib/schemas/panel';

/** A panel with its circuits and their loads. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'panel', params.id, 'read');
	const found = await getPanelWithCircuits(db(), params.id!);
	if (!found) throw errors.notFound('panel');
	return json(found);
});

export const PATCH = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'panel', params.id, 'write');
	const patch = await parseBody(request, panelPatchSchema);
	return json({ panel: await updatePanel(db(), user, params.id!, patch) });
});

/** Deletes the panel with its circuits and loads. */
export const DELETE = route(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await assertEntityAccess(db(), user, 'panel', params.id, 'write');
	const { version } = await parseBody(request, deleteSchema);
	const counts = await deletePanel(db(), user, params.id!, version);
	return json({ deleted: true, ...counts });
});
