/**
 * The permit workflow: a job's status is the server's and moves only along these transitions,
 * each made by one role. Pure data and functions, shared by the server and the screens.
 */

export const JOB_STATUSES = [
	'draft',
	'submitted',
	'in-review',
	'corrections',
	'resubmitted',
	'approved',
	'rough-in-passed',
	'rough-in-failed',
	'final-passed',
	'final-failed',
	'closed',
	'withdrawn',
] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
	draft: 'Draft',
	submitted: 'Submitted for plan review',
	'in-review': 'In plan review',
	corrections: 'Corrections requested',
	resubmitted: 'Resubmitted',
	approved: 'Permit approved',
	'rough-in-passed': 'Rough-in passed',
	'rough-in-failed': 'Rough-in failed',
	'final-passed': 'Final inspection passed',
	'final-failed': 'Final inspection failed',
	closed: 'Closed',
	withdrawn: 'Withdrawn',
};

/** Who makes a move: the job's firm, or an inspector of the job's jurisdiction. */
export type WorkflowActor = 'contractor' | 'inspector';

export const WORKFLOW_ACTIONS = [
	'submit',
	'start-review',
	'request-corrections',
	'approve',
	'resubmit',
	'withdraw',
	'pass-rough-in',
	'fail-rough-in',
	'pass-final',
	'fail-final',
	'close',
] as const;
export type WorkflowAction = (typeof WORKFLOW_ACTIONS)[number];

export interface Transition {
	action: WorkflowAction;
	from: readonly JobStatus[];
	to: JobStatus;
	by: WorkflowActor;
	/** The button's words. */
	label: string;
}

/** Every allowed move. A move not listed here is refused (409, with the allowed moves). */
export const TRANSITIONS: readonly Transition[] = [
	{
		action: 'submit',
		from: ['draft', 'withdrawn'],
		to: 'submitted',
		by: 'contractor',
		label: 'Submit for review',
	},
	{
		action: 'start-review',
		from: ['submitted', 'resubmitted'],
		to: 'in-review',
		by: 'inspector',
		label: 'Start plan review',
	},
	{
		action: 'request-corrections',
		from: ['in-review'],
		to: 'corrections',
		by: 'inspector',
		label: 'Request corrections',
	},
	{
		action: 'approve',
		from: ['in-review'],
		to: 'approved',
		by: 'inspector',
		label: 'Approve and issue permit',
	},
	{ action: 'resubmit', from: ['corrections'], to: 'resubmitted', by: 'contractor', label: 'Resubmit' },
	{
		action: 'withdraw',
		from: ['submitted', 'in-review', 'corrections', 'resubmitted'],
		to: 'withdrawn',
		by: 'contractor',
		label: 'Withdraw the submission',
	},
	{
		action: 'pass-rough-in',
		from: ['approved', 'rough-in-failed'],
		to: 'rough-in-passed',
		by: 'inspector',
		label: 'Rough-in passed',
	},
	{
		action: 'fail-rough-in',
		from: ['approved', 'rough-in-failed'],
		to: 'rough-in-failed',
		by: 'inspector',
		label: 'Rough-in failed',
	},
	{
		action: 'pass-final',
		from: ['rough-in-passed', 'final-failed'],
		to: 'final-passed',
		by: 'inspector',
		label: 'Final inspection passed',
	},
	{
		action: 'fail-final',
		from: ['rough-in-passed', 'final-failed'],
		to: 'final-failed',
		by: 'inspector',
		label: 'Final inspection failed',
	},
	{ action: 'close', from: ['final-passed'], to: 'closed', by: 'inspector', label: 'Close the permit' },
];

/** The moves open from a status, optionally only those one side may make. */
export function allowedTransitions(from: JobStatus, by?: WorkflowActor): Transition[] {
	return TRANSITIONS.filter((t) => t.from.includes(from) && (by === undefined || t.by === by));
}

/** The transition an action makes from a status, or null when it is not allowed from there. */
export function transitionFor(action: WorkflowAction, from: JobStatus): Transition | null {
	return TRANSITIONS.find((t) => t.action === action && t.from.includes(from)) ?? null;
}

/** Statuses in which the reviewer holds the packet: the engineering data may still be edited for the next revision. */
export const UNDER_REVIEW: readonly JobStatus[] = ['submitted', 'in-review', 'resubmitted'];

/** Statuses after a permit was issued. */
export const PERMIT_ISSUED: readonly JobStatus[] = [
	'approved',
	'rough-in-passed',
	'rough-in-failed',
	'final-passed',
	'final-failed',
	'closed',
];

/** Statuses that put a job in an inspector's queue: every status after a submission, until the permit is closed. */
export const QUEUE_STATUSES: readonly JobStatus[] = JOB_STATUSES.filter(
	(s) => s !== 'draft' && s !== 'closed' && s !== 'withdrawn',
);
