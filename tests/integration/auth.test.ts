import { afterAll, describe, expect, test } from 'vitest';
import { DEMO_ACCOUNTS } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';

const db = testDb();
afterAll(() => db.destroy());

type Me = { user: { email: string; roles: string[]; firms: { id: string }[] } };

describe('signing in', () => {
	test.each([
		['owner', ['contractor']],
		['electrician', ['contractor']],
		['inspector', ['inspector']],
		['homeowner', ['homeowner']],
		['homeowner2', ['homeowner']],
		['admin', ['administrator']],
	] as const)('the demo %s signs in and the session carries the %j role', async (who, roles) => {
		const client = await signedInAs(who);
		const me = await client.json<Me>('/api/me');
		expect(me.status).toBe(200);
		expect(me.body.user.email).toBe(DEMO_ACCOUNTS[who].email);
		expect(me.body.user.roles).toEqual(roles);
	});

	test('an e-mail typed in other letter case and with spaces still signs in', async () => {
		const client = new HttpClient();
		expect(
			await client.signIn(
				`  ${DEMO_ACCOUNTS.electrician.email.toUpperCase()} `,
				DEMO_ACCOUNTS.electrician.password,
			),
		).toBeNull();
	});

	test('a wrong password and an unknown account get the same answer', async () => {
		const wrong = await new HttpClient().signIn(DEMO_ACCOUNTS.homeowner2.email, 'not-the-password');
		const unknown = await new HttpClient().signIn('nobody-here@mail.example', 'not-the-password');
		expect(wrong).toBe('wrong_credentials');
		expect(unknown).toBe(wrong);
	});

	test('signing out ends the session', async () => {
		const client = await signedInAs('homeowner');
		const csrf = (await (await client.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
		await client.fetch('/api/auth/signout', {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
			body: new URLSearchParams({ csrfToken: csrf.csrfToken }),
		});
		expect((await client.json('/api/me')).status).toBe(401);
	});

	test('repeated failures for one account are refused for a while, even with the right password', async () => {
		const email = `throttle-${Date.now()}@mail.example`;
		await db('users').insert({
			email,
			name: 'Throttle Probe',
			password_hash: (await import('bcryptjs')).default.hashSync('right-password-1', 4),
		});
		try {
			const client = new HttpClient();
			for (let i = 0; i < 5; i++)
				expect(await client.signIn(email, 'wrong-password')).toBe('wrong_credentials');
			expect(await client.signIn(email, 'right-password-1')).toBe('throttled');
			expect(
				await db('sign_in_attempts')
					.where({ email, succeeded: false })
					.count<{ count: string }[]>('* as count'),
			).toEqual([{ count: '5' }]);
		} finally {
			await db('sign_in_attempts').where({ email }).delete();
			await db('users').where({ email }).delete();
		}
	});
});

describe('guards', () => {
	test.each(['/api/me', '/api/admin/overview', '/api/firms/00000000-0000-4000-8000-000000000000'])(
		'an anonymous call to %s gets 401 in the one error shape',
		async (path) => {
			const res = await new HttpClient().json<{ error: { code: string; message: string } }>(path);
			expect(res.status).toBe(401);
			expect(res.body.error.code).toBe('unauthenticated');
			expect(res.body.error.message).toMatch(/sign in/i);
		},
	);

	test.each(['owner', 'inspector', 'homeowner'] as const)(
		'the %s gets 403 from an administrators-only API',
		async (who) => {
			const res = await (await signedInAs(who)).json<{ error: { code: string } }>('/api/admin/overview');
			expect(res.status).toBe(403);
			expect(res.body.error.code).toBe('forbidden');
		},
	);

	test('the administrator reads the administrators-only API', async () => {
		const res = await (
			await signedInAs('admin')
		).json<{ firms: unknown[]; users: unknown[] }>('/api/admin/overview');
		expect(res.status).toBe(200);
		expect(res.body.users.length).toBeGreaterThanOrEqual(Object.keys(DEMO_ACCOUNTS).length);
	});

	test.each([
		['/contractor', 'homeowner'],
		['/inspector', 'owner'],
		['/admin', 'inspector'],
		['/homeowner', 'electrician'],
	] as const)('the page %s answers 403 to the %s', async (path, who) => {
		const res = await (await signedInAs(who)).fetch(path);
		expect(res.status).toBe(403);
		expect(await res.text()).toContain('not available to your account');
	});

	test('a signed-out visit to a protected page is sent to sign-in with the way back', async () => {
		const res = await new HttpClient().fetch('/contractor');
		expect(res.status).toBe(302);
		expect(res.headers.get('location')).toBe('/sign-in?next=%2Fcontractor');
	});
});

describe('firm data', () => {
	test('a contractor reads their own firm but not another firm', async () => {
		const owner = await signedInAs('owner');
		const me = (await owner.json<Me>('/api/me')).body.user;
		const ownFirm = await owner.json<{ firm: { name: string; members: unknown[] } }>(
			`/api/firms/${me.firms[0]!.id}`,
		);
		expect(ownFirm.status).toBe(200);
		expect(ownFirm.body.firm.members).toHaveLength(2);

		const email = `rival-${Date.now()}@rival-wiring.example`;
		const signUp = await new HttpClient().json<{ firmId: string }>('/api/sign-up', {
			method: 'POST',
			body: {
				firmName: 'Rival Wiring Ltd',
				licenceNumber: 'EC-2',
				name: 'Rhea Rival',
				email,
				password: 'a-long-password',
				confirmPassword: 'a-long-password',
			},
		});
		expect(signUp.status).toBe(201);
		try {
			const rival = await owner.json<{ error: { code: string }; firm?: unknown }>(
				`/api/firms/${signUp.body.firmId}`,
			);
			expect(rival.status).toBe(404);
			expect(rival.body.firm).toBeUndefined();
		} finally {
			await db('firms').where({ id: signUp.body.firmId }).delete();
			await db('users').where({ email }).delete();
		}
	});
});
