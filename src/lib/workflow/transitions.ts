import type { Knex } from 'knex';
import { inspectsJob, type JobRef } from '../access';
import { errors } from '../errors';
import { recordAudit } from '../repositories/audit';
import type { CurrentUser } from '../roles';
import {
	allowedTransitions,
	JOB_STATUS_LABELS,
	transitionFor,
	type JobStatus,
	type Transition,
	type WorkflowAction,
	type WorkflowActor,
} from './status';

/** The side a user acts for on a job: its firm's people are the contractor, its jurisdiction's staff the inspector. */
export function actorsFor(user: CurrentUser, job: JobRef): WorkflowActor[] {
	const sides: WorkflowActor[] = [];
	if (user.firms.some((f) => f.id === job.firm_id)) sides.push('contractor');
	if (job.jurisdiction_id && user.jurisdictions.some((j) => j.id === job.jurisdiction_id))
		sides.push('inspector');
	return sides;
}

/** The moves this user may make on the job now (what the screens offer and a 409 lists). */
export function movesFor(user: CurrentUser, job: JobRef): Transition[] {
	const sides = actorsFor(user, job);
	return allowedTransitions(job.status).filter((t) => sides.includes(t.by));
}

/**
 * Moves a job along one workflow transition inside the caller's transaction: locks the job row,
 * checks that the move is allowed from its status and that the user is on the side that makes it,
 * updates the status and writes the audit entry. A refused move is a 409 naming the allowed moves;
 * a user on neither side is a 404 (the job reveals nothing), on the wrong side a 403.
 * Callers do the move's own work (the revision, the permit number, the inspection) in the same transaction.
 */
export async function applyTransition(
	trx: Knex.Transaction,
	user: CurrentUser,
	jobId: string,
	action: WorkflowAction,
	extra: { note?: string; changes?: Record<string, unknown> } = {},
): Promise<{ from: JobStatus; to: JobStatus; job: JobRef }> {
	const job = await trx<JobRef>('jobs')
		.where({ id: jobId })
		.whereNull('deleted_at')
		.forUpdate()
		.first('id', 'firm_id', 'property_id', 'jurisdiction_id', 'current_revision', 'status');
	if (!job) throw errors.notFound('job');
	const sides = actorsFor(user, job);
	if (!sides.includes('contractor') && !inspectsJob(user, job)) throw errors.notFound('job');
	const t = transitionFor(action, job.status);
	if (!t) {
		const allowed = movesFor(user, job).map((m) => ({ action: m.action, to: m.to, label: m.label }));
		throw errors.conflict(
			`A job that is “${JOB_STATUS_LABELS[job.status]}” cannot make this move. ${
				allowed.length
					? `Allowed now: ${allowed.map((a) => a.label).join(', ')}.`
					: 'No move is open to you now.'
			}`,
			{ status: job.status, allowed },
		);
	}
	if (!sides.includes(t.by)) {
		throw errors.forbidden(
			t.by === 'inspector'
				? 'Only an inspector of the job’s jurisdiction makes this move.'
				: 'Only the contractor’s firm makes this move.',
		);
	}
	await trx('jobs')
		.where({ id: jobId })
		.update({ status: t.to, ...(extra.changes ?? {}), updated_at: trx.fn.now() });
	await recordAudit(trx, {
		jobId,
		userId: user.id,
		entity: 'status',
		entityId: jobId,
		action: 'transition',
		before: { status: job.status },
		after: { status: t.to, action, ...(extra.note ? { note: extra.note } : {}) },
	});
	return { from: job.status, to: t.to, job: { ...job, status: t.to } };
}
