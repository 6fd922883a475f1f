import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { CircuitRecord } from '../../lib/client/job-tree';
import { VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { BREAKER_RATINGS_A } from '../../lib/electrical/tables';
import { panelInputSchema } from '../../lib/schemas/panel';
import { formErrorMessage } from '../jobs/form-helpers';
import { VOLTAGE_LABELS } from '../jobs/JobFields';
import { NumberField, optionsOf, SelectField, TextField } from '../ui/fields';
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
	const form = useForm<Input, unknown, PanelValues>({
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
	const {
		handleSubmit,
		setError,
		reset,
		watch,
		formState: { isSubmitting },
	} = form;
	const kind = watch('kind');
	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await onSubmit(values);
			reset();
		} catch (err) {
			setMessage(formErrorMessage(err, setError, FIELDS));
		}
	});
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
			<TextField form={form} name="name" id="panel-name" label="Panel name" placeholder="Main panel" />
			<TextField
				form={form}
				name="location"
				id="panel-location"
				label="Location"
				placeholder="Garage, north wall"
			/>
			<SelectField
				form={form}
				name="kind"
				id="panel-kind"
				label="Supplied by"
				options={[
					['main', 'The service (main panel)'],
					['sub', 'A feeder from another panel (subpanel)'],
				]}
			/>
			{kind === 'sub' ? (
				<SelectField
					form={form}
					name="fedFromCircuitId"
					id="panel-fedFromCircuitId"
					label="Feeder breaker"
					empty="Choose the 2-pole breaker…"
					options={feeders.map(
						(c) => [c.id, `${c.label || 'Unlabelled'} (${c.ratingA} A, position ${c.position})`] as const,
					)}
					setValueAs={(v) => (v === '' ? null : v)}
				/>
			) : (
				<div />
			)}
			<SelectField
				form={form}
				name="voltageSystem"
				id="panel-voltageSystem"
				label="Voltage system"
				options={optionsOf(VOLTAGE_SYSTEMS, (v) => VOLTAGE_LABELS[v])}
			/>
			<NumberField form={form} name="busRatingA" id="panel-busRatingA" label="Bus rating (A)" whole />
			<SelectField
				form={form}
				name="mainBreakerA"
				id="panel-mainBreakerA"
				label="Main breaker"
				empty="None (main-lug)"
				options={optionsOf(
					BREAKER_RATINGS_A.filter((a) => a >= 30 && a <= 800),
					(a) => `${a} A`,
				)}
				setValueAs={(v) => (v === '' ? null : Number(v))}
			/>
			<NumberField form={form} name="spaces" id="panel-spaces" label="Spaces" whole />
			<div className="sm:col-span-2 lg:col-span-4">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					{isSubmitting ? 'Adding…' : 'Add the panelboard'}
				</button>
			</div>
		</form>
	);
}
