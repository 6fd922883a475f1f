import type { Knex } from 'knex';
import { assertJobAccess, type JobAccess, type JobRef } from './access';
import { errors } from './errors';
import { circuitJobId } from './repositories/circuits';
import { loadJobId } from './repositories/loads';
import { panelJobId } from './repositories/panels';
import { roomJobId } from './repositories/rooms';
import type { CurrentUser } from './roles';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const JOB_OF = { room: roomJobId, panel: panelJobId, circuit: circuitJobId, load: loadJobId };

/**
 * The job a room, panel, circuit or load belongs to, after checking the user may read or change it:
 * 404 for an unknown id or someone else's job, 403 for a reader asking to write.
 */
export async function assertEntityAccess(
	knex: Knex,
	user: CurrentUser,
	entity: keyof typeof JOB_OF,
	id: string | undefined,
	access: JobAccess,
): Promise<JobRef> {
	if (!id || !UUID.test(id)) throw errors.notFound(entity);
	const jobId = await JOB_OF[entity](knex, id);
	if (!jobId) throw errors.notFound(entity);
	try {
		return await assertJobAccess(knex, user, jobId, access);
	} catch (err) {
		if ((err as { code?: string }).code === 'not_found') throw errors.notFound(entity);
		throw err;
	}
}

/** A job the user may reach (see assertJobAccess), from a route parameter. */
export function assertJobParam(
	knex: Knex,
	user: CurrentUser,
	jobId: string | undefined,
	access: JobAccess,
): Promise<JobRef> {
	return assertJobAccess(knex, user, jobId ?? '', access);
}
