/**
 * Submitting a job for plan review: the readiness check, the packet rendered as revision N, and
 * one transaction that moves the status and stores the revision (document, results and packet,
 * each with its sha256), so that the reviewer reads exactly what was sent.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { PDFDocument } from 'pdf-lib';
import { jobDocumentData, jobTreeOr404 } from '../documents/job-documents';
import { renderDocument } from '../documents/render-pool';
import type { ExplainedFinding } from '../documents/types';
import { permitTypeOf } from '../documents/data';
import { AppError, errors } from '../errors';
import { jobDocumentFromRows } from '../job-document';
import type { JobRef } from '../access';
import { recordAudit } from '../repositories/audit';
import { loadJobTree } from '../repositories/jobs';
import { firmForDocuments } from '../repositories/documents';
import {
	insertRevision,
	type RevisionFacts,
	type RevisionSummary,
	listRevisions,
} from '../repositories/revisions';
import { inTransaction } from '../repositories/versioned';
import type { CurrentUser } from '../roles';
import type { Submission } from '../schemas/submission';
import { loadReadiness } from './readiness';
import { JOB_STATUS_LABELS, type JobStatus } from './status';
import { applyTransition, movesFor } from './transitions';

const sha256 = (data: string | Uint8Array) => createHash('sha256').update(data).digest('hex');

/** The explanations matched to the violations: a 400 naming each violation without a note and each note without a violation. */
function matchExplanations(
	violations: { key: string; finding: { code: string; message: string; rule: string } }[],
	given: Submission['explanations'],
): ExplainedFinding[] {
	const notes = new Map(given.map((e) => [e.findingKey, e.note]));
	const keys = new Set(violations.map((v) => v.key));
	const fields: Record<string, string[]> = {};
	for (const v of violations) {
		if (!notes.has(v.key))
			fields[`explanations.${v.key}`] = [`Fix this finding or explain it: ${v.finding.message}`];
	}
	for (const key of notes.keys()) {
		if (!keys.has(key))
			fields[`explanations.${key}`] = ['No such error-level finding now (fixed already?): remove this note.'];
	}
	const missing = violations.filter((v) => !notes.has(v.key)).length;
	if (Object.keys(fields).length) {
		throw errors.invalid(
			missing
				? `${missing} error-level finding${missing === 1 ? '' : 's'} need${missing === 1 ? 's' : ''} a fix or an explanation before submitting. Nothing was submitted.`
				: 'Some explanations name findings the job no longer has. Nothing was submitted.',
			fields,
		);
	}
	return violations.map((v) => ({
		findingKey: v.key,
		code: v.finding.code,
		message: v.finding.message,
		rule: v.finding.rule,
		note: notes.get(v.key)!,
	}));
}

/**
 * Submits (or resubmits after corrections) the job as its next revision. The packet is rendered in
 * the documents worker before the transaction; inside it, with the job row locked, the job's records
 * must be what was rendered (else 409, nothing stored).
 */
export async function submitJob(
	knex: Knex,
	user: CurrentUser,
	ref: JobRef,
	input: Submission,
): Promise<{ revision: RevisionSummary; status: JobStatus }> {
	const tree = await jobTreeOr404(knex, ref.id);
	const ready = await loadReadiness(knex, tree);
	if (!ready.action) {
		const allowed = movesFor(user, ref).map((m) => ({ action: m.action, to: m.to, label: m.label }));
		throw errors.conflict(
			`A job that is “${JOB_STATUS_LABELS[tree.job.status]}” is not submitted now. ${
				allowed.length
					? `Allowed now: ${allowed.map((a) => a.label).join(', ')}.`
					: 'No move is open to you now.'
			}`,
			{ status: tree.job.status, allowed },
		);
	}
	const unmet = ready.items.filter((i) => !i.ok && i.code !== 'violation');
	if (unmet.length || !ready.result || !ready.doc) {
		throw new AppError(
			'conflict',
			`The job is not ready to submit: ${unmet.map((i) => i.message).join(' ')} Nothing was submitted.`,
			{ details: { items: ready.items, canSubmit: false } },
		);
	}
	const explained = matchExplanations(ready.violations, input.explanations);
	const number = tree.job.currentRevision + 1;

	const data = await jobDocumentData(knex, tree, {
		mapUrl: null,
		withSketches: true,
		revision: { revision: number, draft: false },
		explanations: explained,
	});
	const packet = await renderDocument({ kind: 'packet', data, size: 'letter' });
	const pages = (await PDFDocument.load(packet, { updateMetadata: false })).getPageCount();
	const documentJson = JSON.stringify(jobDocumentFromRows(tree));
	const resultsJson = JSON.stringify(ready.result);
	const firm = await firmForDocuments(knex, tree.job.firmId);
	const facts: RevisionFacts = {
		name: tree.job.name,
		address: tree.job.address,
		firm: firm.name,
		jurisdiction: tree.job.jurisdictionName,
		permitType: permitTypeOf(ready.doc),
		homeownerName: tree.job.homeownerName,
		homeownerEmail: tree.job.homeownerEmail,
		scopeOfWork: tree.job.scopeOfWork,
	};

	return inTransaction(knex, async (trx) => {
		const moved = await applyTransition(trx, user, ref.id, ready.action!, {
			...(input.note ? { note: input.note } : {}),
			changes: { current_revision: number, submitted_at: trx.fn.now() },
		});
		// The job row is locked now: what was rendered must still be the job.
		const now = await loadJobTree(trx, ref.id);
		if (
			!now ||
			moved.job.current_revision !== number - 1 ||
			now.job.version !== tree.job.version ||
			JSON.stringify(jobDocumentFromRows(now)) !== documentJson
		) {
			throw errors.conflict(
				'The job changed while its packet was being prepared. Nothing was submitted; check the readiness again and submit.',
			);
		}
		const revision = {
			jobId: ref.id,
			number,
			documentJson,
			documentSha256: sha256(documentJson),
			resultsJson,
			resultsSha256: sha256(resultsJson),
			packetPdf: packet,
			packetSha256: sha256(packet),
			packetPages: pages,
			facts,
			explanations: explained,
			note: input.note,
			submittedBy: user.id,
		};
		const id = await insertRevision(trx, revision);
		await recordAudit(trx, {
			jobId: ref.id,
			userId: user.id,
			entity: 'revision',
			entityId: id,
			action: 'submit',
			before: null,
			after: {
				number,
				action: ready.action,
				documentSha256: revision.documentSha256,
				resultsSha256: revision.resultsSha256,
				packetSha256: revision.packetSha256,
				packetPages: pages,
				explained: explained.length,
				...(input.note ? { note: input.note } : {}),
			},
		});
		const list = await listRevisions(trx, ref.id);
		return { revision: list.find((r) => r.number === number)!, status: moved.to };
	});
}
