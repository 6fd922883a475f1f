import type { Knex } from 'knex';
import { assertJobAccess, inspectsJob, type JobRef } from '../access';
import { errors } from '../errors';
import { recordAudit } from '../repositories/audit';
import { unresolvedComments, type CommentView } from '../repositories/review-comments';
import type { CurrentUser } from '../roles';
import type { ReviewDecisionInput } from '../schemas/review-comment';
import { issuePermitNumber } from './permit-number';
import { JOB_STATUS_LABELS, type JobStatus } from './status';
import { applyTransition } from './transitions';

/**
 * The sides a user takes in a job's review thread: the firm's people answer as the contractor, the
 * jurisdiction's staff (once the job was submitted) as the reviewer.
 */
export function reviewSides(user: CurrentUser, job: JobRef): ('contractor' | 'inspector')[] {
	const sides: ('contractor' | 'inspector')[] = [];
	if (user.firms.some((f) => f.id === job.firm_id)) sides.push('contractor');
	if (inspectsJob(user, job)) sides.push('inspector');
	return sides;
}

/**
 * Loads the job for a review action: 404 for whoever may not read it, 403 for readers on neither
 * side (the homeowner, an administrator) or, with `inspectorOnly`, on the contractor's side only.
 */
export async function jobForReview(
	knex: Knex,
	user: CurrentUser,
	jobId: string,
	inspectorOnly: boolean,
): Promise<{ job: JobRef; sides: ('contractor' | 'inspector')[] }> {
	const job = await assertJobAccess(knex, user, jobId, 'read');
	const sides = reviewSides(user, job);
	if (sides.length === 0)
		throw errors.forbidden('Review comments are between the contractor and the reviewer.');
	if (inspectorOnly && !sides.includes('inspector')) {
		throw errors.forbidden('Only an inspector of the job’s jurisdiction does this.');
	}
	return { job, sides };
}

/**
 * Takes a job for review: the reviewer becomes its assigned inspector, and a job waiting in the
 * queue (submitted or resubmitted) moves to "in review" in the same transaction.
 */
export async function assignToMe(
	knex: Knex,
	user: CurrentUser,
	jobId: string,
): Promise<{ status: JobStatus; assignedInspectorId: string }> {
	return knex.transaction(async (trx) => {
		const job = await trx<JobRef & { assigned_inspector_id: string | null }>('jobs')
			.where({ id: jobId })
			.forUpdate()
			.first('id', 'status', 'assigned_inspector_id');
		if (!job) throw errors.notFound('job');
		if (job.status === 'submitted' || job.status === 'resubmitted') {
			const moved = await applyTransition(trx, user, jobId, 'start-review', {
				changes: { assigned_inspector_id: user.id },
			});
			return { status: moved.to, assignedInspectorId: user.id };
		}
		if (job.status !== 'in-review') {
			throw errors.conflict(
				`A job that is “${JOB_STATUS_LABELS[job.status]}” is not waiting for plan review.`,
				{ status: job.status },
			);
		}
		if (job.assigned_inspector_id !== user.id) {
			await trx('jobs').where({ id: jobId }).update({ assigned_inspector_id: user.id });
			await recordAudit(trx, {
				jobId,
				userId: user.id,
				entity: 'job',
				entityId: jobId,
				action: 'update',
				before: { assignedInspectorId: job.assigned_inspector_id },
				after: { assignedInspectorId: user.id },
			});
		}
		return { status: job.status, assignedInspectorId: user.id };
	});
}

const short = (c: CommentView) => ({
	id: c.id,
	number: c.number,
	status: c.status,
	targetLabel: c.targetLabel,
	body: c.body.length > 200 ? `${c.body.slice(0, 199)}…` : c.body,
});

/**
 * The reviewer's decision on the revision in review, in one transaction with the status move.
 * "request-corrections" needs at least one open comment and records the open ones; "approve" is
 * refused while any comment is unresolved and issues the permit number by the jurisdiction's pattern.
 */
export async function decide(
	knex: Knex,
	user: CurrentUser,
	jobId: string,
	input: ReviewDecisionInput,
): Promise<{ status: JobStatus; permitNumber: string | null; openComments: ReturnType<typeof short>[] }> {
	return knex.transaction(async (trx) => {
		const job = await trx<JobRef>('jobs')
			.where({ id: jobId })
			.forUpdate()
			.first('id', 'firm_id', 'property_id', 'jurisdiction_id', 'current_revision', 'status');
		if (!job) throw errors.notFound('job');
		const action = input.decision === 'approve' ? 'approve' : 'request-corrections';
		// A job not in review gets the workflow's own 409 with the moves open to this user.
		if (job.status !== 'in-review') await applyTransition(trx, user, jobId, action);
		const pending = await unresolvedComments(trx, jobId);
		const open = pending.filter((c) => c.status === 'open');
		let permitNumber: string | null = null;
		if (action === 'request-corrections') {
			if (open.length === 0) {
				throw errors.conflict(
					'Requesting corrections needs at least one open comment saying what to correct.',
					{
						openComments: [],
					},
				);
			}
		} else {
			if (pending.length > 0) {
				throw errors.conflict(
					`Resolve or reopen the comments still unresolved before approving: ${pending
						.map((c) => `#${c.number} (${c.targetLabel})`)
						.join(', ')}.`,
					{ unresolvedComments: pending.map(short) },
				);
			}
			permitNumber = await issuePermitNumber(trx, job.jurisdiction_id!, new Date());
		}
		await applyTransition(trx, user, jobId, action, {
			note: input.note || undefined,
			changes: permitNumber ? { permit_number: permitNumber } : {},
		});
		const listed = action === 'request-corrections' ? open.map(short) : [];
		const revision = await trx('job_revisions')
			.where({ job_id: jobId, number: job.current_revision })
			.first('id');
		await recordAudit(trx, {
			jobId,
			userId: user.id,
			// Filed with the comments: the history shows it as the review's decision, in words.
			entity: 'comment',
			entityId: revision?.id ?? jobId,
			action: 'decide',
			before: null,
			after: {
				decision: input.decision,
				revision: job.current_revision,
				body: permitNumber
					? `Approved revision ${job.current_revision}; permit ${permitNumber} issued.`
					: `Corrections requested on revision ${job.current_revision}: ${listed
							.map((c) => `#${c.number} ${c.targetLabel}: ${c.body}`)
							.join(' · ')}`.slice(0, 4000),
				...(input.note ? { note: input.note } : {}),
				...(permitNumber ? { permitNumber } : {}),
				...(listed.length ? { openComments: listed } : {}),
			},
		});
		return { status: action === 'approve' ? 'approved' : 'corrections', permitNumber, openComments: listed };
	});
}
