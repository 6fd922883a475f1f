import type { Knex } from 'knex';
import { AppError, errors } from '../errors';

/** Who makes a change (for the audit trail). */
export interface Actor {
	id: string;
}

/**
 * Locks a versioned row for the rest of the transaction and checks the version the client sent:
 * 404 when the row is gone, 409 with the current record when someone changed it since.
 */
export async function lockVersion<T>(
	trx: Knex.Transaction,
	table: string,
	id: string,
	version: number,
	load: () => Promise<T | null>,
	what: string,
): Promise<T> {
	const row = await trx(table).where({ id }).forUpdate().first('version');
	const current = row ? await load() : null;
	if (!row || current === null) throw errors.notFound(what);
	if (Number(row.version) !== version) {
		throw errors.conflict(
			`This ${what} was changed by someone else since you opened it (you had version ${version}, it is now version ${row.version}). Review the current values and apply your change again.`,
			current,
		);
	}
	return current;
}

/** Column values that mark a row changed: the next version and the time. */
export function bump(trx: Knex.Transaction) {
	return { version: trx.raw('version + 1'), updated_at: trx.fn.now() };
}

const PG_MESSAGES: Record<string, (constraint: string) => AppError> = {
	'23P01': () => errors.conflict('Another breaker already takes one of these positions.'),
	'23505': () => errors.conflict('This conflicts with another record (it must be unique).'),
	'23503': () => errors.invalid('A referenced record does not exist or is still in use.'),
	'23514': (c) =>
		c === 'circuits_within_spaces' || c === 'panels_spaces_hold_circuits'
			? errors.invalid('A breaker would not fit within the panel’s spaces.', {
					position: ['does not fit within the panel’s spaces'],
				})
			: errors.invalid('A value is outside what is allowed.'),
};

/**
 * Runs a transaction; constraint violations the checks before the write did not catch (a race)
 * become clear 400/409 answers instead of a 500.
 */
export async function inTransaction<T>(knex: Knex, fn: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
	try {
		return await knex.transaction(fn);
	} catch (err) {
		const code = (err as { code?: string }).code;
		const make = code ? PG_MESSAGES[code] : undefined;
		if (make && !(err instanceof AppError))
			throw make(String((err as { constraint?: string }).constraint ?? ''));
		throw err;
	}
}
