import { JOB_STATUS_LABELS, type JobStatus } from '../../lib/schemas/job';

const LOOK: Partial<Record<JobStatus, string>> = {
	draft: 'bg-ink-100 text-ink-700',
	'in-progress': 'bg-copper-100 text-copper-800',
	submitted: 'bg-blue-50 text-signal-note',
	corrections: 'bg-amber-50 text-signal-warning',
	approved: 'bg-green-50 text-signal-ok',
	'rough-in-passed': 'bg-green-50 text-signal-ok',
	'final-passed': 'bg-green-50 text-signal-ok',
	closed: 'bg-ink-100 text-ink-500',
};

/** A job's status in words. */
export default function StatusTag({ status }: { status: JobStatus }) {
	return (
		<span className={`inline-block rounded px-2 py-0.5 text-xs font-semibold ${LOOK[status] ?? ''}`}>
			{JOB_STATUS_LABELS[status]}
		</span>
	);
}
