import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { Controller, useForm, type FieldPath } from 'react-hook-form';
import { ApiError, messageOf } from '../../lib/client/api-client';
import type { RoomRecord } from '../../lib/client/job-tree';
import type { CircuitResult } from '../../lib/electrical';
import { num } from '../../lib/electrical/format';
import { BREAKER_TYPES } from '../../lib/electrical/schema';
import { BREAKER_RATINGS_A, CONDUCTOR_SIZES } from '../../lib/electrical/tables';
import { BREAKER_TYPE_LABELS } from '../../lib/schemas/circuit';
import { applyServerErrors } from '../jobs/form-helpers';
import { TEMPERATURE_OPTIONS } from '../jobs/JobFields';
import { NumberField, optionsOf, SelectField, TextField, type Option } from '../ui/fields';
import Notice from '../ui/Notice';
import SeverityBadge from '../ui/SeverityBadge';
import { circuitFormSchema, type CircuitFormInput, type CircuitFormValues } from './editor-schema';
import LoadsTable from './LoadsTable';
import RoomPicker from './RoomPicker';

const FIELDS = [
	'position',
	'poles',
	'ratingA',
	'breakerType',
	'conductor',
	'lengthFt',
	'label',
	'roomIds',
	'status',
	'gfciAtDevice',
	'afciAtDevice',
	'loads',
] as const;
// The load fields the loads table shows a message beside; other load messages go to the form's notice.
const LOAD_FIELDS_SHOWN = new Set(['description', 'quantity', 'va', 'watts', 'hp', 'voltage']);

/** Splits a server error into the messages for load rows (`loads.2.load.va`) and the rest. */
function splitLoadErrors(err: unknown): { loadErrors: [string, string][]; other: unknown } {
	if (!(err instanceof ApiError)) return { loadErrors: [], other: err };
	const loadErrors: [string, string][] = [];
	const fields: Record<string, string[]> = {};
	for (const [path, msgs] of Object.entries(err.fields)) {
		if (/^loads\.\d+\.load\./.test(path) && msgs[0]) loadErrors.push([path, msgs[0]]);
		else fields[path] = msgs;
	}
	return { loadErrors, other: new ApiError(err.status, err.code, err.message, fields, err.current) };
}

const POLE_OPTIONS: Option[] = [
	[1, '1-pole (120 V)'],
	[2, '2-pole (240 V / 208 V)'],
	[3, '3-pole'],
];

interface Props {
	title: string;
	initial: CircuitFormInput;
	isNew: boolean;
	rooms: RoomRecord[];
	result: CircuitResult | null;
	conflict: React.ReactNode;
	onDraft: (values: CircuitFormInput) => void;
	/** Told whether the form differs from the saved circuit, so that leaving it can ask first. */
	onDirty?: (dirty: boolean) => void;
	onSave: (values: CircuitFormValues) => Promise<void>;
	onDelete?: () => void;
	onClose: () => void;
	moveControl?: React.ReactNode;
}

/** The selected breaker's circuit and its loads, checked by the shared schemas as you type. */
export default function CircuitEditor({
	title,
	initial,
	isNew,
	rooms,
	result,
	conflict,
	onDraft,
	onDirty,
	onSave,
	onDelete,
	onClose,
	moveControl,
}: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const [saved, setSaved] = useState(false);
	const headingRef = useRef<HTMLHeadingElement>(null);
	const form = useForm<CircuitFormInput, unknown, CircuitFormValues>({
		resolver: zodResolver(circuitFormSchema),
		defaultValues: initial,
		mode: 'onChange',
	});
	const { register, handleSubmit, setError, control, watch, setValue, formState } = form;
	const { errors, isSubmitting, isDirty } = formState;

	useEffect(() => {
		headingRef.current?.focus();
	}, []);
	useEffect(() => {
		onDirty?.(isDirty);
	}, [isDirty, onDirty]);
	useEffect(() => {
		onDraft(form.getValues());
		const sub = watch((values) => {
			setSaved(false);
			onDraft(values as CircuitFormInput);
		});
		return () => sub.unsubscribe();
	}, [watch]);

	const submit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			await onSave(values);
			setSaved(true);
		} catch (err) {
			const { loadErrors, other } = splitLoadErrors(err);
			for (const [path, msg] of loadErrors)
				setError(path as FieldPath<CircuitFormInput>, { type: 'server', message: msg });
			const rest = applyServerErrors(other, setError, FIELDS);
			const unshown = loadErrors
				.filter(([path]) => !LOAD_FIELDS_SHOWN.has(path.split('.')[3] ?? ''))
				.map(
					([path, msg]) =>
						`Load ${Number(path.split('.')[1]) + 1} (${path.split('.').slice(3).join('.')}): ${msg}`,
				);
			setMessage([messageOf(err), ...rest, ...unshown].join(' '));
		}
	});

	const e = (path: string): string | undefined => {
		let node: unknown = errors;
		for (const part of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[part];
		return (node as { message?: string } | undefined)?.message;
	};
	const poles = watch('poles');

	return (
		<form
			onSubmit={submit}
			noValidate
			aria-labelledby="circuit-editor-title"
			className="space-y-4"
			data-testid="circuit-editor"
		>
			<div className="flex flex-wrap items-start justify-between gap-2">
				<h2
					id="circuit-editor-title"
					ref={headingRef}
					tabIndex={-1}
					className="text-lg font-bold text-ink-950"
				>
					{title}
				</h2>
				<button type="button" className="btn-quiet px-2 py-1 text-xs" onClick={onClose}>
					Close
				</button>
			</div>
			{conflict}
			{message && <Notice tone="error">{message}</Notice>}
			{saved && !isDirty && <Notice tone="ok">Saved.</Notice>}

			{result && (
				<div className="rounded-md bg-ink-50 p-3 text-sm" data-testid="circuit-figures">
					<dl className="grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-3">
						<div title={`${result.connectedVA.rule}: ${result.connectedVA.working}`}>
							<dt className="text-xs text-ink-500">Connected load</dt>
							<dd className="font-mono font-semibold">{num(result.connectedVA.value)} VA</dd>
						</div>
						<div title={`${result.breakerLoadA.rule}: ${result.breakerLoadA.working}`}>
							<dt className="text-xs text-ink-500">Load on the breaker</dt>
							<dd className="font-mono font-semibold" data-testid="breaker-load">
								{num(result.breakerLoadA.value, 1)} A of {result.breakerA.value} A
							</dd>
						</div>
						<div title={result.voltageDrop.percent.working}>
							<dt className="text-xs text-ink-500">Voltage drop</dt>
							<dd className="font-mono font-semibold">{num(result.voltageDrop.percent.value, 2)} %</dd>
						</div>
					</dl>
					<p className="mt-1 font-mono text-xs text-ink-600">
						{result.breakerLoadA.working}{' '}
						<span className="text-copper-700">({result.breakerLoadA.rule})</span>
					</p>
					{result.findings.filter((f) => f.severity !== 'ok').length > 0 && (
						<ul className="mt-2 space-y-1" data-testid="circuit-findings">
							{result.findings
								.filter((f) => f.severity !== 'ok')
								.map((f, i) => (
									<li key={`${f.code}-${i}`} className="flex items-start gap-2">
										<SeverityBadge severity={f.severity} />
										<span>
											{f.message} <span className="text-xs text-copper-700">{f.rule}</span>
										</span>
									</li>
								))}
						</ul>
					)}
				</div>
			)}

			<div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
				<div className="sm:col-span-2 lg:col-span-3">
					<TextField
						form={form}
						name="label"
						id="c-label"
						label="Label (circuit directory, 408.4(A))"
						placeholder="Kitchen counter receptacles, east"
					/>
				</div>
				<SelectField
					form={form}
					name="ratingA"
					id="c-ratingA"
					label="Breaker rating"
					options={optionsOf(
						BREAKER_RATINGS_A.filter((a) => a <= 200),
						(a) => `${a} A`,
					)}
					numeric
				/>
				<SelectField
					form={form}
					name="poles"
					id="c-poles"
					label="Poles"
					options={POLE_OPTIONS}
					numeric
					disabled={!isNew}
				/>
				<SelectField
					form={form}
					name="breakerType"
					id="c-breakerType"
					label="Breaker type"
					options={optionsOf(BREAKER_TYPES, (t) => BREAKER_TYPE_LABELS[t])}
				/>
				<SelectField
					form={form}
					name="conductor.size"
					id="c-size"
					label="Conductor size (AWG)"
					options={optionsOf(CONDUCTOR_SIZES, (s) => `${s} AWG`)}
				/>
				<SelectField
					form={form}
					name="conductor.material"
					id="c-material"
					label="Conductor material"
					options={[
						['cu', 'Copper'],
						['al', 'Aluminum'],
					]}
				/>
				<SelectField
					form={form}
					name="conductor.insulationC"
					id="c-insulation"
					label="Insulation rating"
					options={TEMPERATURE_OPTIONS}
					numeric
				/>
				<NumberField form={form} name="lengthFt" id="c-lengthFt" label="One-way length (ft)" />
				<SelectField
					form={form}
					name="status"
					id="c-status"
					label="Status"
					options={[
						['existing', 'Existing'],
						['new', 'New'],
						['modified', 'Modified'],
						['removed', 'Removed'],
					]}
				/>
				<div className="flex flex-col justify-end gap-1 text-sm">
					<label className="inline-flex items-center gap-2">
						<input type="checkbox" {...register('gfciAtDevice')} className="h-4 w-4 accent-copper-600" /> GFCI
						at the first outlet
					</label>
					<label className="inline-flex items-center gap-2">
						<input type="checkbox" {...register('afciAtDevice')} className="h-4 w-4 accent-copper-600" /> AFCI
						at the first outlet
					</label>
				</div>
			</div>

			<Controller
				control={control}
				name="roomIds"
				render={({ field }) => (
					<RoomPicker
						id="c-rooms"
						legend="Rooms served"
						rooms={rooms}
						value={field.value ?? []}
						onChange={field.onChange}
					/>
				)}
			/>
			{e('roomIds') && <p className="field-error">{e('roomIds')}</p>}

			<div>
				<h3 className="mb-2 font-semibold text-ink-900">Loads</h3>
				<LoadsTable
					control={control}
					register={register}
					watch={watch}
					setValue={setValue}
					errors={errors}
					rooms={rooms}
					defaultVoltage={Number(poles) > 1 ? 240 : 120}
				/>
			</div>

			<div className="flex flex-wrap items-center gap-2 border-t border-ink-100 pt-3">
				<button type="submit" className="btn-primary" disabled={isSubmitting}>
					{isSubmitting ? 'Saving…' : isNew ? 'Add the breaker' : 'Save the circuit'}
				</button>
				{onDelete && (
					<button type="button" className="btn-quiet text-signal-violation" onClick={onDelete}>
						Delete the breaker…
					</button>
				)}
			</div>
			{moveControl}
		</form>
	);
}
