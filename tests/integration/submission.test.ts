/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_JURISDICTION, DEMO_PROPERTIES } from '../../seeds/data/demo-accounts';
import { testDb } from '../helpers/db';
import { HttpClient, signedInAs } from '../helpers/http';
import {
	call,
	circuitAt,
	loadOf,
	mainPanel,
	newJob,
	otherFirmOwner,
	removeJobs,
	type ErrorBody,
	removeOtherFirm,
} from '../helpers/jobs';
import { readPdf, squash } from '../helpers/pdf';
import { newJurisdictionWithInspector, removeJurisdiction, submittedJob } from '../helpers/workflow';

const db = testDb();
const created: string[] = [];
const sha = (b: string | Uint8Array) => createHash('sha256').update(b).digest('hex');

let owner: HttpClient;
let electrician: HttpClient;
let homeowner: HttpClient;
let admin: HttpClient;
let other: Awaited<ReturnType<typeof otherFirmOwner>>;
let ahj: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let elsewhere: Awaited<ReturnType<typeof newJurisdictionWithInspector>>;
let ahjName: string;
const extraJurisdictions: Awaited<ReturnType<typeof newJurisdictionWithInspector>>[] = [];

beforeAll(async () => {
	[owner, electrician, homeowner, admin] = await Promise.all([
		signedInAs('owner'),
		signedInAs('electrician'),
		signedInAs('homeowner'),
		signedInAs('admin'),
	]);
	other = await otherFirmOwner();
	ahj = await newJurisdictionWithInspector(db);
	elsewhere = await newJurisdictionWithInspector(db);
	ahjName = (await db('jurisdictions').where({ id: ahj.jurisdictionId }).first('name')).name;
}, 60_000);

afterAll(async () => {
	await removeJobs(db, created);
	await removeJurisdiction(db, ahj);
	await removeJurisdiction(db, elsewhere);
	for (const j of extraJurisdictions) await removeJurisdiction(db, j);
	await removeOtherFirm(db, other);
	await db.destroy();
});

/**
 * A job of the owner's firm that passes every check: a main panel with one 20 A receptacle circuit
 * carrying four receptacles, filed with the test's jurisdiction at the demo homeowner's address
 * (so that homeowner reads it).
 */
async function readyJob(
	options: { jurisdiction?: string | null; address?: string; violation?: boolean } = {},
) {
	const job = (
		await call(
			owner,
			'POST',
			'/api/jobs',
			newJob({
				jurisdictionId: options.jurisdiction === undefined ? ahj.jurisdictionId : options.jurisdiction,
				...(options.address ? { address: options.address } : {}),
			}),
		)
	).body.job;
	created.push(job.id);
	const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
	// A 20 A breaker on 14 AWG copper breaks the small-conductor rule (NEC 2023 240.4(D)(3): 14 AWG Cu at 15 A).
	const circuit = (
		await call(
			owner,
			'POST',
			`/api/panels/${panel.id}/circuits`,
			circuitAt(1, {
				label: 'Hall receptacles',
				...(options.violation ? { conductor: { size: '14', material: 'cu', insulationC: 90 } } : {}),
			}),
		)
	).body.circuit;
	await call(owner, 'POST', `/api/circuits/${circuit.id}/loads`, loadOf());
	return {
		id: job.id as string,
		name: job.name as string,
		panelId: panel.id as string,
		circuitId: circuit.id,
	};
}

const readiness = async (jobId: string, client = owner) =>
	call(client, 'GET', `/api/jobs/${jobId}/readiness`);
const submit = (jobId: string, body: unknown = {}, client = owner) =>
	call(client, 'POST', `/api/jobs/${jobId}/submissions`, body);
const move = (jobId: string, action: string, client: HttpClient) =>
	call(client, 'POST', `/api/jobs/${jobId}/transitions`, { action });

async function stateOf(jobId: string) {
	const job = await db('jobs').where({ id: jobId }).first('status', 'current_revision', 'submitted_at');
	const revisions = await db('job_revisions').where({ job_id: jobId }).count({ n: '*' });
	return { ...job, revisions: Number(revisions[0]!.n) };
}

async function bytesOf(client: HttpClient, path: string): Promise<{ status: number; bytes: Uint8Array }> {
	const res = await client.fetch(path);
	return { status: res.status, bytes: new Uint8Array(await res.arrayBuffer()) };
}

describe('the jurisdictions list', () => {
	test('gives any signed-in user the jurisdictions with their adopted edition, and asks the signed-out to sign in', async () => {
		for (const client of [owner, homeowner, ahj.client, admin]) {
			const res = await call(client, 'GET', '/api/jurisdictions');
			expect(res.status).toBe(200);
			expect(res.body.jurisdictions).toContainEqual({
				id: ahj.jurisdictionId,
				name: ahjName,
				codeEdition: '2023',
			});
			expect(res.body.jurisdictions.find((j: any) => j.name === DEMO_JURISDICTION.name)?.codeEdition).toBe(
				DEMO_JURISDICTION.codeEdition,
			);
		}
		expect((await call(new HttpClient(), 'GET', '/api/jurisdictions')).status).toBe(401);
	});
});

describe('the readiness check', () => {
	test('passes a complete job filed with a jurisdiction, and offers the first submission', async () => {
		const job = await readyJob();
		const res = await readiness(job.id);
		expect(res.status).toBe(200);
		expect(res.body.canSubmit).toBe(true);
		expect(res.body.action).toBe('submit');
		expect(res.body.items.filter((i: any) => !i.ok)).toEqual([]);
		expect(res.body.items.map((i: any) => i.code)).toEqual(
			expect.arrayContaining(['status', 'jurisdiction', 'panel-schedule', 'load-calculation']),
		);
	});

	test.each([
		[
			'without a jurisdiction',
			async () => readyJob({ jurisdiction: null }),
			'jurisdiction',
			/choose the jurisdiction/i,
		],
		[
			'with a panel that has no circuits',
			async () => {
				const job = await readyJob();
				await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel({ name: 'Garage panel' }));
				return job;
			},
			'panel-schedule',
			/Garage panel: the panel has no circuits/,
		],
		[
			'without a sketch when the jurisdiction asks for one',
			async () => {
				const j = await newJurisdictionWithInspector(db);
				extraJurisdictions.push(j);
				await db('jurisdictions')
					.where({ id: j.jurisdictionId })
					.update({
						required_documents: JSON.stringify({ panelSchedules: true, loadCalculation: true, sketch: true }),
					});
				return readyJob({ jurisdiction: j.jurisdictionId });
			},
			'sketch',
			/at least one floor-plan sketch/,
		],
		[
			'that the engine cannot read yet (no main panel)',
			async () => {
				const job = (await call(owner, 'POST', '/api/jobs', newJob({ jurisdictionId: ahj.jurisdictionId })))
					.body.job;
				created.push(job.id);
				return { id: job.id };
			},
			'engine',
			/checks cannot run yet/,
		],
		[
			'that is already approved',
			async () => {
				const job = await readyJob();
				await db('jobs').where({ id: job.id }).update({ status: 'approved' });
				return job;
			},
			'status',
			/Permit approved/,
		],
	])(
		'refuses a job %s: the item is not met and a submission writes nothing',
		async (_what, make, code, message) => {
			const job = await make();
			const res = await readiness(job.id);
			expect(res.status).toBe(200);
			expect(res.body.canSubmit).toBe(false);
			const item = res.body.items.find((i: any) => i.code === code && !i.ok);
			expect(item?.message).toMatch(message);
			const before = await stateOf(job.id);
			const refused = await submit(job.id);
			expect(refused.status).toBe(409);
			expect(await stateOf(job.id)).toEqual(before);
		},
	);

	test('lists each error-level finding with the key its explanation names', async () => {
		const job = await readyJob({ violation: true });
		const res = await readiness(job.id);
		expect(res.body.canSubmit).toBe(true);
		const violations = res.body.items.filter((i: any) => i.code === 'violation');
		expect(violations.length).toBeGreaterThan(0);
		for (const v of violations) {
			expect(v.ok).toBe(false);
			expect(v.findingKey).toMatch(/^[a-z0-9-]+:(job|panel|circuit|room|load):/);
			expect(v.rule).toMatch(/NEC/);
		}
		expect(violations.some((v: any) => v.target?.id === job.circuitId)).toBe(true);
	});

	test.each([
		['the homeowner', () => homeowner, 403],
		['an administrator', () => admin, 403],
		['another firm', () => other.client, 404],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['the signed-out', () => new HttpClient(), 401],
	])('is for the firm only: %s gets %i', async (_who, client, status) => {
		const job = await readyJob({ address: DEMO_PROPERTIES.penhallow });
		expect((await readiness(job.id, client())).status).toBe(status);
	});
});

describe('submitting a job', () => {
	test('stores revision 1 in one go: status, document, results and packet with their sha256, and the audit entries', async () => {
		const job = await readyJob();
		const res = await submit(job.id, { note: 'Service unchanged; new hall circuit only.' });
		expect(res.status).toBe(201);
		expect(res.body.status).toBe('submitted');
		expect(res.body.revision).toMatchObject({ number: 1, note: 'Service unchanged; new hall circuit only.' });
		const row = await db('job_revisions').where({ job_id: job.id, number: 1 }).first();
		expect(sha(row.document_json)).toBe(row.document_sha256);
		expect(sha(row.results_json)).toBe(row.results_sha256);
		expect(sha(new Uint8Array(row.packet_pdf))).toBe(row.packet_sha256);
		expect(JSON.parse(row.document_json)).toMatchObject({
			id: job.id,
			name: job.name,
			jurisdiction: { name: ahjName },
		});
		expect(JSON.parse(row.results_json).summary.violation).toBe(0);
		expect(row.facts).toMatchObject({
			name: job.name,
			jurisdiction: ahjName,
			firm: 'Tallowmere Electric Co.',
		});
		expect(row.packet_pages).toBe((await readPdf(new Uint8Array(row.packet_pdf))).length);
		const state = await stateOf(job.id);
		expect(state).toMatchObject({ status: 'submitted', current_revision: 1, revisions: 1 });
		expect(state.submitted_at).not.toBeNull();
		const audit = await db('audit_log')
			.where({ job_id: job.id })
			.whereIn('entity', ['status', 'revision'])
			.orderBy('id')
			.select('entity', 'action', 'before', 'after');
		expect(audit.map((a) => [a.entity, a.action])).toEqual([
			['status', 'transition'],
			['revision', 'submit'],
		]);
		expect(audit[0].after).toMatchObject({ status: 'submitted', action: 'submit' });
		expect(audit[1].after).toMatchObject({ number: 1, packetSha256: row.packet_sha256 });
	}, 60_000);

	test('prints "rev 1" in every sheet footer of the stored packet, and the live packet is the draft of rev 2', async () => {
		const job = await readyJob();
		expect((await submit(job.id)).status).toBe(201);
		const stored = await bytesOf(owner, `/api/jobs/${job.id}/revisions/1/packet.pdf`);
		expect(stored.status).toBe(200);
		const pages = await readPdf(stored.bytes);
		expect(pages.length).toBeGreaterThan(3);
		pages.forEach((p, i) =>
			expect(p.text).toContain(`Sheet ${i + 1} of ${pages.length} · ${job.name} · rev 1`),
		);
		expect(pages.some((p) => p.text.includes('draft'))).toBe(false);
		const live = await readPdf((await bytesOf(owner, `/api/jobs/${job.id}/documents/packet.pdf`)).bytes);
		live.forEach((p, i) =>
			expect(p.text).toContain(
				`Sheet ${i + 1} of ${live.length} · ${job.name} · rev 2 draft (not submitted)`,
			),
		);
	}, 90_000);

	test('asks for a note on each error-level finding, then prints the notes in the packet', async () => {
		const job = await readyJob({ violation: true });
		const keys = (await readiness(job.id)).body.items
			.filter((i: any) => i.code === 'violation')
			.map((i: any) => i.findingKey);
		const before = await stateOf(job.id);
		const refused = await submit(job.id, { explanations: [] });
		expect(refused.status).toBe(400);
		for (const k of keys)
			expect(refused.body.error.fields[`explanations.${k}`]?.[0]).toMatch(/fix this finding or explain it/i);
		expect(await stateOf(job.id)).toEqual(before);

		const note = 'Existing 14 AWG home run stays; the breaker is changed to 15 A at rough-in.';
		const res = await submit(job.id, {
			explanations: keys.map((findingKey: string) => ({ findingKey, note })),
		});
		expect(res.status).toBe(201);
		const revision = (await call(owner, 'GET', `/api/jobs/${job.id}/revisions/1`)).body.revision;
		expect(revision.explanations).toHaveLength(keys.length);
		expect(revision.explanations[0]).toMatchObject({ findingKey: keys[0], note });
		const text = squash(
			(await readPdf((await bytesOf(owner, `/api/jobs/${job.id}/revisions/1/packet.pdf`)).bytes))
				.map((p) => p.text)
				.join(' '),
		);
		expect(text).toContain('Findings explained by the contractor');
		expect(text).toContain(note);
	}, 90_000);

	test.each([
		['a blank note', (k: string) => ({ explanations: [{ findingKey: k, note: '   ' }] }), /explain why/i],
		[
			'a note over 1000 characters',
			(k: string) => ({ explanations: [{ findingKey: k, note: 'x'.repeat(1001) }] }),
			/at most 1000/,
		],
		[
			'a finding explained twice',
			(k: string) => ({
				explanations: [
					{ findingKey: k, note: 'one' },
					{ findingKey: k, note: 'two' },
				],
			}),
			/explained once/,
		],
		[
			'a note on a finding the job does not have',
			(k: string) => ({
				explanations: [
					{ findingKey: k, note: 'real' },
					{ findingKey: 'breaker-overload:circuit:nothing', note: 'made up' },
				],
			}),
			/no such error-level finding/i,
		],
		['an unknown field', () => ({ urgent: true }), /urgent/],
		['a note to the reviewer over 2000 characters', () => ({ note: 'n'.repeat(2001) }), /at most 2000/],
	])('refuses %s with a clear message and writes nothing', async (_what, body, message) => {
		const job = await readyJob({ violation: true });
		const key = (await readiness(job.id)).body.items.find((i: any) => i.code === 'violation').findingKey;
		const before = await stateOf(job.id);
		const res = await submit(job.id, body(key));
		expect(res.status).toBe(400);
		expect(JSON.stringify(res.body.error.fields)).toMatch(message);
		expect(await stateOf(job.id)).toEqual(before);
	});

	test('lets an electrician of the firm submit too', async () => {
		const job = await readyJob();
		expect((await submit(job.id, {}, electrician)).status).toBe(201);
	}, 60_000);

	test.each([
		['the homeowner', () => homeowner, 403],
		['an administrator', () => admin, 403],
		['another firm', () => other.client, 404],
		['an inspector of the jurisdiction (nothing submitted yet)', () => ahj.client, 404],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['the signed-out', () => new HttpClient(), 401],
	])('refuses %s (%i) and writes nothing', async (_who, client, status) => {
		const job = await readyJob({ address: DEMO_PROPERTIES.penhallow });
		const before = await stateOf(job.id);
		expect((await submit(job.id, {}, client())).status).toBe(status);
		expect(await stateOf(job.id)).toEqual(before);
	});

	test('refuses the inspector of the jurisdiction, who reads a submitted job, with 403 on the check and the resubmission', async () => {
		const job = await submittedJob(db, owner, ahj.jurisdictionId, { status: 'corrections' });
		created.push(job.id);
		expect((await call(ahj.client, 'GET', `/api/jobs/${job.id}`)).status).toBe(200);
		expect((await readiness(job.id, ahj.client)).status).toBe(403);
		const before = await stateOf(job.id);
		expect((await submit(job.id, {}, ahj.client)).status).toBe(403);
		expect(await stateOf(job.id)).toEqual(before);
	});

	test('refuses a second submission while the first is with the reviewer: 409 with the allowed moves', async () => {
		const job = await readyJob();
		expect((await submit(job.id)).status).toBe(201);
		const before = await stateOf(job.id);
		const res = await call<ErrorBody>(owner, 'POST', `/api/jobs/${job.id}/submissions`, {});
		expect(res.status).toBe(409);
		expect(res.body.error.current).toMatchObject({
			status: 'submitted',
			allowed: [{ action: 'withdraw', to: 'withdrawn' }],
		});
		expect(await stateOf(job.id)).toEqual(before);
	}, 60_000);
});

describe('revisions', () => {
	let job: Awaited<ReturnType<typeof readyJob>>;
	let first: { document: string; packet: Uint8Array; sha: string };

	beforeAll(async () => {
		job = await readyJob({ address: DEMO_PROPERTIES.penhallow });
		expect((await submit(job.id)).status).toBe(201);
		const row = await db('job_revisions').where({ job_id: job.id, number: 1 }).first();
		first = { document: row.document_json, packet: new Uint8Array(row.packet_pdf), sha: row.packet_sha256 };
	}, 60_000);

	test('numbers a resubmission after corrections N + 1, keeping revision N', async () => {
		expect((await move(job.id, 'start-review', ahj.client)).status).toBe(200);
		// The decision is the review's own endpoint; here the status is set as a decision would leave it.
		await db('jobs').where({ id: job.id }).update({ status: 'corrections' });
		await call(owner, 'PATCH', `/api/jobs/${job.id}`, {
			version: (await call(owner, 'GET', `/api/jobs/${job.id}`)).body.job.version,
			scopeOfWork: 'Hall circuit; breaker label corrected',
		});
		const res = await submit(job.id, { note: 'Labels corrected.' });
		expect(res.status).toBe(201);
		expect(res.body).toMatchObject({ status: 'resubmitted', revision: { number: 2 } });
		const list = await call(owner, 'GET', `/api/jobs/${job.id}/revisions`);
		expect(list.body.revisions.map((r: any) => r.number)).toEqual([1, 2]);
		expect(list.body.revisions[0]).toMatchObject({
			packetSha256: first.sha,
			submittedBy: { name: 'Marisol Quenby' },
		});
		expect((await stateOf(job.id)).current_revision).toBe(2);
		const pages = await readPdf((await bytesOf(owner, `/api/jobs/${job.id}/revisions/2/packet.pdf`)).bytes);
		pages.forEach((p) => expect(p.text).toMatch(/· rev 2$|· rev 2 /));
	}, 90_000);

	test('keeps the stored document and packet bytes unchanged after later edits of the job', async () => {
		const version = (await call(owner, 'GET', `/api/jobs/${job.id}`)).body.job.version;
		expect(
			(await call(owner, 'PATCH', `/api/jobs/${job.id}`, { version, name: `${job.name} (edited)` })).status,
		).toBe(200);
		expect(
			(
				await call(
					owner,
					'POST',
					`/api/panels/${job.panelId}/circuits`,
					circuitAt(5, { label: 'Added later' }),
				)
			).status,
		).toBe(201);
		const row = await db('job_revisions').where({ job_id: job.id, number: 1 }).first();
		expect(row.document_json).toBe(first.document);
		expect(sha(row.document_json)).toBe(row.document_sha256);
		const served = await bytesOf(owner, `/api/jobs/${job.id}/revisions/1/packet.pdf`);
		expect(sha(served.bytes)).toBe(first.sha);
		expect(Buffer.compare(Buffer.from(served.bytes), Buffer.from(first.packet))).toBe(0);
		const revision = (await call(owner, 'GET', `/api/jobs/${job.id}/revisions/1`)).body.revision;
		expect(revision.document.name).toBe(job.name);
		expect(revision.document.circuits).toHaveLength(1);
		expect(revision.documentSha256).toBe(sha(first.document));
	});

	test('keeps the jurisdiction once submitted: moving the job to another is a 400 and writes nothing', async () => {
		const before = await db('jobs').where({ id: job.id }).first();
		const res = await call<ErrorBody>(owner, 'PATCH', `/api/jobs/${job.id}`, {
			version: before.version,
			jurisdictionId: elsewhere.jurisdictionId,
		});
		expect(res.status).toBe(400);
		expect(res.body.error.fields?.jurisdictionId?.[0]).toMatch(/fixed since the first submission/);
		expect(await db('jobs').where({ id: job.id }).first()).toEqual(before);
		// Sending the same jurisdiction with another change is fine.
		const same = await call(owner, 'PATCH', `/api/jobs/${job.id}`, {
			version: before.version,
			jurisdictionId: ahj.jurisdictionId,
			homeownerName: 'Odalys Penhallow',
		});
		expect(same.status).toBe(200);
	});

	test('the database refuses to change or delete a stored revision', async () => {
		const before = await db('job_revisions')
			.where({ job_id: job.id })
			.orderBy('number')
			.select('id', 'note', 'packet_sha256');
		await expect(db('job_revisions').where({ job_id: job.id }).update({ note: 'rewritten' })).rejects.toThrow(
			/cannot be changed or deleted/,
		);
		await expect(
			db('job_revisions')
				.where({ job_id: job.id })
				.update({ packet_pdf: Buffer.from('%PDF-') }),
		).rejects.toThrow(/cannot be changed or deleted/);
		await expect(db('job_revisions').where({ job_id: job.id }).delete()).rejects.toThrow(
			/cannot be changed or deleted/,
		);
		expect(
			await db('job_revisions')
				.where({ job_id: job.id })
				.orderBy('number')
				.select('id', 'note', 'packet_sha256'),
		).toEqual(before);
	});

	test.each([
		['the firm', () => owner, 200],
		['an inspector of the jurisdiction', () => ahj.client, 200],
		['the homeowner of the property', () => homeowner, 200],
		['an administrator', () => admin, 200],
		['an inspector of another jurisdiction', () => elsewhere.client, 404],
		['another firm', () => other.client, 404],
		['the signed-out', () => new HttpClient(), 401],
	])('are read by %s (%i): list, one revision, its stored packet', async (_who, client, status) => {
		const c = client();
		expect((await call(c, 'GET', `/api/jobs/${job.id}/revisions`)).status).toBe(status);
		const one = await call(c, 'GET', `/api/jobs/${job.id}/revisions/1`);
		expect(one.status).toBe(status);
		const pdf = await bytesOf(c, `/api/jobs/${job.id}/revisions/1/packet.pdf`);
		expect(pdf.status).toBe(status);
		if (status === 200) {
			expect(one.body.revision).toMatchObject({
				number: 1,
				packetSha256: first.sha,
				facts: { name: job.name },
			});
			expect(sha(pdf.bytes)).toBe(first.sha);
		}
	});

	test.each([['0'], ['99'], ['one'], ['1.5']])('answers 404 for revision %s', async (n) => {
		expect((await call(owner, 'GET', `/api/jobs/${job.id}/revisions/${n}`)).status).toBe(404);
		expect((await bytesOf(owner, `/api/jobs/${job.id}/revisions/${n}/packet.pdf`)).status).toBe(404);
	});

	test('gives the homeowner, the inspector and the administrator the latest stored packet at the packet address', async () => {
		const latest = await db('job_revisions')
			.where({ job_id: job.id })
			.orderBy('number', 'desc')
			.first('packet_sha256');
		for (const c of [homeowner, ahj.client, admin]) {
			const res = await bytesOf(c, `/api/jobs/${job.id}/documents/packet.pdf`);
			expect(res.status).toBe(200);
			expect(sha(res.bytes)).toBe(latest.packet_sha256);
		}
		expect((await bytesOf(elsewhere.client, `/api/jobs/${job.id}/documents/packet.pdf`)).status).toBe(404);
	});

	test('answers 404 at the packet address to readers other than the firm before any submission', async () => {
		const draft = await readyJob({ address: DEMO_PROPERTIES.penhallow });
		expect((await bytesOf(homeowner, `/api/jobs/${draft.id}/documents/packet.pdf`)).status).toBe(404);
		expect((await bytesOf(admin, `/api/jobs/${draft.id}/documents/packet.pdf`)).status).toBe(404);
		expect((await bytesOf(ahj.client, `/api/jobs/${draft.id}/documents/packet.pdf`)).status).toBe(404);
	});
});
