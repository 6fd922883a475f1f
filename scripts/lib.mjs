// Shared steps of `npm start` and `npm test`.
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Reads .env when present (values already in the environment win). */
export function loadDotEnv() {
	const file = path.join(root, '.env');
	if (fs.existsSync(file)) process.loadEnvFile(file);
}

/** A stable secret for signing sessions, kept in the git-ignored data folder when none is set. */
export function ensureAuthSecret() {
	if (process.env.AUTH_SECRET) return;
	const file = path.join(root, '.data', 'auth-secret');
	if (!fs.existsSync(file)) {
		fs.mkdirSync(path.dirname(file), { recursive: true });
		fs.writeFileSync(file, crypto.randomBytes(32).toString('base64url'), { mode: 0o600 });
	}
	process.env.AUTH_SECRET = fs.readFileSync(file, 'utf8').trim();
}

/** Runs the Knex CLI with the TypeScript loader. */
export function knex(args, env = process.env) {
	const r = spawnSync(
		process.execPath,
		['--import', 'tsx', 'node_modules/knex/bin/cli.js', ...args, '--knexfile', 'knexfile.ts'],
		{
			cwd: root,
			env,
			stdio: 'inherit',
		},
	);
	if (r.status !== 0) throw new Error(`knex ${args.join(' ')} failed`);
}

function newestMtime(p) {
	if (!fs.existsSync(p)) return 0;
	const st = fs.statSync(p);
	if (!st.isDirectory()) return st.mtimeMs;
	let newest = st.mtimeMs;
	for (const entry of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
	return newest;
}

/** Builds the app when any source is newer than the last build. */
export function buildIfStale(env = process.env) {
	const entry = path.join(path.resolve(root, env.AMPLEDGER_DIST || 'dist'), 'server', 'entry.mjs');
	const built = fs.existsSync(entry) ? fs.statSync(entry).mtimeMs : 0;
	const sources = [
		'src',
		'public',
		'templates',
		'astro.config.mjs',
		'auth.config.ts',
		'tailwind.config.mjs',
		'package.json',
		'package-lock.json',
	];
	const newest = Math.max(...sources.map((s) => newestMtime(path.join(root, s))));
	if (built && built >= newest) {
		console.log('[build] up to date');
		return;
	}
	console.log('[build] building the app (astro build)…');
	const r = spawnSync(process.execPath, ['node_modules/astro/astro.js', 'build'], {
		cwd: root,
		env: { ...env, ASTRO_TELEMETRY_DISABLED: '1' },
		stdio: 'inherit',
	});
	if (r.status !== 0) throw new Error('astro build failed');
}

/** Starts the Express server as a child process. */
export function startServer(env) {
	return spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
		cwd: root,
		env,
		stdio: ['ignore', 'inherit', 'inherit'],
	});
}

/** Waits until a URL answers, or throws after the timeout. */
export async function waitForHttp(url, timeoutMs = 30_000) {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			const res = await fetch(url);
			if (res.ok) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/**
 * Debian packages the browser and document tests need: chromium, and poppler-utils (pdftoppm) to
 * render PDF pages. Installed when missing and running as root; otherwise the command is printed.
 */
export function ensureTestPackages() {
	const needed = [
		{ bin: process.env.CHROMIUM_PATH || '/usr/bin/chromium', pkg: 'chromium' },
		{ bin: '/usr/bin/pdftoppm', pkg: 'poppler-utils' },
	].filter((n) => !fs.existsSync(n.bin));
	if (needed.length === 0) return;
	const pkgs = needed.map((n) => n.pkg);
	if (process.getuid?.() !== 0) {
		throw new Error(
			`Missing ${pkgs.join(', ')}. Install with: sudo apt-get update && sudo apt-get install -y ${pkgs.join(' ')}`,
		);
	}
	console.log(`[test] installing ${pkgs.join(', ')} from Debian packages…`);
	execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
	execFileSync('apt-get', ['install', '-y', '-qq', ...pkgs], {
		stdio: 'inherit',
		env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
	});
}
