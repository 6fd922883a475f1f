import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, removeJobs } from '../helpers/jobs';
import {
	commentOn,
	newJurisdictionWithInspector,
	removeJurisdiction,
	submittedJob,
} from '../helpers/workflow';

const db = testDb();
type Staff = Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let staff: Staff;
let owner: HttpClient;
let homeowner: HttpClient;
let homeowner2: HttpClient;
let admin: HttpClient;
let propertyId: string;
let approved: { id: string; name: string };
let inReview: { id: string; name: string };
let commentId: string;
let inspectionId: string;
let itemId: string;
let requestedId: string;
const created: string[] = [];

const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

beforeAll(async () => {
	[owner, homeowner, homeowner2, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('homeowner2'),
		signedInAs('admin'),
	]);
	staff = await newJurisdictionWithInspector(db);
	await db('jurisdictions').where({ id: staff.jurisdictionId }).update({
		fee_base_cents: 5_000,
		fee_per_circuit_cents: 1_000,
		fee_per_panel_cents: 2_000,
		fee_service_change_cents: 10_000,
	});
	approved = await submittedJob(db, owner, staff.jurisdictionId, {
		status: 'rough-in-failed',
		address: DEMO_PROPERTIES.penhallow,
	});
	inReview = await submittedJob(db, owner, staff.jurisdictionId, {
		status: 'submitted',
		address: DEMO_PROPERTIES.penhallow,
	});
	const started = await call(staff.client, 'POST', `/api/jobs/${inReview.id}/transitions`, {
		action: 'start-review',
	});
	if (started.status !== 200) throw new Error(`start-review failed: ${started.status}`);
	created.push(approved.id, inReview.id);
	await db('jobs').where({ id: approved.id }).update({ permit_number: 'BV-2026-00077' });
	propertyId = (await db('jobs').where({ id: approved.id }).first('property_id')).property_id;
	commentId = (await commentOn(staff.client, inReview.id, { body: 'Label the garage subpanel feeder.' })).id;
	// An inspection that failed, with an open correction item, as the inspector would have recorded it.
	const [insp] = await db('inspections')
		.insert({
			job_id: approved.id,
			kind: 'rough-in',
			status: 'failed',
			preferred_dates: JSON.stringify([inDays(3)]),
			scheduled_for: inDays(3),
			result_notes: 'Box fill over the limit in the hall.',
			recorded_by: staff.userId,
			recorded_at: new Date(),
		})
		.returning('id');
	inspectionId = insp.id;
	const [item] = await db('inspection_items')
		.insert({
			inspection_id: inspectionId,
			job_id: approved.id,
			body: 'Replace the hall box with a deeper one.',
		})
		.returning('id');
	itemId = item.id;
	const [requested] = await db('inspections')
		.insert({
			job_id: approved.id,
			kind: 'final',
			status: 'requested',
			preferred_dates: JSON.stringify([inDays(4)]),
		})
		.returning('id');
	requestedId = requested.id;
});

afterAll(async () => {
	await removeJobs(db, created);
	await removeJurisdiction(db, staff);
	await db.destroy();
});

describe('the homeowner’s home page', () => {
	test('shows each job’s permit status and permit number', async () => {
		const res = await homeowner.fetch(`/homeowner/homes/${propertyId}`);
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Permits and inspections');
		expect(html).toContain('Rough-in failed');
		expect(html).toContain('BV-2026-00077');
		expect(html).toContain('In plan review');
	});

	test('reads the inspection results of a job at the home', async () => {
		const res = await call(homeowner, 'GET', `/api/jobs/${approved.id}/inspections`);
		expect(res.status).toBe(200);
		expect(res.body.inspections[0]).toMatchObject({ kind: 'rough-in', status: 'failed' });
		expect(JSON.stringify(res.body.inspections[0])).toContain('Box fill over the limit in the hall.');
	});

	test.each([
		['another homeowner', () => homeowner2, 404],
		['a contractor', () => owner, 403],
		['an inspector', () => staff.client, 403],
		['an administrator without a home', () => admin, 403],
	])('answers %s with %i', async (_who, client, status) => {
		expect((await client().fetch(`/homeowner/homes/${propertyId}`)).status).toBe(status);
	});

	test('sends a signed-out visitor to sign in', async () => {
		const res = await new HttpClient().fetch(`/homeowner/homes/${propertyId}`);
		expect(res.status).toBe(302);
	});
});

describe('the administrator’s list of every job', () => {
	test('lists jobs of every firm with firm, jurisdiction, status and revision', async () => {
		const res = await admin.fetch('/admin/jobs?status=rough-in-failed');
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain(approved.name);
		const jurisdiction = await db('jurisdictions').where({ id: staff.jurisdictionId }).first('name');
		expect(html).toContain(jurisdiction.name);
		expect(html).toContain('Rough-in failed');
		expect(html).toContain('BV-2026-00077');
		expect(html).not.toContain(inReview.name);
	});

	test('filters by status', async () => {
		const html = await (await admin.fetch('/admin/jobs?status=in-review')).text();
		expect(html).toContain(inReview.name);
		expect(html).not.toContain(approved.name);
	});

	test.each([
		['a contractor', () => owner, 403],
		['a homeowner', () => homeowner, 403],
		['an inspector', () => staff.client, 403],
	])('answers %s with %i', async (_who, client, status) => {
		expect((await client().fetch('/admin/jobs')).status).toBe(status);
		expect((await client().fetch(`/admin/jobs/${approved.id}`)).status).toBe(status);
	});

	test('sends a signed-out visitor to sign in', async () => {
		expect((await new HttpClient().fetch('/admin/jobs')).status).toBe(302);
	});
});

describe('the administrator’s read-only job page', () => {
	test('shows the details, the status, the submitted revisions with their packets', async () => {
		const res = await admin.fetch(`/admin/jobs/${approved.id}`);
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Rough-in failed');
		expect(html).toContain('BV-2026-00077');
		expect(html).toContain(`/api/jobs/${approved.id}/revisions/1/packet.pdf`);
		expect(html).not.toMatch(/<form[^>]*method="post"/i);
	});

	test('itemises the permit fee by the jurisdiction’s schedule', async () => {
		const html = await (await admin.fetch(`/admin/jobs/${approved.id}`)).text();
		const fee = html.slice(html.indexOf('data-testid="admin-job-fee"'));
		// Hand: 50.00 + 2 new circuits × 10.00 + 1 panel × 20.00 + service change 100.00 = 190.00.
		expect(fee).toMatch(/2 × \$10\.00/);
		expect(fee).toMatch(/Total[\s\S]*\$190\.00/);
	});

	test('shows the status moves as a timeline', async () => {
		const html = await (await admin.fetch(`/admin/jobs/${inReview.id}`)).text();
		expect(html).toContain('data-testid="timeline"');
		expect(html).toContain('In plan review');
		expect(html).toContain(staff.name);
	});

	test('lists the review comments read-only', async () => {
		const html = await (await admin.fetch(`/admin/jobs/${inReview.id}`)).text();
		expect(html).toMatch(
			/#1<\/strong>[\s\S]*Whole job[\s\S]*<strong>Open<\/strong>[\s\S]*Label the garage subpanel feeder\./,
		);
	});

	test('opens the stored packet of a revision', async () => {
		const res = await admin.fetch(`/api/jobs/${approved.id}/revisions/1/packet.pdf`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('application/pdf');
	});

	test('answers 404 for a job that does not exist', async () => {
		expect((await admin.fetch(`/admin/jobs/${crypto.randomUUID()}`)).status).toBe(404);
		expect((await admin.fetch('/admin/jobs/not-a-job')).status).toBe(404);
	});
});

describe('the administrator changes nothing in the workflow', () => {
	/** Every workflow table and the two jobs' status, to prove a refused write changed nothing. */
	async function snapshot() {
		const counts: Record<string, number> = {};
		for (const t of [
			'job_revisions',
			'review_comments',
			'review_comment_entries',
			'inspections',
			'inspection_items',
			'inspection_photos',
			'audit_log',
			'permit_counters',
		])
			counts[t] = Number((await db(t).count({ n: '*' }))[0]!.n);
		const jobs = await db('jobs')
			.whereIn('id', [approved.id, inReview.id])
			.orderBy('id')
			.select('id', 'status', 'permit_number', 'current_revision', 'assigned_inspector_id', 'version');
		const items = await db('inspection_items').where({ id: itemId }).select('status', 'answer', 'version');
		const insp = await db('inspections')
			.whereIn('id', [inspectionId, requestedId])
			.orderBy('id')
			.select('status', 'scheduled_for', 'version');
		const comment = await db('review_comments').where({ id: commentId }).select('status', 'version');
		return { counts, jobs, items, insp, comment };
	}

	test.each([
		[
			'submit a revision',
			'POST',
			() => `/api/jobs/${inReview.id}/submissions`,
			{ explanations: [], note: '' },
		],
		['start a review', 'POST', () => `/api/jobs/${inReview.id}/transitions`, { action: 'start-review' }],
		['withdraw a job', 'POST', () => `/api/jobs/${inReview.id}/transitions`, { action: 'withdraw' }],
		['close a job', 'POST', () => `/api/jobs/${approved.id}/transitions`, { action: 'close' }],
		['take a review', 'POST', () => `/api/jobs/${inReview.id}/assign`, {}],
		[
			'write a review comment',
			'POST',
			() => `/api/jobs/${inReview.id}/comments`,
			{ targetKind: 'job', body: 'x' },
		],
		[
			'answer a comment',
			'POST',
			() => `/api/comments/${commentId}/entries`,
			{ action: 'reply', body: 'Done.' },
		],
		['resolve a comment', 'POST', () => `/api/comments/${commentId}/entries`, { action: 'resolved' }],
		['approve a job', 'POST', () => `/api/jobs/${inReview.id}/decision`, { decision: 'approve' }],
		[
			'request corrections',
			'POST',
			() => `/api/jobs/${inReview.id}/decision`,
			{ decision: 'request-corrections' },
		],
		[
			'request an inspection',
			'POST',
			() => `/api/jobs/${approved.id}/inspections`,
			{ kind: 'final', preferredDates: [inDays(5)] },
		],
		['schedule an inspection', 'PATCH', () => `/api/inspections/${requestedId}`, { scheduledFor: inDays(6) }],
		['cancel an inspection request', 'POST', () => `/api/inspections/${requestedId}/cancel`, {}],
		['record a result', 'POST', () => `/api/inspections/${inspectionId}/result`, { result: 'pass' }],
		[
			'answer a correction item',
			'POST',
			() => `/api/inspection-items/${itemId}/answer`,
			{ answer: 'Deeper box set.' },
		],
		[
			'change the job',
			'PATCH',
			() => `/api/jobs/${inReview.id}`,
			{ version: 1, name: 'Renamed by the administrator' },
		],
		['delete the job', 'DELETE', () => `/api/jobs/${inReview.id}`, { version: 1 }],
	])('refuses to %s (403 or 404) and writes nothing', async (_what, method, path, body) => {
		const before = await snapshot();
		const res = await call(admin, method, path(), body);
		expect([403, 404]).toContain(res.status);
		expect(await snapshot()).toEqual(before);
	});

	test('refuses to upload an inspection photo', async () => {
		const before = await snapshot();
		const form = new FormData();
		form.append(
			'photos',
			new Blob([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], { type: 'image/png' }),
			'box.png',
		);
		const res = await admin.fetch(`/api/inspections/${inspectionId}/photos`, { method: 'POST', body: form });
		expect([403, 404]).toContain(res.status);
		expect(await snapshot()).toEqual(before);
	});
});
