import type { Knex } from 'knex';
import type { JobDocument, JobResult } from '../electrical';
import type { ExplainedFinding } from '../documents/types';

/** The facts of the job printed on a revision's packet, kept beside it as they were. */
export interface RevisionFacts {
	name: string;
	address: string;
	firm: string;
	jurisdiction: string | null;
	permitType: string;
	homeownerName: string;
	homeownerEmail: string;
	scopeOfWork: string;
}

/** A stored revision as the revisions list shows it (no document, no bytes). */
export interface RevisionSummary {
	number: number;
	submittedAt: string;
	submittedBy: { id: string; name: string } | null;
	documentSha256: string;
	resultsSha256: string;
	packetSha256: string;
	packetPages: number;
	note: string;
}

/** A stored revision with what was submitted, parsed back from the stored JSON. */
export interface Revision extends RevisionSummary {
	document: JobDocument;
	results: JobResult;
	facts: RevisionFacts;
	explanations: ExplainedFinding[];
}

/** What a submission stores; the database refuses any later change to it. */
export interface NewRevision {
	jobId: string;
	number: number;
	documentJson: string;
	documentSha256: string;
	resultsJson: string;
	resultsSha256: string;
	packetPdf: Uint8Array;
	packetSha256: string;
	packetPages: number;
	facts: RevisionFacts;
	explanations: ExplainedFinding[];
	note: string;
	submittedBy: string;
}

const SUMMARY_COLUMNS = [
	'r.number',
	'r.submitted_at',
	'r.submitted_by',
	'u.name as submitted_by_name',
	'r.document_sha256',
	'r.results_sha256',
	'r.packet_sha256',
	'r.packet_pages',
	'r.note',
];

function summaryFromRow(r: Record<string, unknown>): RevisionSummary {
	return {
		number: Number(r.number),
		submittedAt: new Date(r.submitted_at as string).toISOString(),
		submittedBy: r.submitted_by
			? { id: String(r.submitted_by), name: String(r.submitted_by_name ?? '') }
			: null,
		documentSha256: String(r.document_sha256),
		resultsSha256: String(r.results_sha256),
		packetSha256: String(r.packet_sha256),
		packetPages: Number(r.packet_pages),
		note: String(r.note ?? ''),
	};
}

/** Stores a submitted revision (inside the submission's transaction) and returns its id. */
export async function insertRevision(trx: Knex, r: NewRevision): Promise<string> {
	const [row] = await trx('job_revisions')
		.insert({
			job_id: r.jobId,
			number: r.number,
			document_json: r.documentJson,
			document_sha256: r.documentSha256,
			results_json: r.resultsJson,
			results_sha256: r.resultsSha256,
			packet_pdf: Buffer.from(r.packetPdf.buffer, r.packetPdf.byteOffset, r.packetPdf.byteLength),
			packet_sha256: r.packetSha256,
			packet_pages: r.packetPages,
			facts: JSON.stringify(r.facts),
			explanations: JSON.stringify(r.explanations),
			note: r.note,
			submitted_by: r.submittedBy,
		})
		.returning('id');
	return String(row.id);
}

/** A job's submitted revisions, first to latest. */
export async function listRevisions(knex: Knex, jobId: string): Promise<RevisionSummary[]> {
	const rows = await knex('job_revisions as r')
		.leftJoin('users as u', 'u.id', 'r.submitted_by')
		.where('r.job_id', jobId)
		.orderBy('r.number')
		.select(SUMMARY_COLUMNS);
	return rows.map(summaryFromRow);
}

/** One revision of a job with its document, results, facts and explanations, or null. */
export async function getRevision(knex: Knex, jobId: string, number: number): Promise<Revision | null> {
	if (!Number.isInteger(number) || number < 1 || number > 1_000_000) return null;
	const r = await knex('job_revisions as r')
		.leftJoin('users as u', 'u.id', 'r.submitted_by')
		.where({ 'r.job_id': jobId, 'r.number': number })
		.first([...SUMMARY_COLUMNS, 'r.document_json', 'r.results_json', 'r.facts', 'r.explanations']);
	if (!r) return null;
	return {
		...summaryFromRow(r),
		document: JSON.parse(r.document_json) as JobDocument,
		results: JSON.parse(r.results_json) as JobResult,
		facts: r.facts as RevisionFacts,
		explanations: (r.explanations ?? []) as ExplainedFinding[],
	};
}

/** The stored packet of a revision (the latest when `number` is null): its bytes exactly as submitted. */
export async function getRevisionPacket(
	knex: Knex,
	jobId: string,
	number: number | null,
): Promise<{ number: number; bytes: Uint8Array; sha256: string; name: string } | null> {
	if (number !== null && (!Number.isInteger(number) || number < 1 || number > 1_000_000)) return null;
	const q = knex('job_revisions').where({ job_id: jobId });
	if (number !== null) q.andWhere({ number });
	const r = await q.orderBy('number', 'desc').first('number', 'packet_pdf', 'packet_sha256', 'facts');
	if (!r) return null;
	const buf = r.packet_pdf as Buffer;
	return {
		number: Number(r.number),
		bytes: new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength),
		sha256: String(r.packet_sha256),
		name: String((r.facts as RevisionFacts | null)?.name ?? 'job'),
	};
}
