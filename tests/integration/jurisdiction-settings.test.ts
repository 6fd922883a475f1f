/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashPassword } from '../../src/lib/passwords';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, circuitAt, loadOf, mainPanel, newJob, removeJobs, uniq } from '../helpers/jobs';
import { newJurisdictionWithInspector, removeJurisdiction } from '../helpers/workflow';

const db = testDb();
type Staff = Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let staffAdmin: Staff;
let elsewhere: Staff;
let plain: { client: HttpClient; userId: string };
let owner: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
const jobs: string[] = [];

/** A second member of a jurisdiction's staff, with the plain inspector role. */
async function plainInspectorOf(jurisdictionId: string) {
	const email = `plain-${uniq()}@brackwater-vale.example`;
	const [u] = await db('users')
		.insert({ email, name: 'Ysolde Marchbank', password_hash: await hashPassword('inspect-the-service') })
		.returning('id');
	await db('jurisdiction_inspectors').insert({
		jurisdiction_id: jurisdictionId,
		user_id: u.id,
		staff_role: 'inspector',
	});
	const client = new HttpClient();
	const failure = await client.signIn(email, 'inspect-the-service');
	if (failure) throw new Error(`sign-in failed: ${failure}`);
	return { client, userId: u.id as string };
}

const settingsUrl = () => `/api/jurisdictions/${staffAdmin.jurisdictionId}/settings`;
const row = () => db('jurisdictions').where({ id: staffAdmin.jurisdictionId }).first();

async function current(): Promise<any> {
	const res = await call(staffAdmin.client, 'GET', settingsUrl());
	expect(res.status).toBe(200);
	return res.body.settings;
}

/** A full, valid settings body at the current version. */
async function goodBody(over: Record<string, unknown> = {}) {
	const s = await current();
	const { id: _id, name: _name, ...body } = s;
	return { ...body, ...over };
}

beforeAll(async () => {
	[owner, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('admin'),
	]);
	staffAdmin = await newJurisdictionWithInspector(db, 'administrator');
	elsewhere = await newJurisdictionWithInspector(db, 'administrator');
	plain = await plainInspectorOf(staffAdmin.jurisdictionId);
});

afterAll(async () => {
	await removeJobs(db, jobs);
	await db('users').where({ id: plain.userId }).delete();
	await removeJurisdiction(db, staffAdmin);
	await removeJurisdiction(db, elsewhere);
	await db.destroy();
});

describe('reading a jurisdiction’s settings', () => {
	test('its staff administrator reads the defaults and may edit them', async () => {
		const res = await call(staffAdmin.client, 'GET', settingsUrl());
		expect(res.status).toBe(200);
		expect(res.body.canEdit).toBe(true);
		expect(res.body.settings).toMatchObject({
			id: staffAdmin.jurisdictionId,
			codeEdition: '2023',
			feeBaseCents: 0,
			requiredDocuments: { panelSchedules: true, loadCalculation: true, sketch: false },
			amendments: { gfciEdition: null, afciEdition: null },
			permitNumberPattern: 'E{YYYY}-{SEQ:5}',
		});
	});

	test('a plain inspector of the jurisdiction reads them but may not edit', async () => {
		const res = await call(plain.client, 'GET', settingsUrl());
		expect(res.status).toBe(200);
		expect(res.body.canEdit).toBe(false);
	});

	test('a site administrator reads them and may edit', async () => {
		const res = await call(admin, 'GET', settingsUrl());
		expect(res.status).toBe(200);
		expect(res.body.canEdit).toBe(true);
	});

	test.each([
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['a contractor', () => owner, 404],
		['a homeowner', () => homeowner, 404],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('%s gets %i', async (_who, client, status) => {
		expect((await call(client(), 'GET', settingsUrl())).status).toBe(status);
	});

	test('an id that is not a jurisdiction answers 404', async () => {
		expect((await call(admin, 'GET', '/api/jurisdictions/not-an-id/settings')).status).toBe(404);
		expect((await call(admin, 'GET', `/api/jurisdictions/${crypto.randomUUID()}/settings`)).status).toBe(404);
	});
});

describe('changing a jurisdiction’s settings', () => {
	test('the staff administrator saves fees in cents, documents, amendments and the pattern; the version moves on', async () => {
		const before = await current();
		const body = await goodBody({
			codeEdition: '2020',
			feeBaseCents: 8_250,
			feePerCircuitCents: 1_175,
			feePerPanelCents: 3_000,
			feeServiceChangeCents: 14_000,
			requiredDocuments: { panelSchedules: true, loadCalculation: false, sketch: true },
			amendments: { gfciEdition: '2017', afciEdition: null },
			permitNumberPattern: 'BV-{SEQ:6}',
		});
		const res = await call(staffAdmin.client, 'PATCH', settingsUrl(), body);
		expect(res.status).toBe(200);
		expect(res.body.settings.version).toBe(before.version + 1);
		const stored = await row();
		expect(stored).toMatchObject({
			code_edition: '2020',
			fee_base_cents: 8_250,
			fee_per_circuit_cents: 1_175,
			fee_per_panel_cents: 3_000,
			fee_service_change_cents: 14_000,
			required_documents: { panelSchedules: true, loadCalculation: false, sketch: true },
			amendments: { gfciEdition: '2017', afciEdition: null },
			permit_number_pattern: 'BV-{SEQ:6}',
		});
	});

	test('a site administrator may save them too', async () => {
		const res = await call(admin, 'PATCH', settingsUrl(), await goodBody({ feePerPanelCents: 3_100 }));
		expect(res.status).toBe(200);
		expect((await row()).fee_per_panel_cents).toBe(3_100);
	});

	test.each([
		['a plain inspector of the jurisdiction', () => plain.client, 403],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['a contractor', () => owner, 404],
		['a homeowner', () => homeowner, 404],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('%s is refused with %i and nothing is written', async (_who, client, status) => {
		const before = await row();
		const res = await call(client(), 'PATCH', settingsUrl(), await goodBody({ feeBaseCents: 1 }));
		expect(res.status).toBe(status);
		expect(await row()).toEqual(before);
	});

	test.each([
		['codeEdition', { codeEdition: '2014' }, 'codeEdition'],
		['a negative fee', { feeBaseCents: -1 }, 'feeBaseCents'],
		['a fee in fractions of a cent', { feePerCircuitCents: 12.5 }, 'feePerCircuitCents'],
		['a fee over 1,000,000.00', { feePerPanelCents: 100_000_001 }, 'feePerPanelCents'],
		['a fee as text', { feeServiceChangeCents: '125.00' }, 'feeServiceChangeCents'],
		[
			'a required document that is not true or false',
			{ requiredDocuments: { panelSchedules: 'yes', loadCalculation: true, sketch: false } },
			'requiredDocuments.panelSchedules',
		],
		[
			'an unknown required document',
			{ requiredDocuments: { panelSchedules: true, loadCalculation: true, sketch: false, photos: true } },
			'requiredDocuments',
		],
		[
			'an amendment naming an edition the engine does not know',
			{ amendments: { gfciEdition: '2026', afciEdition: null } },
			'amendments.gfciEdition',
		],
		['a pattern without a running number', { permitNumberPattern: 'E{YYYY}' }, 'permitNumberPattern'],
		['a pattern with other braces', { permitNumberPattern: 'E{YY}-{SEQ:4}' }, 'permitNumberPattern'],
		[
			'a pattern longer than 60 characters',
			{ permitNumberPattern: `${'A'.repeat(60)}{SEQ:4}` },
			'permitNumberPattern',
		],
		['an unknown field', { colour: 'teal' }, '_'],
	])('%s is refused with a message on its field and nothing is written', async (_what, over, field) => {
		const before = await row();
		const res = await call(staffAdmin.client, 'PATCH', settingsUrl(), await goodBody(over));
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('validation');
		expect(Object.keys(res.body.error.fields ?? {})).toContain(field);
		expect(res.body.error.fields[field][0]).toMatch(/\w{3,}/);
		expect(await row()).toEqual(before);
	});

	test('a body that is not JSON is refused and nothing is written', async () => {
		const before = await row();
		const res = await staffAdmin.client.fetch(settingsUrl(), {
			method: 'PATCH',
			headers: { 'content-type': 'application/json' },
			body: '{"version":',
		});
		expect(res.status).toBe(400);
		expect(await row()).toEqual(before);
	});

	test('a stale version answers 409 with the current settings and writes nothing', async () => {
		const body = await goodBody();
		expect(
			(await call(staffAdmin.client, 'PATCH', settingsUrl(), { ...body, feeBaseCents: 9_000 })).status,
		).toBe(200);
		const before = await row();
		const stale = await call(staffAdmin.client, 'PATCH', settingsUrl(), { ...body, feeBaseCents: 1_000 });
		expect(stale.status).toBe(409);
		expect(stale.body.error.current).toMatchObject({
			id: staffAdmin.jurisdictionId,
			version: body.version + 1,
			feeBaseCents: 9_000,
		});
		expect(await row()).toEqual(before);
	});
});

describe('local amendments reach the engine', () => {
	test('a job filed with the jurisdiction carries its GFCI and AFCI editions in its document and in the tree the browser checks', async () => {
		await call(
			staffAdmin.client,
			'PATCH',
			settingsUrl(),
			await goodBody({ amendments: { gfciEdition: '2017', afciEdition: '2020' } }),
		);
		const job = (await call(owner, 'POST', '/api/jobs', newJob())).body.job;
		jobs.push(job.id);
		const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
		await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(1, { breakerType: 'standard' }));
		await db('jobs').where({ id: job.id }).update({ jurisdiction_id: staffAdmin.jurisdictionId });
		const exported = await owner.fetch(`/api/jobs/${job.id}/export`);
		expect(exported.status).toBe(200);
		expect((await exported.json()).ruleOptions).toEqual({ gfciEdition: '2017', afciEdition: '2020' });
		const tree = await call(owner, 'GET', `/api/jobs/${job.id}/tree`);
		expect(tree.body.ruleOptions).toEqual({ gfciEdition: '2017', afciEdition: '2020' });
	});

	test('the server’s checks of a 2023 job follow the jurisdiction’s 2017 GFCI list', async () => {
		// NFPA 70 (NEC) 2023, 210.8(A)(5): every kitchen receptacle; NFPA 70 (NEC) 2017, 210.8(A)(6): only those
		// serving countertops. An AFCI breaker on general kitchen receptacles: GFCI missing under 2023 only.
		const job = (await call(owner, 'POST', '/api/jobs', newJob({ codeEdition: '2023' }))).body.job;
		jobs.push(job.id);
		const room = (
			await call(owner, 'POST', `/api/jobs/${job.id}/rooms`, {
				name: 'Kitchen',
				type: 'kitchen',
				areaFt2: 180,
			})
		).body.room;
		const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
		const circuit = (
			await call(
				owner,
				'POST',
				`/api/panels/${panel.id}/circuits`,
				circuitAt(1, { roomIds: [room.id], breakerType: 'afci', label: 'Kitchen wall receptacles' }),
			)
		).body.circuit;
		await call(owner, 'POST', `/api/circuits/${circuit.id}/loads`, loadOf({ roomIds: [room.id] }));
		await db('jobs').where({ id: job.id }).update({ jurisdiction_id: staffAdmin.jurisdictionId });
		const gfci = async () => {
			const tree = await call(owner, 'GET', `/api/jobs/${job.id}/tree`);
			expect(tree.body.engine.ok).toBe(true);
			return tree.body.engine.results.findings.find(
				(f: any) => f.code === 'gfci-required' && f.target.id === circuit.id,
			);
		};
		await call(
			staffAdmin.client,
			'PATCH',
			settingsUrl(),
			await goodBody({ amendments: { gfciEdition: null, afciEdition: null } }),
		);
		expect(await gfci()).toMatchObject({ severity: 'violation', rule: 'NEC 2023 210.8(A)' });
		await call(
			staffAdmin.client,
			'PATCH',
			settingsUrl(),
			await goodBody({ amendments: { gfciEdition: '2017', afciEdition: null } }),
		);
		expect(await gfci()).toBeUndefined();
	});

	test('a job with no jurisdiction has no amendments', async () => {
		const job = (await call(owner, 'POST', '/api/jobs', newJob())).body.job;
		jobs.push(job.id);
		await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel());
		const exported = await (await owner.fetch(`/api/jobs/${job.id}/export`)).json();
		expect(exported.ruleOptions).toEqual({ gfciEdition: null, afciEdition: null });
	});
});

describe('the settings page', () => {
	const page = () => `/inspector/jurisdictions/${staffAdmin.jurisdictionId}`;

	test('opens for the staff administrator with the save button and the fee example', async () => {
		const res = await staffAdmin.client.fetch(page());
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Save the settings');
		expect(html).toContain('data-testid="fee-example"');
	});

	test('opens read-only for a plain inspector of the jurisdiction', async () => {
		const res = await plain.client.fetch(page());
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Only the jurisdiction’s administrators change them.');
		expect(html).not.toContain('Save the settings');
	});

	test.each([
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['a contractor', () => owner, 403],
		['a homeowner', () => homeowner, 403],
	])('answers %s with %i', async (_who, client, status) => {
		expect((await client().fetch(page())).status).toBe(status);
	});

	test('sends a signed-out visitor to sign in', async () => {
		const res = await new HttpClient().fetch(page());
		expect(res.status).toBe(302);
		expect(res.headers.get('location')).toContain('/sign-in');
	});

	test('the site administrator opens it from the administration pages', async () => {
		const res = await admin.fetch(`/admin/jurisdictions/${staffAdmin.jurisdictionId}`);
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('Save the settings');
		expect((await owner.fetch(`/admin/jurisdictions/${staffAdmin.jurisdictionId}`)).status).toBe(403);
	});
});
