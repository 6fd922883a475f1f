import knex, { type Knex } from 'knex';

/** A Knex instance on the test database that npm test created (never the development one). */
export function testDb(url = process.env.DATABASE_URL): Knex {
	if (!url || !/_test\b|ampledger_migrations/.test(url)) {
		throw new Error('Integration tests need the test database: run them through `npm test`.');
	}
	return knex({ client: 'pg', connection: url, pool: { min: 0, max: 4 } });
}
