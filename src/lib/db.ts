import knex, { type Knex } from 'knex';
import { databaseUrl } from './config';

let instance: Knex | null = null;

/** The app's shared Knex instance (created on first use). */
export function db(): Knex {
	if (!instance) {
		instance = knex({ client: 'pg', connection: databaseUrl(), pool: { min: 0, max: 10 } });
	}
	return instance;
}

/** Closes the shared pool (tests and scripts). */
export async function closeDb(): Promise<void> {
	if (instance) {
		await instance.destroy();
		instance = null;
	}
}
