// `npm start`: database up, migrate, seed the demo when empty, build when stale, serve.
import pg from 'pg';
import * as db from './db.mjs';
import { buildIfStale, ensureAuthSecret, knex, loadDotEnv, startServer } from './lib.mjs';

loadDotEnv();
ensureAuthSecret();
process.env.AUTH_TRUST_HOST ??= 'true';
process.env.DATABASE_URL ||= db.DEFAULT_DATABASE_URL;
const production = process.env.NODE_ENV === 'production';

const s = await db.start();
knex(['migrate:latest']);

const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
await client.connect();
const { rows } = await client.query('SELECT count(*)::int AS n FROM users');
await client.end();
if (rows[0].n === 0 && !production) {
	console.log('[seed] empty database: loading the demo scenario');
	knex(['seed:run']);
}

buildIfStale();

const host = process.env.HOST || '127.0.0.1';
const port = process.env.PORT || '4321';
const server = startServer({ ...process.env, HOST: host, PORT: port });

if (!production) {
	const { DEMO_ACCOUNTS } = await import('../seeds/data/demo-accounts.ts').catch(() => ({
		DEMO_ACCOUNTS: null,
	}));
	if (DEMO_ACCOUNTS) {
		console.log('\nDemo accounts (demo only):');
		for (const a of Object.values(DEMO_ACCOUNTS))
			console.log(`  ${a.role.padEnd(26)} ${a.email.padEnd(42)} ${a.password}`);
	}
}
console.log(`\nOpen http://${host}:${port}  (database on 127.0.0.1:${s.port}; Ctrl-C stops)\n`);

let stopping = false;
function shutdown() {
	if (stopping) return;
	stopping = true;
	server.kill('SIGTERM');
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
server.on('exit', (code) => {
	db.stop();
	process.exit(code ?? 0);
});
