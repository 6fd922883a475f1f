/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JURISDICTION, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import type { JobStatus } from '../../src/lib/workflow/status';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, otherFirmOwner, removeJobs } from '../helpers/jobs';
import { newJurisdictionWithInspector, removeJurisdiction, submittedJob } from '../helpers/workflow';

const db = testDb();
const uploads = process.env.UPLOADS_DIR!;
const incoming = path.join(uploads, '.incoming');
const list = (dir: string) => (fs.existsSync(dir) ? fs.readdirSync(dir).sort() : []);
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

type Who =
	| 'otherHomeowner'
	| 'owner'
	| 'electrician'
	| 'inspector'
	| 'homeowner'
	| 'admin'
	| 'otherFirm'
	| 'otherInspector'
	| 'signedOut';
const clients = {} as Record<Who, HttpClient>;
let demoJurisdictionId: string;
let other: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let otherFirm: Awaited<ReturnType<typeof otherFirmOwner>>;
const jobIds: string[] = [];
let png: Buffer;
let jpeg: Buffer;

/** A date `days` from today, as the forms send it. */
const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** A job of the demo firm at the demo homeowner's house, submitted to the demo jurisdiction, at a status. */
async function jobAt(status: JobStatus) {
	const job = await submittedJob(db, clients.owner, demoJurisdictionId, {
		status,
		address: DEMO_PROPERTIES.penhallow,
	});
	jobIds.push(job.id);
	return job.id;
}

const request = (who: Who, jobId: string, body: unknown) =>
	call(clients[who], 'POST', `/api/jobs/${jobId}/inspections`, body);
const roughIn = { kind: 'rough-in', preferredDates: [inDays(3), inDays(2)], note: 'Gate code 4471.' };

async function requested(jobId: string, kind = 'rough-in') {
	const res = await request('owner', jobId, { kind, preferredDates: [inDays(2)] });
	expect(res.status).toBe(201);
	return res.body.inspection.id as string;
}

async function scheduled(jobId: string, kind = 'rough-in') {
	const id = await requested(jobId, kind);
	const res = await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, { scheduledFor: inDays(4) });
	expect(res.status).toBe(200);
	return id;
}

/** What a refused write must leave as it was: the job's inspection rows, audit rows and status. */
async function snapshot(jobId: string) {
	const n = async (table: string) => Number((await db(table).where({ job_id: jobId }).count('* as n'))[0]!.n);
	return {
		inspections: await n('inspections'),
		items: await n('inspection_items'),
		photos: await n('inspection_photos'),
		audit: await n('audit_log'),
		status: (await db('jobs').where({ id: jobId }).first('status')).status,
		versions: await db('inspections').where({ job_id: jobId }).orderBy('seq').pluck('version'),
	};
}

function form(files: { name: string; type: string; bytes: Uint8Array }[], caption = ''): FormData {
	const body = new FormData();
	body.append('caption', caption);
	for (const f of files)
		body.append('files', new Blob([f.bytes as Uint8Array<ArrayBuffer>], { type: f.type }), f.name);
	return body;
}
async function uploadPhotos(
	who: Who,
	inspectionId: string,
	files: { name: string; type: string; bytes: Uint8Array }[],
) {
	const res = await clients[who].fetch(`/api/inspections/${inspectionId}/photos`, {
		method: 'POST',
		body: form(files, 'Panel interior'),
	});
	return { status: res.status, body: (await res.json()) as any };
}

beforeAll(async () => {
	demoJurisdictionId = (await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id')).id;
	[clients.owner, clients.electrician, clients.inspector, clients.homeowner, clients.admin] =
		await Promise.all([
			signedInAs('owner'),
			signedInAs('electrician'),
			signedInAs('inspector'),
			signedInAs('homeowner'),
			signedInAs('admin'),
		]);
	otherFirm = await otherFirmOwner();
	clients.otherFirm = otherFirm.client;
	other = await newJurisdictionWithInspector(db);
	clients.otherInspector = other.client;
	clients.signedOut = new HttpClient();
	clients.otherHomeowner = await signedInAs('homeowner2');
	const svg = (w: number, h: number) =>
		Buffer.from(
			`<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}"><rect width="100%" height="100%" fill="#ddd"/><circle cx="${w / 2}" cy="${h / 2}" r="${h / 3}" fill="#a52"/></svg>`,
		);
	png = await sharp(svg(900, 600)).png().toBuffer();
	jpeg = await sharp(svg(1200, 800)).jpeg({ quality: 80 }).toBuffer();
});

afterAll(async () => {
	for (const id of jobIds) fs.rmSync(path.join(uploads, id), { recursive: true, force: true });
	await removeJobs(db, jobIds);
	if (other) await removeJurisdiction(db, other);
	if (otherFirm) {
		await db('firms').where({ id: otherFirm.firmId }).delete();
		await db('users').where({ id: otherFirm.userId }).delete();
	}
	await db.destroy();
});

describe('requesting an inspection', () => {
	test('the contractor requests a rough-in inspection of an approved job; it is listed with its dates and audited', async () => {
		const jobId = await jobAt('approved');
		const res = await request('owner', jobId, roughIn);
		expect(res.status).toBe(201);
		expect(res.body.inspection).toMatchObject({
			kind: 'rough-in',
			status: 'requested',
			preferredDates: [inDays(2), inDays(3)],
			requestNote: 'Gate code 4471.',
			scheduledFor: null,
			items: [],
			photos: [],
		});
		const listed = await call(clients.owner, 'GET', `/api/jobs/${jobId}/inspections`);
		expect(listed.body.inspections.map((i: any) => i.id)).toEqual([res.body.inspection.id]);
		expect(listed.body.requestBlocks['rough-in']).toMatch(/already requested/);
		expect(listed.body.requestBlocks.final).toMatch(/after the rough-in inspection passed/);
		const audit = await db('audit_log').where({ job_id: jobId, entity: 'inspection', action: 'create' });
		expect(audit).toHaveLength(1);
		// Requesting an inspection does not move the job: only results do.
		expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('approved');
	});

	test.each([
		['no kind', { preferredDates: [inDays(2)] }, 'kind'],
		['an unknown kind', { kind: 'service', preferredDates: [inDays(2)] }, 'kind'],
		['no preferred date', { kind: 'rough-in', preferredDates: [] }, 'preferredDates'],
		[
			'four preferred dates',
			{ kind: 'rough-in', preferredDates: [1, 2, 3, 4].map(inDays) },
			'preferredDates',
		],
		['the same date twice', { kind: 'rough-in', preferredDates: [inDays(2), inDays(2)] }, 'preferredDates'],
		['a date in the past', { kind: 'rough-in', preferredDates: [inDays(-1)] }, 'preferredDates.0'],
		[
			'a date more than a year ahead',
			{ kind: 'rough-in', preferredDates: [inDays(370)] },
			'preferredDates.0',
		],
		['a date not on the calendar', { kind: 'rough-in', preferredDates: ['2027-02-30'] }, 'preferredDates.0'],
		['a date in another format', { kind: 'rough-in', preferredDates: ['12/03/2027'] }, 'preferredDates.0'],
		[
			'a note of 4,001 characters',
			{ kind: 'rough-in', preferredDates: [inDays(2)], note: 'x'.repeat(4001) },
			'note',
		],
		[
			'a field the form does not have',
			{ kind: 'rough-in', preferredDates: [inDays(2)], scheduledFor: inDays(2) },
			'_',
		],
	])(
		'a request with %s is refused with a message on the field and nothing is written',
		async (_n, body, field) => {
			const jobId = jobIds[0] ?? (await jobAt('approved'));
			const before = await snapshot(jobId);
			const res = await request('owner', jobId, body);
			expect(res.status).toBe(400);
			expect(res.body.error.code).toBe('validation');
			expect(Object.keys(res.body.error.fields)).toContain(field);
			expect(await snapshot(jobId)).toEqual(before);
		},
	);

	test.each([
		['in plan review', 'in-review', 'rough-in', /once the permit is approved/],
		['draft', 'draft', 'rough-in', /once the permit is approved/],
		['approved', 'approved', 'final', /after the rough-in inspection passed/],
		['rough-in passed', 'rough-in-passed', 'rough-in', /once the permit is approved/],
		['closed', 'closed', 'final', /after the rough-in inspection passed/],
	] as const)(
		'a job that is %s refuses a %s request with 409 and nothing is written',
		async (_n, status, kind, message) => {
			const jobId = await jobAt(status);
			const before = await snapshot(jobId);
			const res = await request('owner', jobId, { kind, preferredDates: [inDays(2)] });
			expect(res.status).toBe(409);
			expect(res.body.error.message).toMatch(message);
			expect(await snapshot(jobId)).toEqual(before);
		},
	);

	test('a second request of the same kind while one is open is refused', async () => {
		const jobId = await jobAt('approved');
		await requested(jobId);
		const before = await snapshot(jobId);
		const res = await request('electrician', jobId, { kind: 'rough-in', preferredDates: [inDays(5)] });
		expect(res.status).toBe(409);
		expect(res.body.error.message).toMatch(/already requested/);
		expect(await snapshot(jobId)).toEqual(before);
	});

	test('another member of the firm may request too', async () => {
		const jobId = await jobAt('approved');
		expect((await request('electrician', jobId, roughIn)).status).toBe(201);
	});

	test.each([
		['the inspector of the jurisdiction', 'inspector', 403],
		['the homeowner', 'homeowner', 403],
		['an administrator', 'admin', 403],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s cannot request an inspection (%i) and nothing is written', async (_n, who, status) => {
		const jobId = await jobAt('approved');
		const before = await snapshot(jobId);
		expect((await request(who, jobId, roughIn)).status).toBe(status);
		expect(await snapshot(jobId)).toEqual(before);
	});

	test.each([
		['the firm', 'owner', 200],
		['the inspector of the jurisdiction', 'inspector', 200],
		['the homeowner', 'homeowner', 200],
		['an administrator', 'admin', 200],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s reading the inspections gets %i', async (_n, who, status) => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const one = await call(clients[who], 'GET', `/api/inspections/${id}`);
		expect(one.status).toBe(status);
		if (status === 200)
			expect(one.body.inspection).toMatchObject({ id, kind: 'rough-in', status: 'requested' });
		const res = await call(clients[who], 'GET', `/api/jobs/${jobId}/inspections`);
		expect(res.status).toBe(status);
		if (status === 200) expect(res.body.inspections.map((i: any) => i.id)).toEqual([id]);
		else expect(JSON.stringify(res.body)).not.toContain(id);
	});
});

describe('cancelling a request', () => {
	test('the firm cancels a scheduled request; it stays on the record and the kind may be requested again', async () => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const res = await call(clients.electrician, 'POST', `/api/inspections/${id}/cancel`);
		expect(res.status).toBe(200);
		expect(res.body.inspection).toMatchObject({ status: 'cancelled', scheduledFor: inDays(4) });
		expect(
			await db('audit_log').where({ job_id: jobId, entity: 'inspection', action: 'update' }),
		).toHaveLength(1);
		const again = await request('owner', jobId, { kind: 'rough-in', preferredDates: [inDays(9)] });
		expect(again.status).toBe(201);
		const listed = await call(clients.owner, 'GET', `/api/jobs/${jobId}/inspections`);
		expect(listed.body.inspections.map((i: any) => i.status)).toEqual(['cancelled', 'requested']);
		// A cancelled request takes no result.
		const result = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, { result: 'pass' });
		expect(result.status).toBe(409);
	});

	test('an inspection with its result, or one already cancelled, cannot be cancelled', async () => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, { result: 'pass' });
		const before = await snapshot(jobId);
		const res = await call(clients.owner, 'POST', `/api/inspections/${id}/cancel`);
		expect(res.status).toBe(409);
		expect(await snapshot(jobId)).toEqual(before);
		const other = await jobAt('approved');
		const second = await requested(other);
		expect((await call(clients.owner, 'POST', `/api/inspections/${second}/cancel`)).status).toBe(200);
		const twice = await call(clients.owner, 'POST', `/api/inspections/${second}/cancel`);
		expect(twice.status).toBe(409);
		expect(twice.body.error.message).toMatch(/already cancelled/);
	});

	test.each([
		['the inspector of the jurisdiction', 'inspector', 403],
		['the homeowner', 'homeowner', 403],
		['an administrator', 'admin', 403],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s cannot cancel a request (%i) and it stays open', async (_n, who, status) => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const before = await snapshot(jobId);
		expect((await call(clients[who], 'POST', `/api/inspections/${id}/cancel`)).status).toBe(status);
		expect(await snapshot(jobId)).toEqual(before);
		expect((await db('inspections').where({ id }).first('status')).status).toBe('requested');
	});
});

describe('scheduling and recording', () => {
	test('the inspector schedules a requested inspection and may move the date; both are audited', async () => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const first = await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, {
			scheduledFor: inDays(4),
		});
		expect(first.status).toBe(200);
		expect(first.body.inspection).toMatchObject({
			status: 'scheduled',
			scheduledFor: inDays(4),
			inspectorName: 'Ines Halloway',
		});
		const moved = await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, {
			scheduledFor: inDays(6),
		});
		expect(moved.body.inspection.scheduledFor).toBe(inDays(6));
		expect(
			await db('audit_log').where({ job_id: jobId, entity: 'inspection', action: 'schedule' }),
		).toHaveLength(2);
	});

	test.each([
		['a date in the past', { scheduledFor: inDays(-2) }],
		['no date', {}],
		['a date in another format', { scheduledFor: 'next Tuesday' }],
		['a date more than a year ahead', { scheduledFor: inDays(400) }],
	])('scheduling with %s is refused and nothing changes', async (_n, body) => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const before = await snapshot(jobId);
		const res = await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, body);
		expect(res.status).toBe(400);
		expect(res.body.error.fields).toHaveProperty('scheduledFor');
		expect(await snapshot(jobId)).toEqual(before);
		expect((await db('inspections').where({ id }).first('status')).status).toBe('requested');
	});

	test.each([
		['the contractor', 'owner', 403],
		['the homeowner', 'homeowner', 403],
		['an administrator', 'admin', 403],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s cannot schedule (%i) nor record a result, and nothing changes', async (_n, who, status) => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const before = await snapshot(jobId);
		expect(
			(await call(clients[who], 'PATCH', `/api/inspections/${id}`, { scheduledFor: inDays(3) })).status,
		).toBe(status);
		await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, { scheduledFor: inDays(3) });
		const afterSchedule = await snapshot(jobId);
		expect(afterSchedule.audit).toBe(before.audit + 1);
		const res = await call(clients[who], 'POST', `/api/inspections/${id}/result`, { result: 'pass' });
		expect(res.status).toBe(status);
		expect(await snapshot(jobId)).toEqual(afterSchedule);
		expect((await db('inspections').where({ id }).first('status')).status).toBe('scheduled');
	});

	test('a passed rough-in moves the job to “Rough-in passed” with the notes, in the audit trail', async () => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const res = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, {
			result: 'pass',
			notes: 'Boxes, cables and bonding as drawn.',
		});
		expect(res.status).toBe(200);
		expect(res.body.inspection).toMatchObject({
			status: 'passed',
			resultNotes: 'Boxes, cables and bonding as drawn.',
			items: [],
		});
		expect(res.body.inspection.recordedAt).toEqual(expect.any(String));
		expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('rough-in-passed');
		const moves = await db('audit_log').where({ job_id: jobId, entity: 'status', action: 'transition' });
		expect(moves.map((m) => m.after)).toEqual([
			expect.objectContaining({ status: 'rough-in-passed', action: 'pass-rough-in' }),
		]);
		expect(
			await db('audit_log').where({ job_id: jobId, entity: 'inspection', action: 'record' }),
		).toHaveLength(1);
	});

	test.each([
		['a fail without correction items', { result: 'fail', notes: 'See me.' }, 'items'],
		['a pass with correction items', { result: 'pass', items: ['Fix it'] }, 'items'],
		['an empty correction item', { result: 'fail', items: ['  '] }, 'items.0'],
		[
			'51 correction items',
			{ result: 'fail', items: Array.from({ length: 51 }, (_, i) => `Item ${i}`) },
			'items',
		],
		['no result', { notes: 'Looked fine' }, 'result'],
		['notes of 4,001 characters', { result: 'pass', notes: 'n'.repeat(4001) }, 'notes'],
	])('a result with %s is refused; the job and the inspection stay as they were', async (_n, body, field) => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const before = await snapshot(jobId);
		const res = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, body);
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields)).toContain(field);
		expect(await snapshot(jobId)).toEqual(before);
	});

	test('a result cannot be recorded before the inspection is scheduled, nor twice', async () => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const early = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, { result: 'pass' });
		expect(early.status).toBe(409);
		expect(early.body.error.message).toMatch(/Schedule the inspection/);
		await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, { scheduledFor: inDays(1) });
		expect(
			(await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, { result: 'pass' })).status,
		).toBe(200);
		const before = await snapshot(jobId);
		const again = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, {
			result: 'fail',
			items: ['x'],
		});
		expect(again.status).toBe(409);
		expect(await snapshot(jobId)).toEqual(before);
		const resched = await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, {
			scheduledFor: inDays(2),
		});
		expect(resched.status).toBe(409);
	});
});

describe('correction items after a failed inspection', () => {
	test('a failed rough-in opens its items, and a new request waits until every item is answered', async () => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const failed = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, {
			result: 'fail',
			notes: 'Two corrections.',
			items: [
				'Secure NM cable within 12 in. of the kitchen boxes.',
				'Add the missing bonding jumper at the water heater.',
			],
		});
		expect(failed.status).toBe(200);
		expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('rough-in-failed');
		const items = failed.body.inspection.items;
		expect(items.map((i: any) => i.status)).toEqual(['open', 'open']);

		const blocked = await request('owner', jobId, { kind: 'rough-in', preferredDates: [inDays(5)] });
		expect(blocked.status).toBe(409);
		expect(blocked.body.error.message).toMatch(/Answer every correction item.*2 still open/);

		const answer = (itemId: string, text: string) =>
			call(clients.owner, 'POST', `/api/inspection-items/${itemId}/answer`, { answer: text });
		const first = await answer(items[0].id, 'Stapled within 8 in. of each box.');
		expect(first.status).toBe(200);
		expect(first.body.item).toMatchObject({
			status: 'answered',
			answer: 'Stapled within 8 in. of each box.',
			answeredByName: 'Marisol Quenby',
		});
		const still = await request('owner', jobId, { kind: 'rough-in', preferredDates: [inDays(5)] });
		expect(still.status).toBe(409);
		expect(still.body.error.message).toMatch(/1 still open/);

		expect((await answer(items[1].id, 'Jumper added, 6 AWG Cu.')).status).toBe(200);
		const again = await request('owner', jobId, { kind: 'rough-in', preferredDates: [inDays(5)] });
		expect(again.status).toBe(201);
		// Once the re-inspection is requested, the answers are part of the record.
		const late = await answer(items[1].id, 'Changed my mind.');
		expect(late.status).toBe(409);
		expect((await db('inspection_items').where({ id: items[1].id }).first('answer')).answer).toBe(
			'Jumper added, 6 AWG Cu.',
		);
		expect(
			await db('audit_log').where({ job_id: jobId, entity: 'inspection', action: 'reply' }),
		).toHaveLength(2);
	});

	test.each([
		['the inspector of the jurisdiction', 'inspector', 403],
		['the homeowner', 'homeowner', 403],
		['an administrator', 'admin', 403],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s cannot answer a correction item (%i) and it stays open', async (_n, who, status) => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const failed = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, {
			result: 'fail',
			items: ['Label the panel.'],
		});
		const itemId = failed.body.inspection.items[0].id;
		const before = await snapshot(jobId);
		expect(
			(await call(clients[who], 'POST', `/api/inspection-items/${itemId}/answer`, { answer: 'Done.' }))
				.status,
		).toBe(status);
		expect(await snapshot(jobId)).toEqual(before);
		expect((await db('inspection_items').where({ id: itemId }).first('status')).status).toBe('open');
	});

	test.each([
		['an empty answer', { answer: '   ' }],
		['an answer of 4,001 characters', { answer: 'a'.repeat(4001) }],
		['no answer', {}],
	])('%s is refused and the item stays open', async (_n, body) => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const failed = await call(clients.inspector, 'POST', `/api/inspections/${id}/result`, {
			result: 'fail',
			items: ['Label the panel.'],
		});
		const itemId = failed.body.inspection.items[0].id;
		const before = await snapshot(jobId);
		const res = await call(clients.owner, 'POST', `/api/inspection-items/${itemId}/answer`, body);
		expect(res.status).toBe(400);
		expect(res.body.error.fields).toHaveProperty('answer');
		expect(await snapshot(jobId)).toEqual(before);
	});

	test('the job goes from approval through a failed final to “Final inspection passed”', async () => {
		const jobId = await jobAt('approved');
		const statusOf = async () => (await db('jobs').where({ id: jobId }).first('status')).status;
		const rough = await scheduled(jobId, 'rough-in');
		await call(clients.inspector, 'POST', `/api/inspections/${rough}/result`, { result: 'pass' });
		expect(await statusOf()).toBe('rough-in-passed');
		const final = await scheduled(jobId, 'final');
		const failed = await call(clients.inspector, 'POST', `/api/inspections/${final}/result`, {
			result: 'fail',
			items: ['Fill the open knockout in the garage subpanel.'],
		});
		expect(await statusOf()).toBe('final-failed');
		await call(clients.owner, 'POST', `/api/inspection-items/${failed.body.inspection.items[0].id}/answer`, {
			answer: 'Knockout closure fitted.',
		});
		const again = await scheduled(jobId, 'final');
		expect(
			(await call(clients.inspector, 'POST', `/api/inspections/${again}/result`, { result: 'pass' })).status,
		).toBe(200);
		expect(await statusOf()).toBe('final-passed');
		const list = await call(clients.homeowner, 'GET', `/api/jobs/${jobId}/inspections`);
		expect(list.body.inspections.map((i: any) => `${i.kind} ${i.status}`)).toEqual([
			'rough-in passed',
			'final failed',
			'final passed',
		]);
		const moves = await db('audit_log')
			.where({ job_id: jobId, entity: 'status' })
			.orderBy('id')
			.select('after');
		expect(moves.map((m) => m.after.status)).toEqual(['rough-in-passed', 'final-failed', 'final-passed']);
	});
});

describe('inspection photos', () => {
	async function traces(jobId: string) {
		return {
			rows: Number((await db('inspection_photos').where({ job_id: jobId }).count('* as n'))[0]!.n),
			audit: Number((await db('audit_log').where({ job_id: jobId }).count('* as n'))[0]!.n),
			files: list(path.join(uploads, jobId, 'inspections')),
			incoming: list(incoming),
		};
	}

	test('the inspector uploads a PNG and a JPEG; they are stored under the job and served to every reader', async () => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const res = await uploadPhotos('inspector', id, [
			{ name: 'panel-open.png', type: 'image/png', bytes: png },
			{ name: 'bonding.jpg', type: 'image/jpeg', bytes: jpeg },
		]);
		expect(res.status).toBe(201);
		expect(res.body.photos).toMatchObject([
			{
				originalName: 'panel-open.png',
				contentType: 'image/png',
				width: 900,
				height: 600,
				sha256: sha256(png),
				caption: 'Panel interior',
			},
			{
				originalName: 'bonding.jpg',
				contentType: 'image/jpeg',
				width: 1200,
				height: 800,
				sha256: sha256(jpeg),
			},
		]);
		const files = list(path.join(uploads, jobId, 'inspections'));
		expect(files).toHaveLength(4);
		expect(files.filter((f) => f.endsWith('.thumb.png'))).toHaveLength(2);
		const photo = res.body.photos[0];
		for (const who of ['owner', 'inspector', 'homeowner', 'admin'] as const) {
			const file = await clients[who].fetch(photo.urls.file);
			expect(file.status).toBe(200);
			expect(file.headers.get('content-type')).toBe('image/png');
			expect(sha256(new Uint8Array(await file.arrayBuffer()))).toBe(sha256(png));
			const thumb = await clients[who].fetch(photo.urls.thumbnail);
			expect(thumb.status).toBe(200);
			const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
			expect(meta.format).toBe('png');
			expect(meta.width).toBe(480);
		}
		for (const [who, status] of [
			['otherFirm', 404],
			['otherInspector', 404],
			['otherHomeowner', 404],
			['signedOut', 401],
		] as const) {
			expect((await clients[who].fetch(photo.urls.file)).status).toBe(status);
			expect((await clients[who].fetch(photo.urls.thumbnail)).status).toBe(status);
		}
		const listed = await call(clients.homeowner, 'GET', `/api/jobs/${jobId}/inspections`);
		expect(listed.body.inspections[0].photos.map((p: any) => p.id)).toEqual(
			res.body.photos.map((p: any) => p.id),
		);
	});

	test.each([
		[
			'an SVG drawing',
			() => [
				{
					name: 'x.svg',
					type: 'image/svg+xml',
					bytes: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'),
				},
			],
			415,
		],
		[
			'a PDF',
			() => [
				{
					name: 'report.pdf',
					type: 'application/pdf',
					bytes: Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF'),
				},
			],
			415,
		],
		[
			'a text file named .png',
			() => [{ name: 'fake.png', type: 'image/png', bytes: Buffer.from('just words, not a picture') }],
			415,
		],
		['an empty file', () => [{ name: 'empty.jpg', type: 'image/jpeg', bytes: new Uint8Array() }], 400],
		['a PNG cut short', () => [{ name: 'cut.png', type: 'image/png', bytes: png.subarray(0, 200) }], 415],
		[
			'a good photo beside a bad one',
			() => [
				{ name: 'ok.png', type: 'image/png', bytes: png },
				{ name: 'bad.png', type: 'image/png', bytes: Buffer.from('nope') },
			],
			415,
		],
		[
			'eleven photos at once',
			() => Array.from({ length: 11 }, (_, i) => ({ name: `p${i}.png`, type: 'image/png', bytes: png })),
			400,
		],
	])('%s is refused and nothing is left behind', async (_n, files, status) => {
		const jobId = await jobAt('approved');
		const id = await scheduled(jobId);
		const before = await traces(jobId);
		const res = await uploadPhotos('inspector', id, files());
		expect(res.status).toBe(status);
		expect(res.body.error.message).toEqual(expect.any(String));
		expect(await traces(jobId)).toEqual(before);
	});

	test.each([
		['the contractor', 'owner', 403],
		['the homeowner', 'homeowner', 403],
		['an administrator', 'admin', 403],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)(
		'%s cannot upload inspection photos (%i) and nothing is left behind',
		async (_n, who, status) => {
			const jobId = await jobAt('approved');
			const id = await scheduled(jobId);
			const before = await traces(jobId);
			expect((await uploadPhotos(who, id, [{ name: 'p.png', type: 'image/png', bytes: png }])).status).toBe(
				status,
			);
			expect(await traces(jobId)).toEqual(before);
		},
	);

	test('photos wait until the inspection is scheduled, and an upload without Origin is refused', async () => {
		const jobId = await jobAt('approved');
		const id = await requested(jobId);
		const before = await traces(jobId);
		const early = await uploadPhotos('inspector', id, [{ name: 'p.png', type: 'image/png', bytes: png }]);
		expect(early.status).toBe(409);
		await call(clients.inspector, 'PATCH', `/api/inspections/${id}`, { scheduledFor: inDays(1) });
		const cookie = await clients.inspector.fetch('/api/me');
		expect(cookie.status).toBe(200);
		const noOrigin = await fetch(`${process.env.AMPLEDGER_BASE_URL}/api/inspections/${id}/photos`, {
			method: 'POST',
			body: form([{ name: 'p.png', type: 'image/png', bytes: png }]),
		});
		expect(noOrigin.status).toBe(403);
		expect(await traces(jobId)).toEqual({ ...before, audit: before.audit + 1 });
	});
});
