/* eslint-disable @typescript-eslint/no-explicit-any -- tests read JSON bodies loosely */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { PDFDocument } from 'pdf-lib';
import { jobDocumentData, jobTreeOr404 } from '../../src/lib/documents/job-documents';
import { renderHere } from '../../src/lib/documents/render-document';
import { hashPassword } from '../../src/lib/passwords';
import type { JobStatus } from '../../src/lib/workflow/status';
import { HttpClient } from './http';
import { call, circuitAt, mainPanel, newJob, uniq } from './jobs';

const sha = (b: string | Uint8Array) => createHash('sha256').update(b).digest('hex');

/** A jurisdiction of its own with one signed-in inspector, so a test's queue holds only its own jobs. */
export async function newJurisdictionWithInspector(
	db: Knex,
	staffRole: 'inspector' | 'administrator' = 'inspector',
	pattern = 'E{YYYY}-{SEQ:5}',
): Promise<{ jurisdictionId: string; userId: string; client: HttpClient; name: string }> {
	const tag = uniq();
	const [j] = await db('jurisdictions')
		.insert({
			name: `Brackwater Vale Permit Office ${tag}`,
			code_edition: '2023',
			address: '5 Sallow Square, Brackwater Vale',
			permit_number_pattern: pattern,
		})
		.returning('id');
	const email = `inspector-${tag}@brackwater-vale.example`;
	const name = `Corvin Ashby ${tag}`;
	const [u] = await db('users')
		.insert({ email, name, password_hash: await hashPassword('inspect-the-rough-in') })
		.returning('id');
	await db('jurisdiction_inspectors').insert({ jurisdiction_id: j.id, user_id: u.id, staff_role: staffRole });
	const client = new HttpClient();
	const failure = await client.signIn(email, 'inspect-the-rough-in');
	if (failure) throw new Error(`inspector sign-in failed: ${failure}`);
	return { jurisdictionId: j.id, userId: u.id, client, name };
}

/** Removes what newJurisdictionWithInspector made (after the test's jobs are gone). */
export async function removeJurisdiction(
	db: Knex,
	j: { jurisdictionId: string; userId: string },
): Promise<void> {
	await db('jobs').where({ jurisdiction_id: j.jurisdictionId }).delete();
	await db('jurisdictions').where({ id: j.jurisdictionId }).delete();
	await db('users').where({ id: j.userId }).delete();
}

let blankPacket: Uint8Array | null = null;

/** A plain three-page PDF, for tests that need a stored packet but never look at it. */
async function plainPacket(): Promise<Uint8Array> {
	if (!blankPacket) {
		const pdf = await PDFDocument.create();
		for (let i = 0; i < 3; i++) pdf.addPage([612, 792]);
		blankPacket = await pdf.save();
	}
	return blankPacket;
}

/**
 * A job of the owner's firm with a main panel and two circuits, stored as submitted revision 1 to a
 * jurisdiction: the document and results as the document code builds them, and the packet either
 * rendered by the real packet code (`realPacket`) or a plain three-page PDF. The status and the
 * submission time can be set, to build a queue.
 */
export async function submittedJob(
	db: Knex,
	owner: HttpClient,
	jurisdictionId: string,
	options: {
		status?: JobStatus;
		submittedAt?: Date;
		realPacket?: boolean;
		address?: string;
		note?: string;
	} = {},
): Promise<{ id: string; name: string; panelId: string; circuitIds: string[] }> {
	const job = (
		await call(owner, 'POST', '/api/jobs', newJob(options.address ? { address: options.address } : {}))
	).body.job;
	if (!job) throw new Error('job create failed');
	const panel = (await call(owner, 'POST', `/api/jobs/${job.id}/panels`, mainPanel())).body.panel;
	const c1 = (
		await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(1, { label: 'Kitchen counter' }))
	).body.circuit;
	const c2 = (
		await call(owner, 'POST', `/api/panels/${panel.id}/circuits`, circuitAt(3, { label: 'Bedroom lights' }))
	).body.circuit;
	await db('jobs').where({ id: job.id }).update({ jurisdiction_id: jurisdictionId });
	await storeRevision(db, job.id, 1, options);
	await db('jobs')
		.where({ id: job.id })
		.update({
			status: options.status ?? 'submitted',
			current_revision: 1,
			submitted_at: options.submittedAt ?? new Date(),
		});
	return { id: job.id, name: job.name, panelId: panel.id, circuitIds: [c1.id, c2.id] };
}

/** Stores revision `number` of a job from its live records, as a submission would. */
export async function storeRevision(
	db: Knex,
	jobId: string,
	number: number,
	options: { realPacket?: boolean; note?: string } = {},
): Promise<void> {
	const tree = await jobTreeOr404(db, jobId);
	const data = await jobDocumentData(db, tree, { mapUrl: null });
	const packet = options.realPacket
		? await renderHere({ kind: 'packet', data: { ...data, revision: number, draft: false }, size: 'letter' })
		: await plainPacket();
	const pages = (await PDFDocument.load(packet)).getPageCount();
	const documentJson = JSON.stringify(data.doc);
	const resultsJson = JSON.stringify(data.result);
	await db('job_revisions').insert({
		job_id: jobId,
		number,
		document_json: documentJson,
		document_sha256: sha(documentJson),
		results_json: resultsJson,
		results_sha256: sha(resultsJson),
		packet_pdf: Buffer.from(packet),
		packet_sha256: sha(packet),
		packet_pages: pages,
		facts: JSON.stringify({ name: data.job.name, firm: data.firm.name }),
		explanations: JSON.stringify([]),
		note: options.note ?? '',
	});
}

/** Writes a comment through the API as a reviewer and returns it. */
export async function commentOn(
	inspector: HttpClient,
	jobId: string,
	body: Record<string, unknown> = {},
): Promise<any> {
	const res = await call(inspector, 'POST', `/api/jobs/${jobId}/comments`, {
		targetKind: 'job',
		body: 'Show the grounding electrode conductor size on the riser.',
		...body,
	});
	if (res.status !== 201) throw new Error(`comment failed: ${res.status} ${JSON.stringify(res.body)}`);
	return res.body.comment;
}
