import { json, route } from '../../../../lib/api';
import { assertJobAccess } from '../../../../lib/access';
import { db } from '../../../../lib/db';
import { warmRenderWorker } from '../../../../lib/documents/render-pool';
import { mapLink } from '../../../../lib/panel-map-token';
import {
	liveMapToken,
	reissueMapToken,
	revokeMapToken,
	type MapTokenInfo,
} from '../../../../lib/repositories/panel-map-tokens';
import { requireUser } from '../../../../lib/roles';

function view(live: MapTokenInfo | null, origin: string) {
	if (!live) return { link: null };
	return {
		link: live.token ? mapLink(live.token, origin) : null,
		createdAt: live.createdAt,
		createdByName: live.createdByName,
		unreadable: live.token === null,
	};
}

/** The job's live panel map link (firm members). */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'write');
	// The documents section of the job page asks for this first: a good moment to start the renderer.
	warmRenderWorker();
	return json(view(await liveMapToken(db(), job.id), url.origin));
});

/** Revokes the live link and issues a new one: cards printed before stop opening the map. */
export const POST = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'write');
	return json(view(await reissueMapToken(db(), job.id, user.id), url.origin), 201);
});

/** Revokes the live link; the map opens only for the signed-in homeowner until a new one is issued. */
export const DELETE = route(async ({ params, locals }) => {
	const user = requireUser(locals.user);
	const job = await assertJobAccess(db(), user, params.id ?? '', 'write');
	return json({ revoked: await revokeMapToken(db(), job.id, user.id) });
});
