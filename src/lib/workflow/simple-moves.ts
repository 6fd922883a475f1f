/** The workflow moves that need no other work, and the job's workflow state as the screens show it. */
import type { Knex } from 'knex';
import type { JobRef } from '../access';
import { errors } from '../errors';
import { inTransaction } from '../repositories/versioned';
import { workflowTimeline, type TimelineEntry } from '../repositories/workflow-history';
import type { CurrentUser } from '../roles';
import { SIMPLE_ACTIONS, type TransitionInput } from '../schemas/submission';
import { JOB_STATUS_LABELS, type JobStatus, type WorkflowAction } from './status';
import { actorsFor, applyTransition, movesFor } from './transitions';

/** Where the moves with their own work are made. */
const ELSEWHERE: Partial<Record<WorkflowAction, string>> = {
	submit: 'POST /api/jobs/{id}/submissions (it runs the readiness check and stores the revision)',
	resubmit: 'POST /api/jobs/{id}/submissions (it runs the readiness check and stores the revision)',
	approve: 'POST /api/jobs/{id}/decision (it issues the permit number)',
	'request-corrections': 'POST /api/jobs/{id}/decision (it lists the open comments)',
	'pass-rough-in': 'POST /api/inspections/{id}/result (it records the inspection)',
	'fail-rough-in': 'POST /api/inspections/{id}/result (it records the inspection)',
	'pass-final': 'POST /api/inspections/{id}/result (it records the inspection)',
	'fail-final': 'POST /api/inspections/{id}/result (it records the inspection)',
};

/**
 * Makes a simple move (withdraw, start-review, close) in one transaction. Another action is a 400
 * naming its endpoint; a reader on neither side (homeowner, administrator) is a 403.
 */
export async function moveJob(
	knex: Knex,
	user: CurrentUser,
	ref: JobRef,
	input: TransitionInput,
): Promise<{ from: JobStatus; to: JobStatus; label: string }> {
	if (!(SIMPLE_ACTIONS as readonly string[]).includes(input.action)) {
		throw errors.invalid(`This move is made through ${ELSEWHERE[input.action] ?? 'its own endpoint'}.`, {
			action: [`use ${ELSEWHERE[input.action] ?? 'its own endpoint'}`],
		});
	}
	if (actorsFor(user, ref).length === 0) {
		throw errors.forbidden('You can read this job but not move it along the permit workflow.');
	}
	return inTransaction(knex, async (trx) => {
		const changes: Record<string, unknown> =
			input.action === 'start-review'
				? { assigned_inspector_id: trx.raw('coalesce(assigned_inspector_id, ?)', [user.id]) }
				: {};
		const moved = await applyTransition(trx, user, ref.id, input.action, {
			...(input.note ? { note: input.note } : {}),
			changes,
		});
		return { from: moved.from, to: moved.to, label: JOB_STATUS_LABELS[moved.to] };
	});
}

export interface WorkflowState {
	status: JobStatus;
	label: string;
	currentRevision: number;
	permitNumber: string;
	submittedAt: string | null;
	moves: { action: WorkflowAction; to: JobStatus; label: string }[];
	timeline: TimelineEntry[];
}

/** The job's workflow state for this user: what the Permit section and the History timeline show. */
export async function workflowState(knex: Knex, user: CurrentUser, ref: JobRef): Promise<WorkflowState> {
	const [row, timeline] = await Promise.all([
		knex('jobs').where({ id: ref.id }).first('status', 'current_revision', 'permit_number', 'submitted_at'),
		workflowTimeline(knex, ref.id),
	]);
	if (!row) throw errors.notFound('job');
	const job: JobRef = { ...ref, status: row.status, current_revision: Number(row.current_revision) };
	return {
		status: job.status,
		label: JOB_STATUS_LABELS[job.status],
		currentRevision: job.current_revision,
		permitNumber: row.permit_number ?? '',
		submittedAt: row.submitted_at ? new Date(row.submitted_at).toISOString() : null,
		moves: movesFor(user, job).map((m) => ({ action: m.action, to: m.to, label: m.label })),
		timeline,
	};
}
