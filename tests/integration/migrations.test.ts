import type { Knex } from 'knex';
import knex from 'knex';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

// A database of its own (created empty by npm test), so that running migrations down does not
// disturb the server the other tests talk to.
const url = process.env.MIGRATIONS_DATABASE_URL;
let db: Knex;

const migrations = {
	directory: path.resolve('migrations'),
	loadExtensions: ['.ts'],
	tableName: 'knex_migrations',
};

async function tables(): Promise<string[]> {
	const rows = await db('information_schema.tables')
		.where({ table_schema: 'public', table_type: 'BASE TABLE' })
		.whereNotIn('table_name', ['knex_migrations', 'knex_migrations_lock'])
		.orderBy('table_name')
		.pluck('table_name');
	return rows as string[];
}

beforeAll(() => {
	if (!url) throw new Error('MIGRATIONS_DATABASE_URL is set by npm test');
	db = knex({ client: 'pg', connection: url });
});
afterAll(async () => {
	await db?.destroy();
});

describe('migrations', () => {
	test('run up from nothing, all the way down to nothing, and up again to the same schema', async () => {
		await db.migrate.latest(migrations);
		const afterFirstUp = await tables();
		expect(afterFirstUp).toEqual(
			expect.arrayContaining(['users', 'firms', 'firm_members', 'jurisdictions', 'properties']),
		);

		await db.migrate.rollback(migrations, true);
		expect(await tables()).toEqual([]);

		await db.migrate.latest(migrations);
		expect(await tables()).toEqual(afterFirstUp);
	});

	test('the database refuses a second account with the same e-mail in other letter case', async () => {
		await db.migrate.latest(migrations);
		await db('users').insert({ email: 'case@example.test', name: 'Case One', password_hash: 'x' });
		await expect(
			db('users').insert({ email: 'CASE@example.test', name: 'Case Two', password_hash: 'x' }),
		).rejects.toThrow(/users_email_lower_unique/);
		await db('users').where({ email: 'case@example.test' }).delete();
	});
});
