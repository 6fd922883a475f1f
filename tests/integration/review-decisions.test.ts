import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { issuePermitNumber } from '../../src/lib/workflow/permit-number';
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
const jurisdictions: Awaited<ReturnType<typeof newJurisdictionWithInspector>>[] = [];
let owner: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let mine: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let elsewhere: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;

async function jurisdiction(pattern?: string) {
	const j = await newJurisdictionWithInspector(db, 'inspector', pattern);
	jurisdictions.push(j);
	return j;
}

beforeAll(async () => {
	[owner, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('admin'),
	]);
	other = await otherFirmOwner();
	mine = await jurisdiction('QV-{YYYY}-{SEQ:4}');
	elsewhere = await jurisdiction();
});

afterAll(async () => {
	await removeJobs(db, created);
	for (const j of jurisdictions) await removeJurisdiction(db, j);
	await removeOtherFirm(db, other);
	await db.destroy();
});

async function jobInReview(
	jurisdictionId = mine.jurisdictionId,
	status: 'in-review' | 'submitted' = 'in-review',
) {
	const j = await submittedJob(db, owner, jurisdictionId, { status, address: DEMO_PROPERTIES.penhallow });
	created.push(j.id);
	return j;
}

const state = async (jobId: string) => {
	const job = await db('jobs').where({ id: jobId }).first('status', 'permit_number');
	const counters = await db('permit_counters')
		.where({ jurisdiction_id: mine.jurisdictionId })
		.select('period', 'last');
	const audit = Number((await db('audit_log').where({ job_id: jobId }).count({ n: '*' }))[0]!.n);
	return { ...job, counters, audit };
};

const year = new Date().getUTCFullYear();

describe('requesting corrections', () => {
	test('moves the job to corrections and lists the open comments in the answer and in the audit log', async () => {
		const j = await jobInReview();
		const open = await commentOn(mine.client, j.id, { body: 'Show the service grounding.' });
		const resolved = await commentOn(mine.client, j.id, { body: 'Fine as drawn.' });
		await call(mine.client, 'POST', `/api/comments/${resolved.id}/entries`, { action: 'resolved' });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, {
			decision: 'request-corrections',
			note: 'One item to correct.',
		});
		expect(res.status).toBe(200);
		expect(res.body.status).toBe('corrections');
		expect(res.body.permitNumber).toBeNull();
		expect(res.body.openComments).toEqual([
			{
				id: open.id,
				number: 1,
				status: 'open',
				targetLabel: 'Whole job',
				body: 'Show the service grounding.',
			},
		]);
		expect((await db('jobs').where({ id: j.id }).first('status')).status).toBe('corrections');
		const move = await db('audit_log')
			.where({ job_id: j.id, entity: 'status', action: 'transition' })
			.first('after');
		expect(move.after).toMatchObject({
			status: 'corrections',
			action: 'request-corrections',
			note: 'One item to correct.',
		});
		const decision = await db('audit_log').where({ job_id: j.id, action: 'decide' }).first('after');
		expect(decision.after).toMatchObject({ decision: 'request-corrections', revision: 1 });
		expect(decision.after.openComments.map((c: { id: string }) => c.id)).toEqual([open.id]);
	});

	test('is refused without an open comment (409) and changes nothing', async () => {
		const j = await jobInReview();
		const before = await state(j.id);
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, {
			decision: 'request-corrections',
		});
		expect(res.status).toBe(409);
		expect(await state(j.id)).toEqual(before);
	});
});

describe('approving', () => {
	test('issues the permit number by the jurisdiction’s pattern, stores it on the job and records the decision', async () => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id);
		await call(mine.client, 'POST', `/api/comments/${c.id}/entries`, { action: 'resolved' });
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, {
			decision: 'approve',
			note: 'Approved as drawn.',
		});
		expect(res.status).toBe(200);
		expect(res.body.status).toBe('approved');
		expect(res.body.permitNumber).toMatch(new RegExp(`^QV-${year}-\\d{4}$`));
		const row = await db('jobs').where({ id: j.id }).first('status', 'permit_number');
		expect(row).toEqual({ status: 'approved', permit_number: res.body.permitNumber });
		const decision = await db('audit_log').where({ job_id: j.id, action: 'decide' }).first('after');
		expect(decision.after).toMatchObject({ decision: 'approve', permitNumber: res.body.permitNumber });
	});

	test.each([
		['an open comment', [] as string[]],
		['a comment the contractor marked addressed but the reviewer has not resolved', ['addressed']],
	])('is refused while there is %s (409 naming it) and issues no number', async (_, steps) => {
		const j = await jobInReview();
		const c = await commentOn(mine.client, j.id, {
			targetKind: 'panel',
			panelId: j.panelId,
			body: 'Label it.',
		});
		for (const s of steps) await call(owner, 'POST', `/api/comments/${c.id}/entries`, { action: s });
		const before = await state(j.id);
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, { decision: 'approve' });
		expect(res.status).toBe(409);
		expect(res.body.error.message).toContain('#1 (Panel Main panel)');
		expect(res.body.error.current.unresolvedComments.map((x: { id: string }) => x.id)).toEqual([c.id]);
		expect(await state(j.id)).toEqual(before);
	});

	test('numbers consecutive approvals of a jurisdiction one after the other', async () => {
		const own = await jurisdiction('BV{SEQ:3}');
		const a = await jobInReview(own.jurisdictionId);
		const b = await jobInReview(own.jurisdictionId);
		const first = await call(own.client, 'POST', `/api/jobs/${a.id}/decision`, { decision: 'approve' });
		const second = await call(own.client, 'POST', `/api/jobs/${b.id}/decision`, { decision: 'approve' });
		expect([first.body.permitNumber, second.body.permitNumber]).toEqual(['BV001', 'BV002']);
	});

	test('gives 20 approvals made at once 20 distinct consecutive numbers', async () => {
		const own = await jurisdiction('PAR-{YYYY}-{SEQ:3}');
		const jobs = await Promise.all(Array.from({ length: 20 }, () => jobInReview(own.jurisdictionId)));
		const answers = await Promise.all(
			jobs.map((j) => call(own.client, 'POST', `/api/jobs/${j.id}/decision`, { decision: 'approve' })),
		);
		expect(answers.map((a) => a.status)).toEqual(Array(20).fill(200));
		const numbers = answers.map((a) => a.body.permitNumber as string).sort();
		expect(numbers).toEqual(
			Array.from({ length: 20 }, (_, i) => `PAR-${year}-${String(i + 1).padStart(3, '0')}`),
		);
		const stored = await db('jobs')
			.whereIn(
				'id',
				jobs.map((j) => j.id),
			)
			.pluck('permit_number');
		expect(new Set(stored).size).toBe(20);
	});
});

describe('the permit counter', () => {
	test('starts again each year when the pattern shows the year, and runs on when it does not', async () => {
		const yearly = await jurisdiction('Y{YYYY}-{SEQ:3}');
		const running = await jurisdiction('R-{SEQ:4}');
		const issue = (id: string, date: string) =>
			db.transaction((trx) => issuePermitNumber(trx, id, new Date(date)));
		expect(await issue(yearly.jurisdictionId, '2026-06-01T12:00:00Z')).toBe('Y2026-001');
		expect(await issue(yearly.jurisdictionId, '2026-12-31T23:00:00Z')).toBe('Y2026-002');
		expect(await issue(yearly.jurisdictionId, '2027-01-01T08:00:00Z')).toBe('Y2027-001');
		expect(await issue(running.jurisdictionId, '2026-12-31T23:00:00Z')).toBe('R-0001');
		expect(await issue(running.jurisdictionId, '2027-01-01T08:00:00Z')).toBe('R-0002');
		expect(
			await db('permit_counters')
				.where({ jurisdiction_id: yearly.jurisdictionId })
				.orderBy('period')
				.select('period', 'last'),
		).toEqual([
			{ period: '2026', last: 2 },
			{ period: '2027', last: 1 },
		]);
	});

	test('gives back the number of an approval that is rolled back', async () => {
		const own = await jurisdiction('RB-{SEQ:2}');
		await expect(
			db.transaction(async (trx) => {
				await issuePermitNumber(trx, own.jurisdictionId, new Date());
				throw new Error('approval failed later');
			}),
		).rejects.toThrow('approval failed later');
		expect(await db.transaction((trx) => issuePermitNumber(trx, own.jurisdictionId, new Date()))).toBe(
			'RB-01',
		);
	});
});

describe('who decides', () => {
	test.each([
		['approve', 'the job’s own contractor', () => owner, 403],
		['approve', 'a contractor of another firm', () => other.client, 404],
		['approve', 'an inspector of another jurisdiction', () => elsewhere.client, 404],
		['approve', 'the homeowner of the property', () => homeowner, 403],
		['approve', 'an administrator (reads, changes nothing)', () => admin, 403],
		['approve', 'a signed-out visitor', () => new HttpClient(), 401],
		['request-corrections', 'the job’s own contractor', () => owner, 403],
		['request-corrections', 'a contractor of another firm', () => other.client, 404],
		['request-corrections', 'an inspector of another jurisdiction', () => elsewhere.client, 404],
		['request-corrections', 'the homeowner of the property', () => homeowner, 403],
		['request-corrections', 'an administrator (reads, changes nothing)', () => admin, 403],
		['request-corrections', 'a signed-out visitor', () => new HttpClient(), 401],
	])('refuses “%s” from %s (%i) and changes nothing', async (decision, _, who, status) => {
		const j = await jobInReview();
		await commentOn(mine.client, j.id);
		const before = await state(j.id);
		const res = await call(who(), 'POST', `/api/jobs/${j.id}/decision`, { decision });
		expect(res.status).toBe(status);
		expect(await state(j.id)).toEqual(before);
	});

	test.each([
		['approve', 'submitted'],
		['request-corrections', 'submitted'],
		['approve', 'approved'],
		['request-corrections', 'corrections'],
	] as const)(
		'refuses “%s” on a job that is %s with the allowed moves (409) and changes nothing',
		async (decision, status) => {
			const j = await jobInReview(mine.jurisdictionId, 'in-review');
			await commentOn(mine.client, j.id);
			await db('jobs').where({ id: j.id }).update({ status });
			const before = await state(j.id);
			const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, { decision });
			expect(res.status).toBe(409);
			expect(res.body.error.current.status).toBe(status);
			expect(Array.isArray(res.body.error.current.allowed)).toBe(true);
			expect(await state(j.id)).toEqual(before);
		},
	);

	test.each([
		['no decision', {}, 'decision'],
		['an unknown decision', { decision: 'reject' }, 'decision'],
		['a note over 4,000 characters', { decision: 'approve', note: 'n'.repeat(4001) }, 'note'],
		['an unknown field', { decision: 'approve', permitNumber: 'X-1' }, '_'],
	])('refuses %s with a field message and changes nothing', async (_, body, field) => {
		const j = await jobInReview();
		const before = await state(j.id);
		const res = await call(mine.client, 'POST', `/api/jobs/${j.id}/decision`, body);
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields)).toContain(field);
		expect(await state(j.id)).toEqual(before);
	});
});
