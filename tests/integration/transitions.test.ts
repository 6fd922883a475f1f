/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, otherFirmOwner, removeJobs, type ErrorBody, removeOtherFirm } from '../helpers/jobs';
import { newJurisdictionWithInspector, removeJurisdiction, submittedJob } from '../helpers/workflow';

const db = testDb();
const created: string[] = [];

let owner: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let ahj: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let elsewhere: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;

beforeAll(async () => {
	[owner, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('homeowner'),
		signedInAs('admin'),
	]);
	other = await otherFirmOwner();
	ahj = await newJurisdictionWithInspector(db);
	elsewhere = await newJurisdictionWithInspector(db);
}, 60_000);

afterAll(async () => {
	await removeJobs(db, created);
	await removeJurisdiction(db, ahj);
	await removeJurisdiction(db, elsewhere);
	await removeOtherFirm(db, other);
	await db.destroy();
});

/** A job stored as submitted revision 1 to the test's jurisdiction, at the demo homeowner's address, in a given status. */
async function jobIn(status: string) {
	const job = await submittedJob(db, owner, ahj.jurisdictionId, {
		status: status as never,
		address: DEMO_PROPERTIES.penhallow,
	});
	created.push(job.id);
	return job;
}

const move = (jobId: string, action: string, client: HttpClient, extra: Record<string, unknown> = {}) =>
	call<any>(client, 'POST', `/api/jobs/${jobId}/transitions`, { action, ...extra });

async function stateOf(jobId: string) {
	const job = await db('jobs').where({ id: jobId }).first('status', 'assigned_inspector_id');
	const audit = await db('audit_log').where({ job_id: jobId, entity: 'status' }).count({ n: '*' });
	return { ...job, moves: Number(audit[0]!.n) };
}

const who = {
	contractor: () => owner,
	inspector: () => ahj.client,
	homeowner: () => homeowner,
	administrator: () => admin,
	'another firm': () => other.client,
	'an inspector of another jurisdiction': () => elsewhere.client,
	'the signed-out': () => new HttpClient(),
};
type Who = keyof typeof who;

// [action, from, allowed actor, to]
const MOVES: [string, string, Who, string][] = [
	['withdraw', 'submitted', 'contractor', 'withdrawn'],
	['withdraw', 'in-review', 'contractor', 'withdrawn'],
	['withdraw', 'corrections', 'contractor', 'withdrawn'],
	['start-review', 'submitted', 'inspector', 'in-review'],
	['start-review', 'resubmitted', 'inspector', 'in-review'],
	['close', 'final-passed', 'inspector', 'closed'],
];

describe('the simple moves', () => {
	test.each(MOVES)(
		'%s from %s by the %s moves the job to %s and records it',
		async (action, from, by, to) => {
			const job = await jobIn(from);
			const res = await move(job.id, action, who[by](), { note: 'Moved in a test.' });
			expect(res.status).toBe(200);
			expect(res.body).toMatchObject({ from, to });
			const state = await stateOf(job.id);
			expect(state.status).toBe(to);
			if (action === 'start-review') expect(state.assigned_inspector_id).toBe(ahj.userId);
			const audit = await db('audit_log')
				.where({ job_id: job.id, entity: 'status' })
				.first('before', 'after', 'user_id');
			expect(audit).toMatchObject({
				before: { status: from },
				after: { status: to, action, note: 'Moved in a test.' },
				user_id: by === 'contractor' ? expect.any(String) : ahj.userId,
			});
		},
	);

	const refusals: [string, string, Who, number][] = [];
	for (const [action, from, by] of MOVES.filter((m, i, all) => all.findIndex((x) => x[0] === m[0]) === i)) {
		for (const w of Object.keys(who) as Who[]) {
			if (w === by) continue;
			const status =
				w === 'the signed-out'
					? 401
					: w === 'another firm' || w === 'an inspector of another jurisdiction'
						? 404
						: 403;
			refusals.push([action, from, w, status]);
		}
	}
	test.each(refusals)(
		'%s from %s is refused to %s (%i) and changes nothing',
		async (action, from, w, status) => {
			const job = await jobIn(from);
			const before = await stateOf(job.id);
			expect((await move(job.id, action, who[w]())).status).toBe(status);
			expect(await stateOf(job.id)).toEqual(before);
		},
	);

	test.each([
		['withdraw', 'approved', 'contractor', []],
		['withdraw', 'draft', 'contractor', ['submit']],
		['start-review', 'in-review', 'inspector', ['request-corrections', 'approve']],
		['close', 'in-review', 'inspector', ['request-corrections', 'approve']],
		['close', 'rough-in-passed', 'inspector', ['pass-final', 'fail-final']],
	] as [string, string, Who, string[]][])(
		'%s from %s answers 409 with the moves the %s may make instead',
		async (action, from, w, allowed) => {
			const job = await jobIn(from);
			if (from === 'draft') await db('jobs').where({ id: job.id }).update({ current_revision: 1 });
			const before = await stateOf(job.id);
			const res = await call<ErrorBody>(who[w](), 'POST', `/api/jobs/${job.id}/transitions`, { action });
			expect(res.status).toBe(409);
			expect(res.body.error.current).toMatchObject({ status: from });
			expect((res.body.error.current!.allowed as { action: string }[]).map((a) => a.action)).toEqual(allowed);
			expect(await stateOf(job.id)).toEqual(before);
		},
	);

	test.each([
		['submit', /submissions/],
		['resubmit', /submissions/],
		['approve', /decision/],
		['request-corrections', /decision/],
		['pass-rough-in', /inspections/],
		['fail-final', /inspections/],
		['finish', /choose a move/i],
	])('sends %s to its own endpoint with a 400, changing nothing', async (action, message) => {
		const job = await jobIn('in-review');
		const before = await stateOf(job.id);
		const res = await call<ErrorBody>(ahj.client, 'POST', `/api/jobs/${job.id}/transitions`, { action });
		expect(res.status).toBe(400);
		expect(JSON.stringify(res.body.error)).toMatch(message);
		expect(await stateOf(job.id)).toEqual(before);
	});
});

describe('the workflow state', () => {
	test('gives each side its own moves and the history oldest first, with who and when', async () => {
		const job = await jobIn('submitted');
		expect((await move(job.id, 'start-review', ahj.client)).status).toBe(200);
		expect((await move(job.id, 'withdraw', owner)).status).toBe(200);
		const mine = await call(owner, 'GET', `/api/jobs/${job.id}/workflow`);
		expect(mine.status).toBe(200);
		expect(mine.body).toMatchObject({
			status: 'withdrawn',
			label: 'Withdrawn',
			currentRevision: 1,
			permitNumber: '',
		});
		expect(mine.body.moves.map((m: any) => m.action)).toEqual(['submit']);
		expect(mine.body.timeline.map((e: any) => [e.entity, e.after.status, e.user?.name])).toEqual([
			['status', 'in-review', ahj.name],
			['status', 'withdrawn', 'Marisol Quenby'],
		]);
		expect(Date.parse(mine.body.timeline[0].at)).toBeLessThanOrEqual(Date.parse(mine.body.timeline[1].at));
		const theirs = await call(ahj.client, 'GET', `/api/jobs/${job.id}/workflow`);
		expect(theirs.body.moves).toEqual([]);
		for (const c of [homeowner, admin]) {
			const res = await call(c, 'GET', `/api/jobs/${job.id}/workflow`);
			expect(res.status).toBe(200);
			expect(res.body.moves).toEqual([]);
		}
		expect((await call(elsewhere.client, 'GET', `/api/jobs/${job.id}/workflow`)).status).toBe(404);
		expect((await call(other.client, 'GET', `/api/jobs/${job.id}/workflow`)).status).toBe(404);
		expect((await call(new HttpClient(), 'GET', `/api/jobs/${job.id}/workflow`)).status).toBe(401);
	});
});
