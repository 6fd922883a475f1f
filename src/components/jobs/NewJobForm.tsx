import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api, messageOf } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { EDITIONS, VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { STANDARD_RATINGS_A } from '../../lib/electrical/tables';
import { jobCreateSchema } from '../../lib/schemas/job';
import FormField, { fieldAria } from '../auth/FormField';
import Notice from '../ui/Notice';
import { applyServerErrors, asNumber, asNumberOrNull } from './form-helpers';

type Input = z.input<typeof jobCreateSchema>;
type Output = z.output<typeof jobCreateSchema>;

export const VOLTAGE_LABELS: Record<(typeof VOLTAGE_SYSTEMS)[number], string> = {
	'120/240-1ph-3w': '120/240 V single-phase 3-wire',
	'208Y/120-3ph-4w': '208Y/120 V three-phase 4-wire',
};
export const SERVICE_RATINGS = STANDARD_RATINGS_A.filter((a) => a >= 60 && a <= 600);

const FIELDS = [
	'firmId',
	'name',
	'address',
	'homeownerName',
	'homeownerEmail',
	'codeEdition',
	'serviceRatingA',
	'voltageSystem',
	'terminalTemperatureC',
	'floorAreaFt2',
	'existingPeakDemandKW',
	'scopeOfWork',
	'permitNumber',
] as const;

interface Props {
	firms: { id: string; name: string }[];
	onCreated: (job: JobRecord) => void;
}

/** The new-job form; the same schema checks it here and in POST /api/jobs. */
export default function NewJobForm({ firms, onCreated }: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const {
		register,
		handleSubmit,
		setError,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, Output>({
		resolver: zodResolver(jobCreateSchema),
		defaultValues: {
			firmId: firms.length === 1 ? firms[0]!.id : undefined,
			name: '',
			address: '',
			homeownerName: '',
			homeownerEmail: '',
			codeEdition: '2023',
			serviceRatingA: 200 as never,
			voltageSystem: '120/240-1ph-3w',
			terminalTemperatureC: 75,
			floorAreaFt2: null,
			existingPeakDemandKW: null,
			scopeOfWork: '',
			permitNumber: '',
		},
	});

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const { job } = await api<{ job: JobRecord }>('/api/jobs', { method: 'POST', body: values });
			onCreated(job);
		} catch (err) {
			const rest = applyServerErrors(err, setError, FIELDS);
			setMessage([messageOf(err), ...rest].join(' '));
		}
	});

	const e = (k: (typeof FIELDS)[number]) => errors[k]?.message as string | undefined;

	return (
		<form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-2" aria-label="New job">
			{message && (
				<div className="sm:col-span-2">
					<Notice tone="error">{message}</Notice>
				</div>
			)}
			{firms.length > 1 && (
				<FormField id="job-firmId" label="Firm" error={e('firmId')}>
					<select {...register('firmId')} {...fieldAria('job-firmId', e('firmId'))} className="field-input">
						<option value="">Choose the firm…</option>
						{firms.map((f) => (
							<option key={f.id} value={f.id}>
								{f.name}
							</option>
						))}
					</select>
				</FormField>
			)}
			<FormField
				id="job-name"
				label="Job name"
				error={e('name')}
				hint="What your crew calls it, e.g. “Kitchen remodel, Penhallow”."
			>
				<input {...register('name')} {...fieldAria('job-name', e('name'))} className="field-input" />
			</FormField>
			<FormField id="job-address" label="Property address" error={e('address')}>
				<input
					{...register('address')}
					{...fieldAria('job-address', e('address'))}
					className="field-input"
					autoComplete="street-address"
				/>
			</FormField>
			<FormField id="job-homeownerName" label="Homeowner" error={e('homeownerName')}>
				<input
					{...register('homeownerName')}
					{...fieldAria('job-homeownerName', e('homeownerName'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="job-homeownerEmail" label="Homeowner’s e-mail" error={e('homeownerEmail')}>
				<input
					type="email"
					{...register('homeownerEmail')}
					{...fieldAria('job-homeownerEmail', e('homeownerEmail'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="job-codeEdition" label="NEC edition adopted by the AHJ" error={e('codeEdition')}>
				<select
					{...register('codeEdition')}
					{...fieldAria('job-codeEdition', e('codeEdition'))}
					className="field-input"
				>
					{EDITIONS.map((ed) => (
						<option key={ed} value={ed}>
							NEC {ed}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="job-voltageSystem" label="Service voltage system" error={e('voltageSystem')}>
				<select
					{...register('voltageSystem')}
					{...fieldAria('job-voltageSystem', e('voltageSystem'))}
					className="field-input"
				>
					{VOLTAGE_SYSTEMS.map((v) => (
						<option key={v} value={v}>
							{VOLTAGE_LABELS[v]}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="job-serviceRatingA" label="Existing service rating (A)" error={e('serviceRatingA')}>
				<select
					{...register('serviceRatingA', { setValueAs: asNumber })}
					{...fieldAria('job-serviceRatingA', e('serviceRatingA'))}
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
				id="job-terminalTemperatureC"
				label="Terminal temperature rating (NEC 110.14(C))"
				error={e('terminalTemperatureC')}
			>
				<select
					{...register('terminalTemperatureC', { setValueAs: asNumber })}
					{...fieldAria('job-terminalTemperatureC', e('terminalTemperatureC'))}
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
				id="job-floorAreaFt2"
				label="Dwelling floor area (ft²)"
				error={e('floorAreaFt2')}
				hint="Leave empty to add up the rooms."
			>
				<input
					inputMode="decimal"
					{...register('floorAreaFt2', { setValueAs: asNumberOrNull })}
					{...fieldAria('job-floorAreaFt2', e('floorAreaFt2'), 'Leave empty to add up the rooms.')}
					className="field-input"
				/>
			</FormField>
			<FormField
				id="job-existingPeakDemandKW"
				label="Measured 12-month peak demand (kW, NEC 220.87)"
				error={e('existingPeakDemandKW')}
				hint="Only when the utility's demand record exists."
			>
				<input
					inputMode="decimal"
					{...register('existingPeakDemandKW', { setValueAs: asNumberOrNull })}
					{...fieldAria('job-existingPeakDemandKW', e('existingPeakDemandKW'), 'hint')}
					className="field-input"
				/>
			</FormField>
			<FormField id="job-permitNumber" label="Permit number" error={e('permitNumber')}>
				<input
					{...register('permitNumber')}
					{...fieldAria('job-permitNumber', e('permitNumber'))}
					className="field-input"
				/>
			</FormField>
			<div className="sm:col-span-2">
				<FormField id="job-scopeOfWork" label="Scope of work" error={e('scopeOfWork')}>
					<textarea
						rows={3}
						{...register('scopeOfWork')}
						{...fieldAria('job-scopeOfWork', e('scopeOfWork'))}
						className="field-input"
					/>
				</FormField>
			</div>
			<div className="sm:col-span-2">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					{isSubmitting ? 'Creating…' : 'Create the job'}
				</button>
			</div>
		</form>
	);
}
