import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api, ApiError, messageOf } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { EDITIONS, VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { JOB_STATUSES, JOB_STATUS_LABELS, jobPatchSchema } from '../../lib/schemas/job';
import FormField, { fieldAria } from '../auth/FormField';
import { applyServerErrors, asNumber, asNumberOrNull } from '../jobs/form-helpers';
import { SERVICE_RATINGS, VOLTAGE_LABELS } from '../jobs/NewJobForm';
import StatusTag from '../jobs/StatusTag';
import Notice from '../ui/Notice';
import ConflictNotice from './ConflictNotice';

type Input = z.input<typeof jobPatchSchema>;
type Output = z.output<typeof jobPatchSchema>;

const FIELDS = [
	'name',
	'address',
	'homeownerName',
	'homeownerEmail',
	'codeEdition',
	'status',
	'serviceRatingA',
	'voltageSystem',
	'terminalTemperatureC',
	'floorAreaFt2',
	'existingPeakDemandKW',
	'scopeOfWork',
	'permitNumber',
] as const;

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
	const {
		register,
		handleSubmit,
		setError,
		reset,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, Output>({ resolver: zodResolver(jobPatchSchema), values: valuesOf(job) });

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
			const rest = applyServerErrors(err, setError, FIELDS);
			setMessage([messageOf(err), ...rest].join(' '));
		}
	});
	const e = (k: (typeof FIELDS)[number]) => errors[k]?.message as string | undefined;

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
					<button type="button" className="btn-quiet" onClick={() => setEditing(true)}>
						Edit the job details
					</button>
				</div>
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
							['status', 'Status'],
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
			<FormField id="jd-name" label="Job name" error={e('name')}>
				<input {...register('name')} {...fieldAria('jd-name', e('name'))} className="field-input" />
			</FormField>
			<FormField id="jd-status" label="Status" error={e('status')}>
				<select {...register('status')} {...fieldAria('jd-status', e('status'))} className="field-input">
					{JOB_STATUSES.map((s) => (
						<option key={s} value={s}>
							{JOB_STATUS_LABELS[s]}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="jd-address" label="Property address" error={e('address')}>
				<input {...register('address')} {...fieldAria('jd-address', e('address'))} className="field-input" />
			</FormField>
			<FormField id="jd-permitNumber" label="Permit number" error={e('permitNumber')}>
				<input
					{...register('permitNumber')}
					{...fieldAria('jd-permitNumber', e('permitNumber'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="jd-homeownerName" label="Homeowner" error={e('homeownerName')}>
				<input
					{...register('homeownerName')}
					{...fieldAria('jd-homeownerName', e('homeownerName'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="jd-homeownerEmail" label="Homeowner’s e-mail" error={e('homeownerEmail')}>
				<input
					type="email"
					{...register('homeownerEmail')}
					{...fieldAria('jd-homeownerEmail', e('homeownerEmail'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="jd-codeEdition" label="NEC edition" error={e('codeEdition')}>
				<select
					{...register('codeEdition')}
					{...fieldAria('jd-codeEdition', e('codeEdition'))}
					className="field-input"
				>
					{EDITIONS.map((ed) => (
						<option key={ed} value={ed}>
							NEC {ed}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="jd-voltageSystem" label="Service voltage system" error={e('voltageSystem')}>
				<select
					{...register('voltageSystem')}
					{...fieldAria('jd-voltageSystem', e('voltageSystem'))}
					className="field-input"
				>
					{VOLTAGE_SYSTEMS.map((v) => (
						<option key={v} value={v}>
							{VOLTAGE_LABELS[v]}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="jd-serviceRatingA" label="Existing service rating (A)" error={e('serviceRatingA')}>
				<select
					{...register('serviceRatingA', { setValueAs: asNumber })}
					{...fieldAria('jd-serviceRatingA', e('serviceRatingA'))}
					className="field-input"
				>
					{SERVICE_RATINGS.map((a) => (
						<option key={a} value={a}>
							{a} A
						</option>
					))}
				</select>
			</FormField>
			<FormField
				id="jd-terminalTemperatureC"
				label="Terminal temperature rating"
				error={e('terminalTemperatureC')}
			>
				<select
					{...register('terminalTemperatureC', { setValueAs: asNumber })}
					{...fieldAria('jd-terminalTemperatureC', e('terminalTemperatureC'))}
					className="field-input"
				>
					{[60, 75, 90].map((t) => (
						<option key={t} value={t}>
							{t} °C
						</option>
					))}
				</select>
			</FormField>
			<FormField
				id="jd-floorAreaFt2"
				label="Dwelling floor area (ft²)"
				error={e('floorAreaFt2')}
				hint="Leave empty to add up the rooms."
			>
				<input
					inputMode="decimal"
					{...register('floorAreaFt2', { setValueAs: asNumberOrNull })}
					{...fieldAria('jd-floorAreaFt2', e('floorAreaFt2'), 'h')}
					className="field-input"
				/>
			</FormField>
			<FormField
				id="jd-existingPeakDemandKW"
				label="Measured 12-month peak demand (kW)"
				error={e('existingPeakDemandKW')}
			>
				<input
					inputMode="decimal"
					{...register('existingPeakDemandKW', { setValueAs: asNumberOrNull })}
					{...fieldAria('jd-existingPeakDemandKW', e('existingPeakDemandKW'))}
					className="field-input"
				/>
			</FormField>
			<div className="sm:col-span-2">
				<FormField id="jd-scopeOfWork" label="Scope of work" error={e('scopeOfWork')}>
					<textarea
						rows={3}
						{...register('scopeOfWork')}
						{...fieldAria('jd-scopeOfWork', e('scopeOfWork'))}
						className="field-input"
					/>
				</FormField>
			</div>
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
	);
}
