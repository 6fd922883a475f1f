import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, otherFirmOwner, removeJobs, removeOtherFirm } from '../helpers/jobs';
import {
	commentOn,
	newJurisdictionWithInspector,
	removeJurisdiction,
	submittedJob,
} from '../helpers/workflow';

const db = testDb();
const created: string[] = [];
let owner: HttpClient;
let electrician: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let mine: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let elsewhere: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;

beforeAll(async () => {
	[owner, electrician, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('electrician'),
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

async function jobInReview() {
	const j = await submittedJob(db, owner, mine.jurisdictionId, {
		status: 'in-review',
		address: DEMO_PROPERTIES.penhallow,
	});
	created.push(j.id);
	return j;
}

const counts = async (jobId: string) => ({
	comments: Number((await db('review_comments').where({ job_id: jobId }).count({ n: '*' }))[0]!.n),
	entries: Number(
		(
			await db('review_comment_entries as e')
				.join('review_comments as c', 'c.id', 'e.comment_id')
				.where('c.job_id', jobId)
				.count({ n: '*' })
		)[0]!.n,
	),
	audit: Number((await db('audit_log').where({ job_id: jobId, entity: 'comment' }).count({ n: '*' }))[0]!.n),
});

describe('writing review comments', () => {
	test('pins a comment to a point on a sheet, with the sheet named in its label, and writes an audit row', async () => {
		const j = await jobInReview();
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/comments`, {
			targetKind: 'sheet',
			sheet: 2,
			point: { x: 0.25, y: 0.75 },
			body: 'The riser shows a 4 AWG grounding electrode conductor; the service needs 6 AWG at least.',
		});
		expect(res.status).toBe(201);
		expect(res.body.comment).toMatchObject({
			revision: 1,
			targetKind: 'sheet',
			sheet: 2,
			point: { x: 0.25, y: 0.75 },
			targetLabel: 'Sheet 2 of 3',
			status: 'open',
			authorName: mine.name,
			entries: [],
		});
		const audit = await db('audit_log')
			.where({ job_id: j.id, entity: 'comment', action: 'create' })
			.first('entity_id', 'user_id');
		expect(audit).toEqual({ entity_id: res.body.comment.id, user_id: mine.userId });
	});

	test('pins comments to a panel and to a circuit of the revision, naming them as submitted', async () => {
		const j = await jobInReview();
		const panel = await commentOn(mine.client, j.id, {
			targetKind: 'panel',
			panelId: j.panelId,
			body: 'Label the panel.',
		});
		expect(panel).toMatchObject({ targetKind: 'panel', panelId: j.panelId, targetLabel: 'Panel Main panel' });
		// Comments are numbered within their job, whatever other jobs hold.
		expect(panel.number).toBe(1);
		const circuit = await commentOn(mine.client, j.id, {
			targetKind: 'circuit',
			circuitId: j.circuitIds[0],
			body: 'Kitchen counter circuits need GFCI protection.',
		});
		expect(circuit).toMatchObject({
			targetKind: 'circuit',
			circuitId: j.circuitIds[0],
			panelId: j.panelId,
			targetLabel: 'Panel Main panel, circuit 1: Kitchen counter',
			number: 2,
		});
		// Renaming the live circuit afterwards leaves the comment's label as it was.
		await db('circuits').where({ id: j.circuitIds[0] }).update({ label: 'Renamed later' });
		const list = await call(mine.client, 'GET', `/api/jobs/${j.id}/comments`);
		expect(list.body.items.map((c: { targetLabel: string }) => c.targetLabel)).toEqual([
			'Panel Main panel',
			'Panel Main panel, circuit 1: Kitchen counter',
		]);
	});

	test.each([
		['no body', { targetKind: 'job' }, 'body'],
		['an empty body', { targetKind: 'job', body: '   ' }, 'body'],
		['a body over 4,000 characters', { targetKind: 'job', body: 'x'.repeat(4001) }, 'body'],
		['an unknown target', { targetKind: 'room', body: 'x' }, 'targetKind'],
		['a sheet comment without its sheet', { targetKind: 'sheet', body: 'x' }, 'sheet'],
		['sheet 0', { targetKind: 'sheet', sheet: 0, body: 'x' }, 'sheet'],
		['a sheet past the packet’s last', { targetKind: 'sheet', sheet: 4, body: 'x' }, 'sheet'],
		[
			'a point off the page',
			{ targetKind: 'sheet', sheet: 1, point: { x: 1.2, y: 0.5 }, body: 'x' },
			'point.x',
		],
		['a point on a job comment', { targetKind: 'job', point: { x: 0.2, y: 0.5 }, body: 'x' }, 'sheet'],
		['a panel comment without its panel', { targetKind: 'panel', body: 'x' }, 'panelId'],
		[
			'a panel not in the revision',
			{ targetKind: 'panel', panelId: '00000000-0000-4000-8000-000000000000', body: 'x' },
			'panelId',
		],
		['a circuit id that is no id', { targetKind: 'circuit', circuitId: 'c-1', body: 'x' }, 'circuitId'],
		[
			'a circuit not in the revision',
			{ targetKind: 'circuit', circuitId: '00000000-0000-4000-8000-000000000000', body: 'x' },
			'circuitId',
		],
		['a revision that does not exist', { targetKind: 'job', revision: 2, body: 'x' }, 'revision'],
		['an unknown field', { targetKind: 'job', body: 'x', colour: 'red' }, '_'],
	])('refuses %s with a field message and writes nothing', async (_, body, field) => {
		const j = await jobInReview();
		const before = await counts(j.id);
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/comments`, body);
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields)).toContain(field);
		expect(await counts(j.id)).toEqual(before);
	});

	test('refuses a comment once the packet is back with the contractor (409) and writes nothing', async () => {
		const j = await jobInReview();
		await db('jobs').where({ id: j.id }).update({ status: 'corrections' });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/comments`, {
			targetKind: 'job',
			body: 'Late.',
		});
		expect(res.status).toBe(409);
		expect(await counts(j.id)).toEqual({ comments: 0, entries: 0, audit: 0 });
	});

	test.each([
		['the job’s own contractor', () => owner, 403],
		['a contractor of another firm', () => other.client, 404],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['the homeowner of the property', () => homeowner, 403],
		['an administrator (reads, changes nothing)', () => admin, 403],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('refuses a new comment from %s and writes nothing', async (_, who, status) => {
		const j = await jobInReview();
		const res = await call(who(), 'POST', `/api/jobs/${j.id}/comments`, {
			targetKind: 'job',
			body: 'Not mine to say.',
		});
		expect(res.status).toBe(status);
		expect(await counts(j.id)).toEqual({ comments: 0, entries: 0, audit: 0 });
	});
});

describe('reading review comments', () => {
	test.each([
		['the job’s own contractor', () => owner, 200],
		['another electrician of the firm', () => electrician, 200],
		['an inspector of the jurisdiction', () => mine.client, 200],
		['an administrator', () => admin, 200],
		['the homeowner of the property', () => homeowner, 403],
		['a contractor of another firm', () => other.client, 404],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['a signed-out visitor', () => new HttpClient(), 401],
	])('answers %s with %i', async (_, who, status) => {
		const j = await jobInReview();
		await commentOn(mine.client, j.id);
		const res = await call(who(), 'GET', `/api/jobs/${j.id}/comments`);
		expect(res.status).toBe(status);
		if (status === 200) expect(res.body.items).toHaveLength(1);
		else expect(res.body.items).toBeUndefined();
	});
});

describe('a comment’s thread', () => {
	test('runs open → addressed by the contractor → reopened → resolved by the reviewer, each entry in the thread and the audit log', async () => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		const reply = await call(owner, 'POST', `/api/comments/${c.id}/entries`, {
			action: 'reply',
			body: 'The riser now shows 6 AWG copper.',
		});
		expect(reply.status).toBe(201);
		expect(reply.body.comment.status).toBe('open');
		const addressed = await call(electrician, 'POST', `/api/comments/${c.id}/entries`, {
			action: 'addressed',
		});
		expect(addressed.body.comment.status).toBe('addressed');
		const reopened = await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, {
			action: 'reopened',
			body: 'The sheet still says 4 AWG.',
		});
		expect(reopened.body.comment.status).toBe('open');
		await call(owner, 'POST', `/api/comments/${c.id}/entries`, {
			action: 'addressed',
			body: 'Fixed on sheet 2.',
		});
		const resolved = await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'resolved' });
		expect(resolved.status).toBe(201);
		expect(resolved.body.comment.status).toBe('resolved');
		expect(resolved.body.comment.version).toBe(5);
		expect(resolved.body.comment.entries.map((e: { action: string }) => e.action)).toEqual([
			'reply',
			'addressed',
			'reopened',
			'addressed',
			'resolved',
		]);
		const audit = await db('audit_log')
			.where({ job_id: j.id, entity: 'comment', action: 'reply' })
			.orderBy('id');
		expect(audit.map((a) => a.after.status)).toEqual(['open', 'addressed', 'open', 'addressed', 'resolved']);
	});

	test('lets the reviewer resolve an open comment directly, and reopen a resolved one', async () => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		expect(
			(await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'resolved' })).body.comment
				.status,
		).toBe('resolved');
		expect(
			(await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'reopened' })).body.comment
				.status,
		).toBe('open');
	});

	// Each action by each role: who may take it from an open comment, and who is refused how.
	const roles = {
		'the job’s contractor': () => owner,
		'the jurisdiction’s inspector': () => mine.client,
		'a contractor of another firm': () => other.client,
		'an inspector of another jurisdiction': () => elsewhere.client,
		'the homeowner': () => homeowner,
		'an administrator': () => admin,
		'a signed-out visitor': () => new HttpClient(),
	};
	type Role = keyof typeof roles;
	const outcomes: Record<string, Record<Role, number>> = {
		reply: {
			'the job’s contractor': 201,
			'the jurisdiction’s inspector': 201,
			'a contractor of another firm': 404,
			'an inspector of another jurisdiction': 404,
			'the homeowner': 403,
			'an administrator': 403,
			'a signed-out visitor': 401,
		},
		addressed: {
			'the job’s contractor': 201,
			'the jurisdiction’s inspector': 403,
			'a contractor of another firm': 404,
			'an inspector of another jurisdiction': 404,
			'the homeowner': 403,
			'an administrator': 403,
			'a signed-out visitor': 401,
		},
		resolved: {
			'the job’s contractor': 403,
			'the jurisdiction’s inspector': 201,
			'a contractor of another firm': 404,
			'an inspector of another jurisdiction': 404,
			'the homeowner': 403,
			'an administrator': 403,
			'a signed-out visitor': 401,
		},
	};
	test.each(
		Object.entries(outcomes).flatMap(([action, byRole]) =>
			Object.entries(byRole).map(([role, status]) => [action, role as Role, status] as const),
		),
	)('%s on an open comment by %s answers %i', async (action, role, status) => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		const before = await counts(j.id);
		const res = await call(roles[role](), 'POST', `/api/comments/${c.id}/entries`, { action, body: 'Seen.' });
		expect(res.status).toBe(status);
		const after = await counts(j.id);
		if (status === 201) {
			expect(after).toEqual({ ...before, entries: before.entries + 1, audit: before.audit + 1 });
		} else {
			expect(after).toEqual(before);
			expect((await db('review_comments').where({ id: c.id }).first('status')).status).toBe('open');
		}
	});

	test('reopening by the contractor is refused (403) and leaves the comment resolved', async () => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'resolved' });
		const res = await call(owner, 'POST', `/api/comments/${c.id}/entries`, { action: 'reopened' });
		expect(res.status).toBe(403);
		expect((await db('review_comments').where({ id: c.id }).first('status')).status).toBe('resolved');
	});

	test.each([
		['marking a resolved comment addressed', ['resolved'], 'addressed', 'owner'],
		['resolving a resolved comment', ['resolved'], 'resolved', 'inspector'],
		['reopening an open comment', [], 'reopened', 'inspector'],
		['marking an addressed comment addressed again', ['addressed'], 'addressed', 'owner'],
	] as const)('refuses %s (409) and writes nothing', async (_, steps, action, by) => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		for (const s of steps)
			await call(s === 'addressed' ? owner : mine.client, 'POST', `/api/comments/${c.id}/entries`, {
				action: s,
			});
		const before = await counts(j.id);
		const res = await call(by === 'owner' ? owner : mine.client, 'POST', `/api/comments/${c.id}/entries`, {
			action,
		});
		expect(res.status).toBe(409);
		expect(await counts(j.id)).toEqual(before);
	});

	test.each([
		['a reply without words', { action: 'reply', body: '' }, 'body'],
		['an unknown action', { action: 'approve' }, 'action'],
		['words over 4,000 characters', { action: 'reply', body: 'y'.repeat(4001) }, 'body'],
	])('refuses %s with a field message and writes nothing', async (_, body, field) => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		const before = await counts(j.id);
		const res = await call(owner, 'POST', `/api/comments/${c.id}/entries`, body);
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields)).toContain(field);
		expect(await counts(j.id)).toEqual(before);
	});

	test.each([
		['reply', 'owner'],
		['addressed', 'owner'],
		['reply', 'inspector'],
		['reopened', 'inspector'],
	] as const)(
		'once the permit is issued, refuses “%s” by the %s (409), writes nothing and says the threads are closed',
		async (action, by) => {
			const j = await jobInReview();
			const c = await commentOn(mine.client, j.id);
			if (action === 'reopened')
				await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'resolved' });
			await db('jobs').where({ id: j.id }).update({ status: 'approved' });
			const before = await counts(j.id);
			const res = await call(by === 'owner' ? owner : mine.client, 'POST', `/api/comments/${c.id}/entries`, {
				action,
				body: 'Too late.',
			});
			expect(res.status).toBe(409);
			expect(res.body.error.current.status).toBe('approved');
			expect(await counts(j.id)).toEqual(before);
			expect((await call(owner, 'GET', `/api/jobs/${j.id}/comments`)).body.threadsOpen).toBe(false);
		},
	);

	test('answers 404 for a comment id that does not exist or is no id', async () => {
		expect(
			(
				await call(owner, 'POST', '/api/comments/00000000-0000-4000-8000-000000000000/entries', {
					action: 'addressed',
				})
			).status,
		).toBe(404);
		expect((await call(owner, 'POST', '/api/comments/nope/entries', { action: 'addressed' })).status).toBe(
			404,
		);
	});
});
