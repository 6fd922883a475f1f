import { afterAll, describe, expect, test } from 'vitest';
import { testDb } from '../helpers/db';
import { HttpClient } from '../helpers/http';

const db = testDb();
afterAll(() => db.destroy());

const good = () => ({
	firmName: 'Harrowgate Lane Electric',
	licenceNumber: 'EC-77/3',
	name: 'Perrin Ockley',
	email: `perrin-${Date.now()}-${Math.random().toString(36).slice(2, 7)}@harrowgate.example`,
	password: 'correct-horse-battery',
	confirmPassword: 'correct-horse-battery',
});

async function counts() {
	const [u] = await db('users').count<{ count: string }[]>('* as count');
	const [f] = await db('firms').count<{ count: string }[]>('* as count');
	return { users: Number(u!.count), firms: Number(f!.count) };
}

type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

describe('registering a firm', () => {
	test('creates the firm with its owner, who can then sign in as a contractor', async () => {
		const input = good();
		const res = await new HttpClient().json<{ firmId: string; userId: string }>('/api/sign-up', {
			method: 'POST',
			body: input,
		});
		expect(res.status).toBe(201);
		try {
			const member = await db('firm_members')
				.where({ firm_id: res.body.firmId, user_id: res.body.userId })
				.first();
			expect(member.member_role).toBe('owner');
			const client = new HttpClient();
			expect(await client.signIn(input.email, input.password)).toBeNull();
			expect((await client.json<{ user: { roles: string[] } }>('/api/me')).body.user.roles).toEqual([
				'contractor',
			]);
		} finally {
			await db('firms').where({ id: res.body.firmId }).delete();
			await db('users').where({ id: res.body.userId }).delete();
		}
	});

	test.each([
		[
			'every field empty',
			{ firmName: '', licenceNumber: '', name: '', email: '', password: '', confirmPassword: '' },
			'email',
			/enter your e-mail/i,
		],
		['a malformed e-mail', { email: 'perrin.at.harrowgate' }, 'email', /does not look like an e-mail/i],
		['an overlong e-mail', { email: `${'a'.repeat(250)}@x.example` }, 'email', /at most 254/i],
		['an overlong firm name', { firmName: 'F'.repeat(161) }, 'firmName', /at most 160/i],
		['an overlong name', { name: 'N'.repeat(121) }, 'name', /at most 120/i],
		['a short password', { password: 'short', confirmPassword: 'short' }, 'password', /at least 10/i],
		[
			'an overlong password',
			{ password: 'p'.repeat(201), confirmPassword: 'p'.repeat(201) },
			'password',
			/at most 200/i,
		],
		[
			'passwords that differ',
			{ confirmPassword: 'something-else-entirely' },
			'confirmPassword',
			/do not match/i,
		],
		['SQL in the e-mail', { email: "x' OR '1'='1@x.example" }, 'email', /does not look like an e-mail/i],
		[
			'SQL in the licence number',
			{ licenceNumber: '1; DROP TABLE users;--' },
			'licenceNumber',
			/letters, digits/i,
		],
		['a field of the wrong type', { firmName: 42 }, 'firmName', /firm/i],
	])('refuses %s with a message on the field and creates nothing', async (_case, change, field, message) => {
		const before = await counts();
		const res = await new HttpClient().json<ErrorBody>('/api/sign-up', {
			method: 'POST',
			body: { ...good(), ...change },
		});
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('validation');
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await counts()).toEqual(before);
	});

	test('a body that is not JSON gets a clear 400, not a 500', async () => {
		const before = await counts();
		const res = await new HttpClient().fetch('/api/sign-up', {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: '{not json',
		});
		expect(res.status).toBe(400);
		expect(((await res.json()) as ErrorBody).error.message).toMatch(/must be JSON/);
		expect(await counts()).toEqual(before);
	});

	test('an e-mail that already has an account is refused on the e-mail field and nothing is created', async () => {
		const before = await counts();
		const res = await new HttpClient().json<ErrorBody>('/api/sign-up', {
			method: 'POST',
			body: { ...good(), email: 'MARISOL@tallowmere-electric.example' },
		});
		expect(res.status).toBe(409);
		expect(res.body.error.fields?.email?.[0]).toMatch(/already exists/);
		expect(await counts()).toEqual(before);
	});

	test('a sign-up from another site is refused', async () => {
		const before = await counts();
		const res = await fetch(`${process.env.AMPLEDGER_BASE_URL}/api/sign-up`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', origin: 'http://elsewhere.example' },
			body: JSON.stringify(good()),
		});
		expect(res.status).toBe(403);
		expect(await counts()).toEqual(before);
	});
});

describe('sign-in with bad input', () => {
	test.each([
		['empty fields', '', ''],
		['a malformed e-mail', 'not-an-email', 'whatever-password'],
		['an overlong e-mail', `${'a'.repeat(300)}@x.example`, 'whatever-password'],
		['an overlong password', 'marisol@tallowmere-electric.example', 'p'.repeat(500)],
		['SQL in the e-mail', "' OR 1=1 --", 'x'],
	])('%s gets a clear refusal, no session and no 500', async (_case, email, password) => {
		const client = new HttpClient();
		const code = await client.signIn(email, password);
		expect(code).toBe('invalid_input');
		expect((await client.json('/api/me')).status).toBe(401);
	});

	test('SQL in a well-formed e-mail is just an unknown account', async () => {
		const client = new HttpClient();
		expect(await client.signIn("o'hara'--@x.example", 'whatever-password')).toBe('wrong_credentials');
		expect(Number((await db('users').count<{ count: string }[]>('* as count'))[0]!.count)).toBeGreaterThan(0);
	});
});
