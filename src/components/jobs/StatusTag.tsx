import { JOB_STATUS_LABELS, type JobStatus } from '../../lib/schemas/job';

// Grey before and after the workflow, blue while the AHJ holds it, amber when the contractor must act, green once passed.
const LOOK: Record<JobStatus, string> = {
	draft: 'bg-ink-100 text-ink-700',
	submitted: 'bg-blue-50 text-signal-note',
	'in-review': 'bg-blue-50 text-signal-note',
	resubmitted: 'bg-blue-50 text-signal-note',
	corrections: 'bg-amber-50 text-signal-warning',
	approved: 'bg-green-50 text-signal-ok',
	'rough-in-passed': 'bg-green-50 text-signal-ok',
	'rough-in-failed': 'bg-red-50 text-signal-violation',
	'final-passed': 'bg-green-50 text-signal-ok',
	'final-failed': 'bg-red-50 text-signal-violation',
	closed: 'bg-ink-100 text-ink-500',
	withdrawn: 'bg-ink-100 text-ink-500',
};

/** A job's status in words. */
export default function StatusTag({ status }: { status: JobStatus }) {
	return (
		<span
			className={`inline-block rounded px-2 py-0.5 text-xs font-semibold ${LOOK[status] ?? ''}`}
			data-status={status}
		>
			{JOB_STATUS_LABELS[status] ?? status}
		</span>
	);
}
