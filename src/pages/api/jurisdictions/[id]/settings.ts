import { z } from 'zod';
import { json, parseBody, route } from '../../../../lib/api';
import { db } from '../../../../lib/db';
import { errors } from '../../../../lib/errors';
import {
	getJurisdictionSettings,
	updateJurisdictionSettings,
} from '../../../../lib/repositories/jurisdictions';
import { canManageJurisdiction, requireUser, type CurrentUser } from '../../../../lib/roles';
import { jurisdictionSettingsSchema } from '../../../../lib/schemas/jurisdiction';

/** The jurisdiction id of the path, when the user is its staff or a site administrator (404 otherwise, so ids reveal nothing). */
function reachable(user: CurrentUser, raw: string | undefined): string {
	const id = z.uuid().safeParse(raw);
	if (!id.success) throw errors.notFound('jurisdiction');
	if (!canManageJurisdiction(user, id.data) && !user.jurisdictions.some((j) => j.id === id.data))
		throw errors.notFound('jurisdiction');
	return id.data;
}

/** A jurisdiction's settings, for its inspectors and administrators; `canEdit` says whether this user may change them. */
export const GET = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const id = reachable(user, params.id);
	const settings = await getJurisdictionSettings(db(), id);
	if (!settings) throw errors.notFound('jurisdiction');
	return json({ settings, canEdit: canManageJurisdiction(user, id) });
});

/** Replaces the settings (versioned: a stale version answers 409 with the current settings). */
export const PATCH = route(async ({ params, locals, request }) => {
	const user = requireUser(locals.user);
	const id = reachable(user, params.id);
	if (!canManageJurisdiction(user, id))
		throw errors.forbidden('Only the jurisdiction’s administrators change its settings.');
	const input = await parseBody(request, jurisdictionSettingsSchema);
	const settings = await updateJurisdictionSettings(db(), id, input);
	return json({ settings, canEdit: true });
});
