import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, otherFirmOwner, removeJobs, removeOtherFirm } from '../helpers/jobs';
import {
	newJurisdictionWithInspector,
	removeJurisdiction,
	storeRevision,
	submittedJob,
} from '../helpers/workflow';

const db = testDb();
const created: string[] = [];
let owner: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let mine: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let elsewhere: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;

const DAY = 86_400_000;

beforeAll(async () => {
	[owner, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('admin'),
	]);
	other = await otherFirmOwner();
	mine = await newJurisdictionWithInspector(db);
	elsewhere = await newJurisdictionWithInspector(db);
});

afterAll(async () => {
	await removeJobs(db, created);
	await removeJurisdiction(db, mine);
	await removeJurisdiction(db, elsewhere);
	await removeOtherFirm(db, other);
	await db.destroy();
});

async function job(jurisdictionId: string, options: Parameters<typeof submittedJob>[3] = {}) {
	const j = await submittedJob(db, owner, jurisdictionId, options);
	created.push(j.id);
	return j;
}

describe('the inspector queue', () => {
	test('lists only jobs submitted to the inspector’s jurisdictions, oldest submission first, with days waiting counted from the submission', async () => {
		const now = Date.now();
		const newer = await job(mine.jurisdictionId, { submittedAt: new Date(now - 2 * DAY - 3600_000) });
		const oldest = await job(mine.jurisdictionId, {
			submittedAt: new Date(now - 9 * DAY - 3600_000),
			status: 'in-review',
		});
		const theirs = await job(elsewhere.jurisdictionId, { submittedAt: new Date(now - 20 * DAY) });
		// A draft of the same jurisdiction was never sent: it stays out.
		const draft = await job(mine.jurisdictionId);
		await db('jobs')
			.where({ id: draft.id })
			.update({ status: 'draft', current_revision: 0, submitted_at: null });
		// An edit after submission changes updated_at, not the days waiting.
		await db('jobs').where({ id: oldest.id }).update({ updated_at: new Date() });

		const res = await call(mine.client, 'GET', '/api/inspector/queue');
		expect(res.status).toBe(200);
		const ids = res.body.items.map((i: { jobId: string }) => i.jobId);
		expect(ids).toEqual([oldest.id, newer.id]);
		expect(ids).not.toContain(theirs.id);
		expect(res.body.items[0]).toMatchObject({
			daysWaiting: 9,
			revision: 1,
			status: 'in-review',
			firmName: 'Tallowmere Electric Co.',
		});
		expect(res.body.items[1].daysWaiting).toBe(2);
		expect(res.body.total).toBe(2);

		const theirsQueue = await call(elsewhere.client, 'GET', '/api/inspector/queue');
		expect(theirsQueue.body.items.map((i: { jobId: string }) => i.jobId)).toEqual([theirs.id]);
	});

	test('filters by status', async () => {
		const res = await call(mine.client, 'GET', '/api/inspector/queue?status=in-review');
		expect(res.status).toBe(200);
		expect(res.body.items.length).toBeGreaterThan(0);
		expect(res.body.items.every((i: { status: string }) => i.status === 'in-review')).toBe(true);
		const submitted = await call(mine.client, 'GET', '/api/inspector/queue?status=submitted');
		expect(submitted.body.items.every((i: { status: string }) => i.status === 'submitted')).toBe(true);
		expect(submitted.body.items.length).toBeGreaterThan(0);
	});

	test.each([
		['an unknown status', '?status=pending'],
		['a draft (never in the queue)', '?status=draft'],
		['page 0', '?page=0'],
		['a page that is not a number', '?page=two'],
		['an unknown parameter', '?sort=newest'],
	])('refuses %s with a field message', async (_, query) => {
		const res = await call(mine.client, 'GET', `/api/inspector/queue${query}`);
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('validation');
		expect(Object.keys(res.body.error.fields).length).toBeGreaterThan(0);
	});

	test.each([
		['a contractor', () => owner, 403],
		['a homeowner', () => homeowner, 403],
		['an administrator who is no inspector', () => admin, 403],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('is refused to %s', async (_, who, status) => {
		expect((await call(who(), 'GET', '/api/inspector/queue')).status).toBe(status);
	});
});

describe('assign to me', () => {
	test('takes a submitted job, moves it to plan review in the same transaction and writes the move to the audit log', async () => {
		const j = await job(mine.jurisdictionId);
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/assign`);
		expect(res.status).toBe(200);
		expect(res.body).toEqual({ status: 'in-review', assignedInspectorId: mine.userId });
		const row = await db('jobs').where({ id: j.id }).first('status', 'assigned_inspector_id');
		expect(row).toEqual({ status: 'in-review', assigned_inspector_id: mine.userId });
		const audit = await db('audit_log').where({ job_id: j.id, entity: 'status' }).first('before', 'after');
		expect(audit.before).toEqual({ status: 'submitted' });
		expect(audit.after).toMatchObject({ status: 'in-review', action: 'start-review' });

		const queue = await call(mine.client, 'GET', '/api/inspector/queue?status=in-review');
		const item = queue.body.items.find((i: { jobId: string }) => i.jobId === j.id);
		expect(item.assignedInspectorName).toBe(mine.name);
	});

	test('starts the review of a resubmission its reviewer already holds', async () => {
		const j = await job(mine.jurisdictionId, { status: 'resubmitted' });
		await db('jobs').where({ id: j.id }).update({ assigned_inspector_id: mine.userId });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/assign`);
		expect(res.status).toBe(200);
		expect(await db('jobs').where({ id: j.id }).first('status', 'assigned_inspector_id')).toEqual({
			status: 'in-review',
			assigned_inspector_id: mine.userId,
		});
	});

	test('takes over a job already in review without a second move', async () => {
		const j = await job(mine.jurisdictionId, { status: 'in-review' });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/assign`);
		expect(res.status).toBe(200);
		expect(res.body.status).toBe('in-review');
		expect(await db('audit_log').where({ job_id: j.id, entity: 'status' }).count({ n: '*' })).toEqual([
			{ n: '0' },
		]);
		expect((await db('jobs').where({ id: j.id }).first('assigned_inspector_id')).assigned_inspector_id).toBe(
			mine.userId,
		);
	});

	test('refuses a job that is not waiting for review (409) and changes nothing', async () => {
		const j = await job(mine.jurisdictionId, { status: 'approved' });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/assign`);
		expect(res.status).toBe(409);
		expect(res.body.error.current.status).toBe('approved');
		expect(await db('jobs').where({ id: j.id }).first('status', 'assigned_inspector_id')).toEqual({
			status: 'approved',
			assigned_inspector_id: null,
		});
	});

	test.each([
		['the job’s own contractor', () => owner, 403],
		['a contractor of another firm', () => other.client, 404],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['the homeowner of the property', () => homeowner, 403],
		['an administrator (reads, changes nothing)', () => admin, 403],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('is refused to %s and changes nothing', async (_, who, status) => {
		const j = await job(mine.jurisdictionId, { address: DEMO_PROPERTIES.penhallow });
		const res = await call(who(), 'POST', `/api/jobs/${j.id}/assign`);
		expect(res.status).toBe(status);
		expect(await db('jobs').where({ id: j.id }).first('status', 'assigned_inspector_id')).toEqual({
			status: 'submitted',
			assigned_inspector_id: null,
		});
	});
});

describe('the review screen page', () => {
	test('shows the jurisdiction’s inspector the revision asked for, and the latest by default', async () => {
		const j = await job(mine.jurisdictionId, { status: 'in-review', note: 'First go.' });
		await storeRevision(db, j.id, 2, { note: 'Second go, kitchen circuit changed.' });
		await db('jobs').where({ id: j.id }).update({ current_revision: 2 });
		const latest = await mine.client.fetch(`/inspector/jobs/${j.id}`);
		expect(latest.status).toBe(200);
		const html = await latest.text();
		expect(html).toContain('data-revision="2"');
		expect(html).toContain('Second go, kitchen circuit changed.');
		const first = await (await mine.client.fetch(`/inspector/jobs/${j.id}?revision=1`)).text();
		expect(first).toContain('data-revision="1"');
		expect(first).toContain('First go.');
		expect((await mine.client.fetch(`/inspector/jobs/${j.id}?revision=3`)).status).toBe(404);
	});

	test.each([
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['the job’s own contractor (no inspector)', () => owner, 403],
		['the homeowner of the property', () => homeowner, 403],
		['an administrator who is no inspector', () => admin, 403],
	])('is refused to %s (%i)', async (_, who, status) => {
		const j = await job(mine.jurisdictionId, { address: DEMO_PROPERTIES.penhallow });
		const res = await who().fetch(`/inspector/jobs/${j.id}`);
		expect(res.status).toBe(status);
		expect(await res.text()).not.toContain(j.name);
	});

	test('sends a signed-out visitor to sign in', async () => {
		const j = await job(mine.jurisdictionId);
		const res = await new HttpClient().fetch(`/inspector/jobs/${j.id}`);
		expect([302, 303]).toContain(res.status);
		expect(res.headers.get('location')).toContain('/sign-in');
	});
});
