import type { JobDocument } from '../electrical/schema';
import type { JurisdictionSettings } from '../schemas/jurisdiction';

/** The fee schedule of a jurisdiction, in cents. */
export type FeeSchedule = Pick<
	JurisdictionSettings,
	'feeBaseCents' | 'feePerCircuitCents' | 'feePerPanelCents' | 'feeServiceChangeCents'
>;

/** The parts of a job document the fee depends on (a JobDocument is one). */
export interface FeeJob {
	panels: readonly unknown[];
	circuits: readonly Pick<JobDocument['circuits'][number], 'status'>[];
	service: { existingLoad: unknown };
}

/** A sample job for the settings page's example: counts of new or modified circuits and panels, and whether the service changes. */
export function sampleFeeJob(circuits: number, panels: number, serviceChange: boolean): FeeJob {
	return {
		panels: Array.from({ length: panels }, () => null),
		circuits: Array.from({ length: circuits }, () => ({ status: 'new' as const })),
		service: { existingLoad: serviceChange ? null : { method: 'measured-peak' } },
	};
}

export type FeeLineKey = 'base' | 'circuits' | 'panels' | 'service-change';

/** One line of an itemised permit fee: quantity × unit price = amount, all money in cents. */
export interface FeeLine {
	key: FeeLineKey;
	label: string;
	quantity: number;
	unitCents: number;
	amountCents: number;
}

export interface PermitFee {
	lines: FeeLine[];
	totalCents: number;
}

/**
 * Whether a job changes the service, as far as its document tells: a job that records no existing
 * load and keeps no existing circuit installs its service new. Callers that know better say so.
 */
export function changesService(job: FeeJob): boolean {
	return job.service.existingLoad === null && job.circuits.every((c) => c.status !== 'existing');
}

/**
 * The permit fee of a job by a jurisdiction's schedule, itemised: the base fee, each new or
 * modified branch circuit or feeder, each panel, and the service change fee when the service
 * changes. Pure, so the settings page's example and the payments can share it.
 */
export function feeFor(
	schedule: FeeSchedule,
	job: FeeJob,
	options: { serviceChange?: boolean } = {},
): PermitFee {
	const circuits = job.circuits.filter((c) => c.status === 'new' || c.status === 'modified').length;
	const panels = job.panels.length;
	const serviceChange = options.serviceChange ?? changesService(job);
	const line = (key: FeeLineKey, label: string, quantity: number, unitCents: number): FeeLine => ({
		key,
		label,
		quantity,
		unitCents,
		amountCents: quantity * unitCents,
	});
	const lines = [
		line('base', 'Base permit fee', 1, schedule.feeBaseCents),
		line('circuits', 'New or modified circuits', circuits, schedule.feePerCircuitCents),
		line('panels', 'Panels', panels, schedule.feePerPanelCents),
		...(serviceChange ? [line('service-change', 'Service change', 1, schedule.feeServiceChangeCents)] : []),
	];
	return { lines, totalCents: lines.reduce((sum, l) => sum + l.amountCents, 0) };
}

/** Cents shown as dollars and cents: 123456 → '1,234.56'. */
export function formatCents(cents: number): string {
	const sign = cents < 0 ? '-' : '';
	const abs = Math.abs(Math.round(cents));
	const dollars = Math.floor(abs / 100).toLocaleString('en-US');
	return `${sign}${dollars}.${String(abs % 100).padStart(2, '0')}`;
}

/** Dollars as typed in a form ('1,234.5', '12') to whole cents; null when it is not an amount. */
export function parseDollars(text: string): number | null {
	const clean = text.trim().replace(/,/g, '');
	if (!/^\d{1,7}(\.\d{0,2})?$/.test(clean)) return null;
	const [whole, frac = ''] = clean.split('.');
	return Number(whole) * 100 + Number(frac.padEnd(2, '0'));
}
