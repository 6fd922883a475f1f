import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { messageOf } from '../../lib/client/api-client';
import type { CircuitRecord } from '../../lib/client/job-tree';
import { VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { BREAKER_RATINGS_A } from '../../lib/electrical/tables';
import { panelInputSchema } from '../../lib/schemas/panel';
import FormField, { fieldAria } from '../auth/FormField';
import { applyServerErrors, asNumber } from '../jobs/form-helpers';
import { VOLTAGE_LABELS } from '../jobs/NewJobForm';
import Notice from '../ui/Notice';

type Input = z.input<typeof panelInputSchema>;
export type PanelValues = z.output<typeof panelInputSchema>;
const FIELDS = [
	'name',
	'location',
	'kind',
	'fedFromCircuitId',
	'voltageSystem',
	'busRatingA',
	'mainBreakerA',
	'spaces',
] as const;

interface Props {
	feeders: CircuitRecord[];
	defaults: Partial<Input>;
	onSubmit: (values: PanelValues) => Promise<void>;
}

/** Add a panelboard; the schema is the one POST /api/jobs/:jobId/panels uses. */
export default function PanelForm({ feeders, defaults, onSubmit }: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const {
		register,
		handleSubmit,
		setError,
		reset,
		watch,
		formState: { errors, isSubmitting },
	} = useForm<Input, unknown, PanelValues>({
		resolver: zodResolver(panelInputSchema),
		defaultValues: {
			name: '',
			location: '',
			kind: 'main',
			fedFromCircuitId: null,
			voltageSystem: '120/240-1ph-3w',
			busRatingA: 200,
			mainBreakerA: 200 as never,
			spaces: 40,
			...defaults,
		},
	});
	const kind = watch('kind');
	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await onSubmit(values);
			reset();
		} catch (err) {
			const rest = applyServerErrors(err, setError, FIELDS);
			setMessage([messageOf(err), ...rest].join(' '));
		}
	});
	const e = (k: (typeof FIELDS)[number]) => errors[k]?.message as string | undefined;
	return (
		<form
			onSubmit={submit}
			noValidate
			aria-label="Add a panelboard"
			className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
		>
			{message && (
				<div className="sm:col-span-2 lg:col-span-4">
					<Notice tone="error">{message}</Notice>
				</div>
			)}
			<FormField id="panel-name" label="Panel name" error={e('name')}>
				<input
					{...register('name')}
					{...fieldAria('panel-name', e('name'))}
					className="field-input"
					placeholder="Main panel"
				/>
			</FormField>
			<FormField id="panel-location" label="Location" error={e('location')}>
				<input
					{...register('location')}
					{...fieldAria('panel-location', e('location'))}
					className="field-input"
					placeholder="Garage, north wall"
				/>
			</FormField>
			<FormField id="panel-kind" label="Supplied by" error={e('kind')}>
				<select {...register('kind')} {...fieldAria('panel-kind', e('kind'))} className="field-input">
					<option value="main">The service (main panel)</option>
					<option value="sub">A feeder from another panel (subpanel)</option>
				</select>
			</FormField>
			{kind === 'sub' ? (
				<FormField id="panel-fedFromCircuitId" label="Feeder breaker" error={e('fedFromCircuitId')}>
					<select
						{...register('fedFromCircuitId', { setValueAs: (v) => (v === '' ? null : v) })}
						{...fieldAria('panel-fedFromCircuitId', e('fedFromCircuitId'))}
						className="field-input"
					>
						<option value="">Choose the 2-pole breaker…</option>
						{feeders.map((c) => (
							<option key={c.id} value={c.id}>
								{c.label || 'Unlabelled'} ({c.ratingA} A, position {c.position})
							</option>
						))}
					</select>
				</FormField>
			) : (
				<div />
			)}
			<FormField id="panel-voltageSystem" label="Voltage system" error={e('voltageSystem')}>
				<select
					{...register('voltageSystem')}
					{...fieldAria('panel-voltageSystem', e('voltageSystem'))}
					className="field-input"
				>
					{VOLTAGE_SYSTEMS.map((v) => (
						<option key={v} value={v}>
							{VOLTAGE_LABELS[v]}
						</option>
					))}
				</select>
			</FormField>
			<FormField id="panel-busRatingA" label="Bus rating (A)" error={e('busRatingA')}>
				<input
					inputMode="numeric"
					{...register('busRatingA', { setValueAs: asNumber })}
					{...fieldAria('panel-busRatingA', e('busRatingA'))}
					className="field-input"
				/>
			</FormField>
			<FormField id="panel-mainBreakerA" label="Main breaker" error={e('mainBreakerA')}>
				<select
					{...register('mainBreakerA', { setValueAs: (v) => (v === '' ? null : Number(v)) })}
					{...fieldAria('panel-mainBreakerA', e('mainBreakerA'))}
					className="field-input"
				>
					<option value="">None (main-lug)</option>
					{BREAKER_RATINGS_A.filter((a) => a >= 30 && a <= 800).map((a) => (
						<option key={a} value={a}>
							{a} A
						</option>
					))}
				</select>
			</FormField>
			<FormField id="panel-spaces" label="Spaces" error={e('spaces')}>
				<input
					inputMode="numeric"
					{...register('spaces', { setValueAs: asNumber })}
					{...fieldAria('panel-spaces', e('spaces'))}
					className="field-input"
				/>
			</FormField>
			<div className="sm:col-span-2 lg:col-span-4">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					{isSubmitting ? 'Adding…' : 'Add the panelboard'}
				</button>
			</div>
		</form>
	);
}
