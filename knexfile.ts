import type { Knex } from 'knex';
import { databaseUrl } from './src/lib/config.ts';

const config: Knex.Config = {
	client: 'pg',
	connection: databaseUrl(),
	pool: { min: 0, max: 10 },
	migrations: {
		directory: './migrations',
		extension: 'ts',
		loadExtensions: ['.ts'],
		tableName: 'knex_migrations',
	},
	seeds: {
		directory: './seeds',
		extension: 'ts',
		loadExtensions: ['.ts'],
	},
};

export default config;
