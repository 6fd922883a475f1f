import { errors } from '../errors';

/** A revision number from a route parameter (1 and up, digits only), or a 404. */
export function revisionNumberParam(raw: string | undefined): number {
	if (!raw || !/^[1-9][0-9]{0,5}$/.test(raw)) throw errors.notFound('revision');
	return Number(raw);
}
