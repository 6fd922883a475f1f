/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies and spoil documents loosely */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { computeJob, parseJobDocument } from '../../src/lib/electrical';
import { DEMO_ACCOUNTS, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { DEMO_JOB_DOCUMENT } from '../../seeds/data/demo-job';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import {
	call,
	jobTableCounts,
	newJob,
	otherFirmOwner,
	removeJobs,
	uniq,
	type ErrorBody,
	removeOtherFirm,
} from '../helpers/jobs';

const db = testDb();
const created: string[] = [];
let owner: HttpClient;
let electrician: HttpClient;
let homeowner: HttpClient;
let homeowner2: HttpClient;
let inspector: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let demoJobId: string;

beforeAll(async () => {
	[owner, electrician, homeowner, homeowner2, inspector] = await Promise.all([
		signedInAs('owner'),
		signedInAs('electrician'),
		signedInAs('homeowner'),
		signedInAs('homeowner2'),
		signedInAs('inspector'),
	]);
	other = await otherFirmOwner();
	demoJobId = (await db('jobs').where({ name: DEMO_JOB_DOCUMENT.name }).first('id')).id;
});

afterAll(async () => {
	await removeJobs(db, created);
	await removeOtherFirm(db, other);
	await db.destroy();
});

async function createJob(client = owner, overrides: Record<string, unknown> = {}) {
	const res = await call(client, 'POST', '/api/jobs', newJob(overrides));
	expect(res.status).toBe(201);
	created.push(res.body.job.id);
	return res.body.job;
}

describe('creating a job', () => {
	test('creates a draft job at version 1 for the contractor’s firm, with a property for its address and an audit row', async () => {
		const input = newJob({ homeownerName: 'Ysolde Marrable', scopeOfWork: 'Add a bathroom circuit' });
		const res = await call(owner, 'POST', '/api/jobs', input);
		expect(res.status).toBe(201);
		created.push(res.body.job.id);
		expect(res.body.job).toMatchObject({
			name: input.name,
			address: input.address,
			status: 'draft',
			version: 1,
			codeEdition: '2023',
			serviceRatingA: 200,
			terminalTemperatureC: 75,
			homeownerName: 'Ysolde Marrable',
		});
		const row = await db('jobs').where({ id: res.body.job.id }).first();
		const property = await db('properties').where({ id: row.property_id }).first();
		expect(property.address).toBe(input.address);
		const audit = await db('audit_log').where({ entity_id: res.body.job.id }).select('action', 'entity');
		expect(audit).toEqual([{ action: 'create', entity: 'job' }]);
	});

	test('links a job at a known address to that home, so its homeowner can read it', async () => {
		const job = await createJob(owner, { address: `  ${DEMO_PROPERTIES.calderwood.toUpperCase()} ` });
		const property = await db('properties').where({ address: DEMO_PROPERTIES.calderwood }).first('id');
		expect(job.propertyId).toBe(property.id);
		expect((await call(homeowner2, 'GET', `/api/jobs/${job.id}`)).status).toBe(200);
		expect((await call(homeowner, 'GET', `/api/jobs/${job.id}`)).status).toBe(404);
	});

	test.each([
		['no name', { name: '' }, 'name', /give the job a name/i],
		['an overlong name', { name: 'n'.repeat(201) }, 'name', /at most 200/i],
		['an unknown edition', { codeEdition: '2014' }, 'codeEdition', /2017, 2020 or 2023/],
		['a non-standard service rating', { serviceRatingA: 210 }, 'serviceRatingA', /240\.6\(A\)/],
		['an unknown voltage system', { voltageSystem: '480V' }, 'voltageSystem', /not a voltage system/],
		[
			'a malformed homeowner e-mail',
			{ homeownerEmail: 'odalys-at-home' },
			'homeownerEmail',
			/e-mail address/,
		],
		['a status (the workflow sets it)', { status: 'approved' }, '_', /status/],
		['a permit number (issued on approval)', { permitNumber: 'E2026-00001' }, '_', /permitNumber/],
		['a jurisdiction that is not an id', { jurisdictionId: 'Quillmere' }, 'jurisdictionId', /./],
		['a negative measured peak', { existingPeakDemandKW: -3 }, 'existingPeakDemandKW', /more than 0 kW/],
		['an unknown field', { colour: 'blue' }, '_', /colour/],
	])('refuses %s with a message on the field and writes nothing', async (_what, change, field, message) => {
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', '/api/jobs', newJob(change));
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('validation');
		expect(res.body.error.fields?.[field]?.join(' ')).toMatch(message);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('refuses an unknown jurisdiction on the jurisdiction field', async () => {
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(
			owner,
			'POST',
			'/api/jobs',
			newJob({ jurisdictionId: '00000000-0000-4000-8000-000000000000' }),
		);
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.jurisdictionId).toEqual(['no such jurisdiction']);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('refuses a body that is not JSON', async () => {
		const res = await call<ErrorBody>(owner, 'POST', '/api/jobs', '{not json');
		expect(res.status).toBe(400);
	});

	test('asks the signed-out to sign in', async () => {
		expect((await call(new HttpClient(), 'POST', '/api/jobs', newJob())).status).toBe(401);
	});

	test.each([['homeowner'], ['inspector']] as const)(
		'refuses a %s (no contractor role) with 403',
		async (who) => {
			const client = who === 'homeowner' ? homeowner : inspector;
			const before = await jobTableCounts(db);
			expect((await call(client, 'POST', '/api/jobs', newJob())).status).toBe(403);
			expect(await jobTableCounts(db)).toEqual(before);
		},
	);

	test('refuses a firm the contractor does not belong to', async () => {
		const res = await call(owner, 'POST', '/api/jobs', newJob({ firmId: other.firmId }));
		expect(res.status).toBe(403);
	});
});

describe('listing jobs', () => {
	test('lists the firm’s jobs with search, status filter, sort and pages', async () => {
		const tag = uniq();
		const a = await createJob(owner, { name: `Alpha ${tag}` });
		const b = await createJob(electrician, { name: `Beta ${tag}` });
		// Only the workflow moves a status; set one directly to try the filter.
		await db('jobs').where({ id: a.id }).update({ status: 'submitted' });
		const all = await call(owner, 'GET', `/api/jobs?q=${tag}&sort=name`);
		expect(all.status).toBe(200);
		expect(all.body.total).toBe(2);
		expect(all.body.items.map((j: { id: string }) => j.id)).toEqual([a.id, b.id]);
		const submitted = await call(owner, 'GET', `/api/jobs?q=${tag}&status=submitted`);
		expect(submitted.body.items.map((j: { id: string }) => j.id)).toEqual([a.id]);
		const page2 = await call(owner, 'GET', `/api/jobs?q=${tag}&sort=name&page=2&pageSize=1`);
		expect(page2.body).toMatchObject({ total: 2, page: 2, pageSize: 1 });
		expect(page2.body.items.map((j: { id: string }) => j.id)).toEqual([b.id]);
	});

	test('shows another firm none of them, and a homeowner only their home’s', async () => {
		const mine = await call(owner, 'GET', '/api/jobs?pageSize=100');
		expect(mine.body.items.some((j: { id: string }) => j.id === demoJobId)).toBe(true);
		const theirs = await call(other.client, 'GET', '/api/jobs');
		expect(theirs.body.total).toBe(0);
		const home = await call(homeowner, 'GET', '/api/jobs');
		expect(home.body.items.map((j: { id: string }) => j.id)).toEqual([demoJobId]);
	});

	test.each([
		['an unknown status', 'status=finished', 'status'],
		['an unknown sort', 'sort=colour', 'sort'],
		['page 0', 'page=0', 'page'],
		['a page size over 100', 'pageSize=500', 'pageSize'],
	])('refuses %s', async (_what, query, field) => {
		const res = await call<ErrorBody>(owner, 'GET', `/api/jobs?${query}`);
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.[field]).toBeDefined();
	});

	test('asks the signed-out to sign in', async () => {
		expect((await call(new HttpClient(), 'GET', '/api/jobs')).status).toBe(401);
	});
});

describe('reading, changing and deleting a job', () => {
	test('lets the firm read it, its homeowner read it, and hides it from everyone else', async () => {
		expect((await call(owner, 'GET', `/api/jobs/${demoJobId}`)).body.job.homeownerName).toBe(
			DEMO_ACCOUNTS.homeowner.name,
		);
		expect((await call(homeowner, 'GET', `/api/jobs/${demoJobId}`)).status).toBe(200);
		expect((await call(homeowner2, 'GET', `/api/jobs/${demoJobId}`)).status).toBe(404);
		expect((await call(inspector, 'GET', `/api/jobs/${demoJobId}`)).status).toBe(404);
		expect((await call(other.client, 'GET', `/api/jobs/${demoJobId}`)).status).toBe(404);
		expect((await call(owner, 'GET', '/api/jobs/00000000-0000-4000-8000-000000000000')).status).toBe(404);
		expect((await call(owner, 'GET', '/api/jobs/not-an-id')).status).toBe(404);
		expect((await call(new HttpClient(), 'GET', `/api/jobs/${demoJobId}`)).status).toBe(401);
	});

	test('changes the fields sent, bumps the version and writes the audit row', async () => {
		const job = await createJob();
		const res = await call(owner, 'PATCH', `/api/jobs/${job.id}`, {
			version: 1,
			scopeOfWork: 'Add a 20 A laundry circuit',
			homeownerName: 'Odalys Penhallow',
		});
		expect(res.status).toBe(200);
		expect(res.body.job).toMatchObject({
			scopeOfWork: 'Add a 20 A laundry circuit',
			homeownerName: 'Odalys Penhallow',
			status: 'draft',
			version: 2,
			name: job.name,
		});
		const audit = await db('audit_log').where({ entity_id: job.id, action: 'update' }).first();
		expect(audit.before.scopeOfWork).toBe('');
		expect(audit.after.scopeOfWork).toBe('Add a 20 A laundry circuit');
	});

	test.each([
		['a status', { status: 'approved' }, /status/],
		['a permit number', { permitNumber: 'E2026-00001' }, /permitNumber/],
		['a status beside a real change', { status: 'closed', name: 'Renamed' }, /status/],
	])(
		'refuses a change that sets %s (the server owns it) and writes nothing',
		async (_what, change, message) => {
			const job = await createJob();
			const before = await db('jobs').where({ id: job.id }).first();
			const res = await call<ErrorBody>(owner, 'PATCH', `/api/jobs/${job.id}`, { version: 1, ...change });
			expect(res.status).toBe(400);
			expect(res.body.error.fields?._?.join(' ')).toMatch(message);
			expect(await db('jobs').where({ id: job.id }).first()).toEqual(before);
			expect(await db('audit_log').where({ entity_id: job.id, action: 'update' })).toEqual([]);
		},
	);

	test('sets the jurisdiction by id and answers with its name', async () => {
		const job = await createJob();
		const j = await db('jurisdictions').orderBy('name').first('id', 'name');
		const res = await call(owner, 'PATCH', `/api/jobs/${job.id}`, { version: 1, jurisdictionId: j.id });
		expect(res.status).toBe(200);
		expect(res.body.job).toMatchObject({ jurisdictionId: j.id, jurisdictionName: j.name });
	});

	test('refuses a stale version with 409 and the current job, changing nothing', async () => {
		const job = await createJob();
		await call(owner, 'PATCH', `/api/jobs/${job.id}`, { version: 1, scopeOfWork: 'First edit' });
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'PATCH', `/api/jobs/${job.id}`, {
			version: 1,
			scopeOfWork: 'Second edit',
		});
		expect(res.status).toBe(409);
		expect(res.body.error.current).toMatchObject({ id: job.id, version: 2, scopeOfWork: 'First edit' });
		expect((await db('jobs').where({ id: job.id }).first()).scope_of_work).toBe('First edit');
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test.each([
		['no version', { name: 'x' }, 'version'],
		['an empty name', { version: 1, name: '' }, 'name'],
		['an unknown edition', { version: 1, codeEdition: '1999' }, 'codeEdition'],
	])('refuses a change with %s', async (_what, body, field) => {
		const job = await createJob();
		const res = await call<ErrorBody>(owner, 'PATCH', `/api/jobs/${job.id}`, body);
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.[field]).toBeDefined();
		expect((await db('jobs').where({ id: job.id }).first()).version).toBe(1);
	});

	test('refuses writes from the homeowner (403) and other firms (404)', async () => {
		const row = await db('jobs').where({ id: demoJobId }).first('version', 'name');
		expect(
			(await call(homeowner, 'PATCH', `/api/jobs/${demoJobId}`, { version: row.version, name: 'Mine now' }))
				.status,
		).toBe(403);
		expect((await call(homeowner, 'DELETE', `/api/jobs/${demoJobId}`, { version: row.version })).status).toBe(
			403,
		);
		expect(
			(await call(other.client, 'PATCH', `/api/jobs/${demoJobId}`, { version: row.version, name: 'Ours' }))
				.status,
		).toBe(404);
		expect(await db('jobs').where({ id: demoJobId }).first('version', 'name')).toEqual(row);
	});

	test('soft-deletes with the right version; the job then answers 404 everywhere', async () => {
		const job = await createJob();
		expect((await call(owner, 'DELETE', `/api/jobs/${job.id}`, { version: 2 })).status).toBe(409);
		const res = await call(owner, 'DELETE', `/api/jobs/${job.id}`, { version: 1 });
		expect(res.status).toBe(200);
		const row = await db('jobs').where({ id: job.id }).first();
		expect(row.deleted_at).not.toBeNull();
		expect((await call(owner, 'GET', `/api/jobs/${job.id}`)).status).toBe(404);
		expect((await call(owner, 'GET', `/api/jobs/${job.id}/tree`)).status).toBe(404);
		expect((await db('audit_log').where({ entity_id: job.id, action: 'delete' })).length).toBe(1);
	});
});

describe('the job tree', () => {
	test('returns every record and the engine’s results for the job document built from them', async () => {
		const res = await call(homeowner, 'GET', `/api/jobs/${demoJobId}/tree`);
		expect(res.status).toBe(200);
		expect(res.body.rooms).toHaveLength(DEMO_JOB_DOCUMENT.rooms!.length);
		expect(res.body.panels).toHaveLength(2);
		expect(res.body.circuits).toHaveLength(DEMO_JOB_DOCUMENT.circuits!.length);
		expect(res.body.loads).toHaveLength(DEMO_JOB_DOCUMENT.loads!.length);
		expect(res.body.engine.ok).toBe(true);

		const exported = await call(owner, 'GET', `/api/jobs/${demoJobId}/export`);
		const parsed = parseJobDocument(exported.body);
		expect(parsed.ok).toBe(true);
		const direct = computeJob((parsed as { ok: true; doc: never }).doc);
		expect(res.body.engine.results.service).toEqual(JSON.parse(JSON.stringify(direct.service)));
		expect(res.body.engine.results.summary).toEqual(direct.summary);

		// Eight 12 W fixtures on the new kitchen circuit: 8 × 12 = 96 VA (watts taken as VA).
		const kitchen = res.body.circuits.find((c: { label: string }) => c.label === 'Kitchen recessed lights');
		const result = res.body.engine.results.circuits.find(
			(c: { circuitId: string }) => c.circuitId === kitchen.id,
		);
		expect(result.connectedVA.value).toBe(96);
	});

	test('shows the demo’s overloaded circuit and its bedroom circuit without AFCI as violations', async () => {
		const res = await call(owner, 'GET', `/api/jobs/${demoJobId}/tree`);
		const codes = res.body.engine.results.findings
			.filter((f: { severity: string }) => f.severity === 'violation')
			.map((f: { code: string }) => f.code)
			.sort();
		expect(codes).toEqual(['afci-required', 'breaker-overload']);
	});

	test('says what is missing when the job has no panel yet', async () => {
		const job = await createJob();
		const res = await call(owner, 'GET', `/api/jobs/${job.id}/tree`);
		expect(res.status).toBe(200);
		expect(res.body.engine.ok).toBe(false);
		expect(res.body.engine.errors.join(' ')).toMatch(/panel/);
	});

	test('is hidden from other firms and inspectors', async () => {
		expect((await call(other.client, 'GET', `/api/jobs/${demoJobId}/tree`)).status).toBe(404);
		expect((await call(inspector, 'GET', `/api/jobs/${demoJobId}/tree`)).status).toBe(404);
		expect((await call(new HttpClient(), 'GET', `/api/jobs/${demoJobId}/tree`)).status).toBe(401);
	});
});

describe('export and import', () => {
	test('exports the job document and imports it back as a new job with the same records', async () => {
		const exported = await owner.fetch(`/api/jobs/${demoJobId}/export`);
		expect(exported.headers.get('content-disposition')).toMatch(/attachment; filename=".+\.json"/);
		const doc = await exported.json();
		expect(doc.formatVersion).toBe(1);
		const res = await call(owner, 'POST', '/api/jobs/import', doc);
		expect(res.status).toBe(201);
		created.push(res.body.job.id);
		expect(res.body.counts).toEqual({ rooms: 16, panels: 2, circuits: 34, loads: 34 });
		const again = await call(owner, 'GET', `/api/jobs/${res.body.job.id}/export`);
		const strip = (d: typeof doc) =>
			JSON.parse(JSON.stringify(d).replace(/[0-9a-f]{8}-[0-9a-f-]{27}/g, 'ID'));
		expect(strip(again.body)).toEqual(strip(doc));
		expect((await db('audit_log').where({ entity_id: res.body.job.id, action: 'import' })).length).toBe(1);
	});

	test.each([
		[
			'an unknown conductor size',
			(d: any) => (d.circuits[3].conductor.size = '5'),
			'circuits.3.conductor.size',
			/not a conductor size/,
		],
		['a load without a rating', (d: any) => delete d.loads[5].va, 'loads.5.va', /give the rating/],
		[
			'a circuit in an unknown panel',
			(d: any) => (d.circuits[0].panelId = 'nowhere'),
			'circuits.0.panelId',
			/no panel/,
		],
		[
			'two breakers in one position',
			(d: any) => (d.circuits[7].position = d.circuits[6].position),
			'circuits.7.position',
			/already taken/,
		],
		[
			'a breaker beyond the spaces',
			(d: any) => (d.circuits[27].position = 41),
			'circuits.27.position',
			/does not fit/,
		],
		['no panels', (d: any) => (d.panels = []), 'panels', /at least one panel/],
	])(
		'refuses a document with %s, naming the path, and writes nothing',
		async (_what, spoil, path, message) => {
			const doc = structuredClone(DEMO_JOB_DOCUMENT) as any;
			spoil(doc);
			const before = await jobTableCounts(db);
			const res = await call<ErrorBody>(owner, 'POST', '/api/jobs/import', doc);
			expect(res.status).toBe(400);
			expect(res.body.error.fields?.[path]?.join(' ')).toMatch(message);
			expect(await jobTableCounts(db)).toEqual(before);
		},
	);

	test('writes none of the records before a bad last record', async () => {
		const doc = structuredClone(DEMO_JOB_DOCUMENT) as any;
		doc.loads[doc.loads.length - 1].voltage = 240;
		const before = await jobTableCounts(db);
		const res = await call<ErrorBody>(owner, 'POST', '/api/jobs/import', doc);
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields ?? {})).toEqual([`loads.${doc.loads.length - 1}.voltage`]);
		expect(await jobTableCounts(db)).toEqual(before);
	});

	test('refuses import for the homeowner (403) and the signed-out (401)', async () => {
		expect((await call(homeowner, 'POST', '/api/jobs/import', DEMO_JOB_DOCUMENT)).status).toBe(403);
		expect((await call(new HttpClient(), 'POST', '/api/jobs/import', DEMO_JOB_DOCUMENT)).status).toBe(401);
	});

	test('hides the export from other firms', async () => {
		expect((await call(other.client, 'GET', `/api/jobs/${demoJobId}/export`)).status).toBe(404);
	});
});

describe('the audit trail', () => {
	test('lists the job’s changes newest first, with who made them, for the firm only', async () => {
		const job = await createJob(electrician);
		await call(owner, 'PATCH', `/api/jobs/${job.id}`, { version: 1, name: 'Renamed' });
		const res = await call(owner, 'GET', `/api/jobs/${job.id}/audit`);
		expect(res.status).toBe(200);
		expect(res.body.total).toBe(2);
		expect(res.body.items.map((e: { action: string; userName: string }) => [e.action, e.userName])).toEqual([
			['update', DEMO_ACCOUNTS.owner.name],
			['create', DEMO_ACCOUNTS.electrician.name],
		]);
		expect((await call(homeowner, 'GET', `/api/jobs/${demoJobId}/audit`)).status).toBe(403);
		expect((await call(other.client, 'GET', `/api/jobs/${job.id}/audit`)).status).toBe(404);
	});
});
