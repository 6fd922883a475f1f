import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api, ApiError } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { jobPatchSchema } from '../../lib/schemas/job';
import { formErrorMessage } from '../jobs/form-helpers';
import JobFields, { JOB_FIELD_NAMES as FIELDS, VOLTAGE_LABELS } from '../jobs/JobFields';
import StatusTag from '../jobs/StatusTag';
import ConfirmDialog from '../ui/ConfirmDialog';
import Notice from '../ui/Notice';
import ConflictNotice from './ConflictNotice';

type Input = z.input<typeof jobPatchSchema>;
type Output = z.output<typeof jobPatchSchema>;

function valuesOf(job: JobRecord): Input {
	const out: Record<string, unknown> = { version: job.version };
	for (const f of FIELDS) out[f] = job[f];
	return out as Input;
}

interface Props {
	job: JobRecord;
	onSaved: (job: JobRecord) => void;
	onReload: () => void;
}

/** The job's settings, shown as a summary and edited in place. */
export default function JobDetails({ job, onSaved, onReload }: Props) {
	const [editing, setEditing] = useState(false);
	const [message, setMessage] = useState<string | null>(null);
	const [conflict, setConflict] = useState<Record<string, unknown> | null>(null);
	const [confirmDelete, setConfirmDelete] = useState(false);
	const [deleting, setDeleting] = useState(false);
	const form = useForm<Input, unknown, Output>({
		resolver: zodResolver(jobPatchSchema),
		values: valuesOf(job),
	});
	const {
		handleSubmit,
		setError,
		reset,
		formState: { isSubmitting },
	} = form;

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		setConflict(null);
		try {
			const saved = await api<{ job: JobRecord }>(`/api/jobs/${job.id}`, { method: 'PATCH', body: values });
			onSaved(saved.job);
			setEditing(false);
		} catch (err) {
			if (err instanceof ApiError && err.status === 409) {
				setConflict((err.current as Record<string, unknown>) ?? null);
				return;
			}
			setMessage(formErrorMessage(err, setError, FIELDS));
		}
	});

	const deleteJob = async () => {
		setDeleting(true);
		setMessage(null);
		try {
			await api(`/api/jobs/${job.id}`, { method: 'DELETE', body: { version: job.version } });
			window.location.href = '/contractor/jobs?deleted=1';
		} catch (err) {
			setConfirmDelete(false);
			setDeleting(false);
			if (err instanceof ApiError && err.status === 409) {
				setMessage(
					'Someone else changed this job since you opened it. Reload it and delete again if you still mean to.',
				);
				return;
			}
			setMessage(err instanceof Error ? err.message : 'The job could not be deleted. Please try again.');
		}
	};

	if (!editing) {
		const rows: [string, string][] = [
			['Address', job.address || '—'],
			['Homeowner', [job.homeownerName, job.homeownerEmail].filter(Boolean).join(' · ') || '—'],
			['Code edition', `NEC ${job.codeEdition}`],
			['Service', `${job.serviceRatingA} A, ${VOLTAGE_LABELS[job.voltageSystem]}`],
			['Terminal rating', `${job.terminalTemperatureC} °C (110.14(C))`],
			['Floor area', job.floorAreaFt2 !== null ? `${job.floorAreaFt2} ft²` : 'Sum of the rooms counted'],
			[
				'Measured peak demand',
				job.existingPeakDemandKW !== null ? `${job.existingPeakDemandKW} kW (220.87)` : 'Not recorded',
			],
			['Permit number', job.permitNumber || '—'],
			['Jurisdiction', job.jurisdictionName ?? '—'],
		];
		return (
			<div data-testid="job-details">
				<div className="flex flex-wrap items-center justify-between gap-2">
					<StatusTag status={job.status} />
					<div className="flex flex-wrap gap-2">
						<button type="button" className="btn-quiet" onClick={() => setEditing(true)}>
							Edit the job details
						</button>
						<button
							type="button"
							className="btn-quiet text-signal-violation"
							onClick={() => setConfirmDelete(true)}
						>
							Delete the job…
						</button>
					</div>
				</div>
				{message && (
					<div className="mt-3">
						<Notice tone="error">{message}</Notice>
					</div>
				)}
				<ConfirmDialog
					open={confirmDelete}
					title={`Delete “${job.name}”?`}
					body="The job, its rooms, panelboards, circuits and loads leave your firm's lists. The change history is kept."
					confirmLabel="Delete the job"
					busy={deleting}
					onConfirm={deleteJob}
					onCancel={() => setConfirmDelete(false)}
				/>
				<dl className="mt-3 grid gap-x-6 gap-y-2 sm:grid-cols-2 lg:grid-cols-3">
					{rows.map(([k, v]) => (
						<div key={k}>
							<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">{k}</dt>
							<dd className="text-ink-900">{v}</dd>
						</div>
					))}
				</dl>
				{job.scopeOfWork && (
					<div className="mt-3">
						<p className="text-xs font-semibold uppercase tracking-wide text-ink-500">Scope of work</p>
						<p className="whitespace-pre-line text-ink-900">{job.scopeOfWork}</p>
					</div>
				)}
			</div>
		);
	}

	return (
		<FormProvider {...form}>
			<form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-2" aria-label="Job details">
				{message && (
					<div className="sm:col-span-2">
						<Notice tone="error">{message}</Notice>
					</div>
				)}
				{conflict && (
					<div className="sm:col-span-2">
						<ConflictNotice
							what="job"
							current={conflict}
							fields={[
								['name', 'Job name'],
								['jurisdictionName', 'Jurisdiction'],
								['serviceRatingA', 'Service rating (A)'],
								['codeEdition', 'NEC edition'],
							]}
							onReload={() => {
								setConflict(null);
								onReload();
							}}
						/>
					</div>
				)}
				<dl
					className="grid gap-x-6 gap-y-2 sm:col-span-2 sm:grid-cols-2"
					aria-label="Set by the permit workflow"
				>
					<div>
						<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">Status</dt>
						<dd>
							<StatusTag status={job.status} />
						</dd>
					</div>
					<div>
						<dt className="text-xs font-semibold uppercase tracking-wide text-ink-500">Permit number</dt>
						<dd className="text-ink-900">{job.permitNumber || 'Issued on approval'}</dd>
					</div>
				</dl>
				<JobFields idPrefix="jd" jurisdictionLocked={job.currentRevision > 0} />
				<div className="flex gap-2 sm:col-span-2">
					<button type="submit" className="btn-primary" disabled={isSubmitting}>
						{isSubmitting ? 'Saving…' : 'Save the job details'}
					</button>
					<button
						type="button"
						className="btn-quiet"
						onClick={() => {
							reset(valuesOf(job));
							setEditing(false);
							setMessage(null);
							setConflict(null);
						}}
					>
						Cancel
					</button>
				</div>
			</form>
		</FormProvider>
	);
}
