import { json, route } from '../../lib/api';
import { requireUser } from '../../lib/roles';

/** The signed-in person with roles and links. */
export const GET = route(({ locals }) => json({ user: requireUser(locals.user) }));
