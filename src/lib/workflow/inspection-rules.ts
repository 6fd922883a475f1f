/** When an inspection may be requested: pure rules shared by the server and the screens. */
import type { InspectionKind } from '../schemas/inspection';
import { JOB_STATUS_LABELS, type JobStatus } from './status';

/** The job statuses from which each kind of inspection may be requested. */
export const REQUESTABLE_FROM: Record<InspectionKind, readonly JobStatus[]> = {
	'rough-in': ['approved', 'rough-in-failed'],
	final: ['rough-in-passed', 'final-failed'],
};

/**
 * Why a kind of inspection cannot be requested now, or null when it can: the job must be at the
 * right step, no request of that kind may be open, and every correction item must be answered.
 */
export function requestBlock(
	kind: InspectionKind,
	status: JobStatus,
	openKinds: readonly InspectionKind[],
	openItems: number,
): string | null {
	if (!REQUESTABLE_FROM[kind].includes(status)) {
		return kind === 'rough-in'
			? `A rough-in inspection can be requested once the permit is approved (the job is “${JOB_STATUS_LABELS[status]}”).`
			: `A final inspection can be requested after the rough-in inspection passed (the job is “${JOB_STATUS_LABELS[status]}”).`;
	}
	if (openKinds.includes(kind)) {
		return `A ${kind === 'rough-in' ? 'rough-in' : 'final'} inspection is already requested; wait for its result or its date.`;
	}
	if (openItems > 0) {
		return `Answer every correction item of the failed inspection first (${openItems} still open).`;
	}
	return null;
}
