/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_JURISDICTION, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import { call, otherFirmOwner, removeJobs } from '../helpers/jobs';
import {
	newJurisdictionWithInspector,
	removeJurisdiction,
	storeRevision,
	submittedJob,
} from '../helpers/workflow';

const db = testDb();
type Who =
	| 'otherHomeowner'
	| 'owner'
	| 'inspector'
	| 'homeowner'
	| 'admin'
	| 'otherFirm'
	| 'otherInspector'
	| 'signedOut';
const clients = {} as Record<Who, HttpClient>;
let other: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let otherFirm: Awaited<ReturnType<typeof otherFirmOwner>>;
const jobIds: string[] = [];
let job: Awaited<ReturnType<typeof submittedJob>>;
let circuitComment: string;
let panelComment: string;
let sheetComment: string;

beforeAll(async () => {
	[clients.owner, clients.inspector, clients.homeowner, clients.admin] = await Promise.all([
		signedInAs('owner'),
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

	const jurisdiction = await db('jurisdictions').where({ name: DEMO_JURISDICTION.name }).first('id');
	job = await submittedJob(db, clients.owner, jurisdiction.id, {
		status: 'corrections',
		address: DEMO_PROPERTIES.penhallow,
	});
	jobIds.push(job.id);
	const inspector = await db('users').where({ email: DEMO_ACCOUNTS.inspector.email }).first('id');
	const owner = await db('users').where({ email: DEMO_ACCOUNTS.owner.email }).first('id');
	const comment = async (row: Record<string, unknown>) =>
		(
			await db('review_comments')
				.insert({ job_id: job.id, revision_number: 1, author_id: inspector.id, ...row })
				.returning('id')
		)[0].id as string;
	circuitComment = await comment({
		target_kind: 'circuit',
		circuit_id: job.circuitIds[0],
		panel_id: job.panelId,
		target_label: 'Circuit 1',
		body: 'A 20 A breaker on this run of 12 AWG: show the load or lower the rating.',
	});
	panelComment = await comment({
		target_kind: 'panel',
		panel_id: job.panelId,
		target_label: 'Main panel',
		body: 'Give the panel’s location.',
	});
	sheetComment = await comment({ target_kind: 'sheet', sheet: 1, body: 'Sign the cover sheet.' });
	await db('review_comment_entries').insert([
		{ comment_id: circuitComment, author_id: owner.id, action: 'reply', body: 'Lowered to 15 A.' },
		{ comment_id: circuitComment, author_id: inspector.id, action: 'reply', body: 'Thanks, will check.' },
	]);

	// The contractor's corrections, then revision 2 as a resubmission stores it.
	const circuit = (await call(clients.owner, 'GET', `/api/jobs/${job.id}/tree`)).body.circuits.find(
		(c: any) => c.id === job.circuitIds[0],
	);
	const patched = await call(clients.owner, 'PATCH', `/api/circuits/${circuit.id}`, {
		ratingA: 15,
		breakerType: 'afci',
		conductor: { size: '14', material: 'cu', insulationC: 90 },
		version: circuit.version,
	});
	expect(patched.status).toBe(200);
	await storeRevision(db, job.id, 2);
	await db('jobs').where({ id: job.id }).update({ current_revision: 2, status: 'resubmitted' });
});

afterAll(async () => {
	await removeJobs(db, jobIds);
	if (other) await removeJurisdiction(db, other);
	if (otherFirm) {
		await db('firms').where({ id: otherFirm.firmId }).delete();
		await db('users').where({ id: otherFirm.userId }).delete();
	}
	await db.destroy();
});

describe('changes between revisions', () => {
	test('revision 2 shows the changed circuit field by field and the comments it answers, with the contractor’s answers', async () => {
		const res = await call(clients.inspector, 'GET', `/api/jobs/${job.id}/revisions/2/changes`);
		expect(res.status).toBe(200);
		expect(res.body).toMatchObject({ from: 1, to: 2 });
		expect(res.body.records).toHaveLength(1);
		const change = res.body.records[0];
		expect(change).toMatchObject({
			kind: 'circuit',
			id: job.circuitIds[0],
			change: 'changed',
			title: 'Circuit 1 “Kitchen counter”',
		});
		expect(change.fields).toEqual([
			{ field: 'ratingA', before: 20, after: 15 },
			{
				field: 'conductor',
				before: { size: '12', material: 'cu', insulationC: 90 },
				after: { size: '14', material: 'cu', insulationC: 90 },
			},
		]);
		expect(change.answers.sort()).toEqual([circuitComment, panelComment].sort());
		const byId = Object.fromEntries(res.body.comments.map((c: any) => [c.id, c]));
		expect(byId[circuitComment].answeredBy).toEqual([change.key]);
		// Only the firm's side of the thread counts as the contractor's answer.
		expect(byId[circuitComment].answers.map((a: any) => a.body)).toEqual(['Lowered to 15 A.']);
		expect(byId[sheetComment].answeredBy).toEqual([]);
		expect(res.body.figures.find((f: any) => f.key === 'service.minimumServiceA')).toMatchObject({
			unit: 'A',
		});
	});

	test('the first revision has nothing before it', async () => {
		const res = await call(clients.owner, 'GET', `/api/jobs/${job.id}/revisions/1/changes`);
		expect(res.status).toBe(200);
		expect(res.body).toMatchObject({ from: null, to: 1, records: [], comments: [] });
	});

	test.each([
		['the firm', 'owner', 200],
		['the inspector of the jurisdiction', 'inspector', 200],
		['an administrator', 'admin', 200],
		['the homeowner', 'homeowner', 404],
		['a contractor of another firm', 'otherFirm', 404],
		['an inspector of another jurisdiction', 'otherInspector', 404],
		['the owner of another home', 'otherHomeowner', 404],
		['someone signed out', 'signedOut', 401],
	] as const)('%s asking for the changes gets %i', async (_n, who, status) => {
		const res = await call(clients[who], 'GET', `/api/jobs/${job.id}/revisions/2/changes`);
		expect(res.status).toBe(status);
		if (status !== 200) expect(JSON.stringify(res.body)).not.toContain('Kitchen counter');
	});

	test.each([['3'], ['0'], ['two'], ['-1']])('revision %s of the job is not found', async (n) => {
		const res = await call(clients.inspector, 'GET', `/api/jobs/${job.id}/revisions/${n}/changes`);
		expect(res.status).toBe(404);
	});
});
