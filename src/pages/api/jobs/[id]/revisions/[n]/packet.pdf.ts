import { route } from '../../../../../../lib/api';
import { db } from '../../../../../../lib/db';
import { storedPacketResponse } from '../../../../../../lib/documents/stored-packet';
import { errors } from '../../../../../../lib/errors';
import { assertJobParam } from '../../../../../../lib/job-scope';
import { getRevisionPacket } from '../../../../../../lib/repositories/revisions';
import { requireUser } from '../../../../../../lib/roles';
import { revisionNumberParam } from '../../../../../../lib/workflow/revision-param';

/** The packet of a submitted revision: the stored bytes exactly, never rendered again. */
export const GET = route(async ({ params, url, locals }) => {
	const user = requireUser(locals.user);
	const ref = await assertJobParam(db(), user, params.id, 'read');
	const packet = await getRevisionPacket(db(), ref.id, revisionNumberParam(params.n));
	if (!packet) throw errors.notFound('revision');
	return storedPacketResponse(packet, url);
});
