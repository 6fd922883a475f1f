import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, type Control, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { api, ApiError } from '../../lib/client/api-client';
import { EDITIONS } from '../../lib/electrical/schema';
import type { JurisdictionSettingsRecord } from '../../lib/repositories/jurisdictions';
import { jurisdictionSettingsSchema } from '../../lib/schemas/jurisdiction';
import { feeFor, formatCents, parseDollars, sampleFeeJob } from '../../lib/workflow/fees';
import { formatPermitNumber } from '../../lib/workflow/permit-number';
import FormField, { fieldAria } from '../auth/FormField';
import { formErrorMessage } from '../jobs/form-helpers';
import { errorOf, SelectField, TextField } from '../ui/fields';
import Notice from '../ui/Notice';

type Input = z.input<typeof jurisdictionSettingsSchema>;
type Output = z.output<typeof jurisdictionSettingsSchema>;
type MoneyName = 'feeBaseCents' | 'feePerCircuitCents' | 'feePerPanelCents' | 'feeServiceChangeCents';

const FIELDS = [
	'codeEdition',
	'feeBaseCents',
	'feePerCircuitCents',
	'feePerPanelCents',
	'feeServiceChangeCents',
	'requiredDocuments',
	'amendments',
	'permitNumberPattern',
] as const;

const MONEY: [MoneyName, string, string][] = [
	['feeBaseCents', 'Base permit fee', 'Charged once for every permit.'],
	[
		'feePerCircuitCents',
		'Per new or modified circuit',
		'Branch circuits and feeders marked new or modified.',
	],
	['feePerPanelCents', 'Per panel', 'Each panelboard in the job, main and sub.'],
	['feeServiceChangeCents', 'Service change', 'When the job installs or changes the service.'],
];

/** What each edition's lists change, so the administrator sees what an amendment does in the checks. */
const GFCI_NOTES: Record<(typeof EDITIONS)[number], string> = {
	'2017':
		'125 V, 15 and 20 A receptacles only; unfinished basements; kitchen receptacles serving countertops.',
	'2020': '125 V to 250 V receptacles; every basement; kitchen receptacles serving countertops.',
	'2023': '125 V to 250 V receptacles; every basement; every kitchen receptacle.',
};
const AFCI_NOTES: Record<(typeof EDITIONS)[number], string> = {
	'2017': '15 and 20 A, 120 V branch circuits in the listed rooms (210.12(A)).',
	'2020': '15 and 20 A, 120 V branch circuits in the listed rooms (210.12(A)).',
	'2023': '10, 15 and 20 A, 120 V branch circuits in the listed rooms (210.12(B)).',
};

const dollars = (cents: unknown) => (typeof cents === 'number' ? formatCents(cents).replace(/,/g, '') : '');

function valuesOf(s: JurisdictionSettingsRecord): Input {
	return {
		version: s.version,
		codeEdition: s.codeEdition,
		feeBaseCents: s.feeBaseCents,
		feePerCircuitCents: s.feePerCircuitCents,
		feePerPanelCents: s.feePerPanelCents,
		feeServiceChangeCents: s.feeServiceChangeCents,
		requiredDocuments: { ...s.requiredDocuments },
		amendments: { ...s.amendments },
		permitNumberPattern: s.permitNumberPattern,
	};
}

/** A money box: the administrator types dollars and cents, the form holds whole cents. */
function MoneyField({
	control,
	name,
	label,
	hint,
	disabled,
}: {
	control: Control<Input, unknown, Output>;
	name: MoneyName;
	label: string;
	hint: string;
	disabled: boolean;
}) {
	const id = `js-${name}`;
	return (
		<Controller
			control={control}
			name={name}
			render={({ field, fieldState }) => (
				<MoneyInput
					id={id}
					label={label}
					hint={hint}
					disabled={disabled}
					cents={field.value}
					// The schema's message speaks of cents; what the person typed was dollars.
					error={
						fieldState.error
							? typeof field.value === 'number'
								? fieldState.error.message
								: 'Enter dollars and cents, e.g. 125.00 (up to 1,000,000.00).'
							: undefined
					}
					onChange={(text) => field.onChange(parseDollars(text) ?? text)}
					onBlur={field.onBlur}
				/>
			)}
		/>
	);
}

function MoneyInput(props: {
	id: string;
	label: string;
	hint: string;
	disabled: boolean;
	cents: unknown;
	error?: string;
	onChange: (text: string) => void;
	onBlur: () => void;
}) {
	const [text, setText] = useState(() => dollars(props.cents));
	// A reload puts new cents in the form: show them.
	const [seen, setSeen] = useState(props.cents);
	if (seen !== props.cents) {
		setSeen(props.cents);
		if (typeof props.cents === 'number' && parseDollars(text) !== props.cents) setText(dollars(props.cents));
	}
	return (
		<FormField id={props.id} label={props.label} hint={props.hint} error={props.error}>
			<div className="flex items-center gap-1">
				<span aria-hidden="true" className="text-ink-500">
					$
				</span>
				<input
					{...fieldAria(props.id, props.error, props.hint)}
					inputMode="decimal"
					className="field-input"
					value={text}
					disabled={props.disabled}
					onChange={(e) => {
						setText(e.target.value);
						props.onChange(e.target.value);
					}}
					onBlur={() => {
						const cents = parseDollars(text);
						if (cents !== null) setText(dollars(cents));
						props.onBlur();
					}}
				/>
			</div>
		</FormField>
	);
}

function Checkbox({
	form,
	name,
	label,
	disabled,
}: {
	form: ReturnType<typeof useForm<Input, unknown, Output>>;
	name: FieldPath<Input>;
	label: string;
	disabled: boolean;
}) {
	return (
		<label className="flex items-start gap-2 text-sm">
			<input type="checkbox" className="mt-1" {...form.register(name)} disabled={disabled} />
			<span>{label}</span>
		</label>
	);
}

interface Props {
	settings: JurisdictionSettingsRecord;
	canEdit: boolean;
}

/** A jurisdiction's settings: adopted edition, fee schedule with an example, required documents, amendments, permit numbers. */
export default function JurisdictionSettingsForm({ settings: initial, canEdit }: Props) {
	const [settings, setSettings] = useState(initial);
	const [message, setMessage] = useState<string | null>(null);
	const [saved, setSaved] = useState(false);
	const [conflict, setConflict] = useState<JurisdictionSettingsRecord | null>(null);
	const [sample, setSample] = useState({ circuits: 8, panels: 2, serviceChange: true });
	const form = useForm<Input, unknown, Output>({
		resolver: zodResolver(jurisdictionSettingsSchema),
		values: valuesOf(settings),
	});
	const { handleSubmit, setError, watch, control } = form;
	const disabled = !canEdit;

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		setSaved(false);
		setConflict(null);
		try {
			const res = await api<{ settings: JurisdictionSettingsRecord }>(
				`/api/jurisdictions/${settings.id}/settings`,
				{ method: 'PATCH', body: values },
			);
			setSettings(res.settings);
			setSaved(true);
		} catch (err) {
			if (err instanceof ApiError && err.status === 409) {
				setConflict((err.current as JurisdictionSettingsRecord) ?? null);
				return;
			}
			setMessage(formErrorMessage(err, setError, FIELDS));
		}
	});

	const w = watch();
	const cents = (v: unknown) => (typeof v === 'number' && Number.isInteger(v) ? v : 0);
	const fee = feeFor(
		{
			feeBaseCents: cents(w.feeBaseCents),
			feePerCircuitCents: cents(w.feePerCircuitCents),
			feePerPanelCents: cents(w.feePerPanelCents),
			feeServiceChangeCents: cents(w.feeServiceChangeCents),
		},
		sampleFeeJob(sample.circuits, sample.panels, sample.serviceChange),
	);
	const year = new Date().getFullYear();
	const patternOk = jurisdictionSettingsSchema.shape.permitNumberPattern.safeParse(
		w.permitNumberPattern ?? '',
	);
	const editionOptions = EDITIONS.map((e) => [e, `NEC ${e}`] as const);
	const adopted = w.codeEdition ?? settings.codeEdition;
	const amendmentOptions = EDITIONS.filter((e) => e !== adopted).map(
		(e) => [e, `The NEC ${e} list instead`] as const,
	);
	const nullIfEmpty = (v: unknown) => (v === '' || v === null || v === undefined ? null : v);

	return (
		<form onSubmit={onSubmit} noValidate className="space-y-6" data-testid="jurisdiction-settings">
			{!canEdit && (
				<Notice tone="info">
					You can read these settings. Only the jurisdiction’s administrators change them.
				</Notice>
			)}
			<fieldset disabled={disabled} className="space-y-6">
				<section className="panel-card">
					<h2 className="text-lg font-bold">Adopted code</h2>
					<div className="mt-3 max-w-xs">
						<SelectField
							form={form}
							name="codeEdition"
							id="js-codeEdition"
							label="Adopted NEC edition"
							hint="New jobs filed here default to this edition."
							options={editionOptions}
						/>
					</div>
				</section>
			</fieldset>
			<section className="panel-card">
				<h2 className="text-lg font-bold">Permit fees</h2>
				<fieldset disabled={disabled} className="mt-3 grid gap-4 sm:grid-cols-2">
					{MONEY.map(([name, label, hint]) => (
						<MoneyField
							key={name}
							control={control}
							name={name}
							label={label}
							hint={hint}
							disabled={disabled}
						/>
					))}
				</fieldset>
				{/* The example is not a setting: anyone who reads the schedule may try it. */}
				<div className="mt-5 rounded-md border border-ink-200 bg-ink-50 p-4" data-testid="fee-example">
					<h3 className="font-semibold">Example: what a permit would cost</h3>
					<div className="mt-2 flex flex-wrap items-end gap-4 text-sm">
						<label className="flex flex-col">
							<span className="text-ink-600">New or modified circuits</span>
							<input
								type="number"
								min={0}
								max={500}
								className="field-input w-24"
								value={sample.circuits}
								onChange={(e) => setSample({ ...sample, circuits: clampCount(e.target.value, 500) })}
							/>
						</label>
						<label className="flex flex-col">
							<span className="text-ink-600">Panels</span>
							<input
								type="number"
								min={0}
								max={20}
								className="field-input w-20"
								value={sample.panels}
								onChange={(e) => setSample({ ...sample, panels: clampCount(e.target.value, 20) })}
							/>
						</label>
						<label className="flex items-center gap-2">
							<input
								type="checkbox"
								checked={sample.serviceChange}
								onChange={(e) => setSample({ ...sample, serviceChange: e.target.checked })}
							/>
							<span>The service changes</span>
						</label>
					</div>
					<table className="mt-3 w-full max-w-lg text-sm">
						<tbody>
							{fee.lines.map((l) => (
								<tr key={l.key} className="border-b border-ink-100">
									<td className="py-1">{l.label}</td>
									<td className="py-1 text-right text-ink-600">
										{l.quantity} × ${formatCents(l.unitCents)}
									</td>
									<td className="py-1 text-right font-semibold">${formatCents(l.amountCents)}</td>
								</tr>
							))}
							<tr>
								<td className="py-1 font-bold" colSpan={2}>
									Total
								</td>
								<td className="py-1 text-right font-bold" data-testid="fee-total">
									${formatCents(fee.totalCents)}
								</td>
							</tr>
						</tbody>
					</table>
				</div>
			</section>

			<fieldset disabled={disabled} className="space-y-6">
				<section className="panel-card">
					<h2 className="text-lg font-bold">Documents required in a packet</h2>
					<p className="mt-1 text-sm text-ink-600">
						The readiness check asks for these before a job is submitted.
					</p>
					<div className="mt-3 space-y-2">
						<Checkbox
							form={form}
							name="requiredDocuments.panelSchedules"
							label="A panel schedule for every panel, with at least one circuit on each"
							disabled={disabled}
						/>
						<Checkbox
							form={form}
							name="requiredDocuments.loadCalculation"
							label="A load calculation when the service or a feeder changes"
							disabled={disabled}
						/>
						<Checkbox
							form={form}
							name="requiredDocuments.sketch"
							label="At least one floor-plan sketch"
							disabled={disabled}
						/>
					</div>
				</section>

				<section className="panel-card">
					<h2 className="text-lg font-bold">Local amendments the checks apply</h2>
					<p className="mt-1 text-sm text-ink-600">
						Where this jurisdiction keeps another edition’s GFCI or AFCI list, the checks of every job filed
						here follow it and cite it as a local amendment. Other amendments are not checked: the plan
						reviewer applies them.
					</p>
					<div className="mt-3 grid gap-4 sm:grid-cols-2">
						<div>
							<SelectField
								form={form}
								name="amendments.gfciEdition"
								id="js-gfciEdition"
								label="GFCI list (210.8(A))"
								empty={`As adopted (NEC ${adopted})`}
								options={amendmentOptions}
								setValueAs={nullIfEmpty}
							/>
							<p className="mt-1 text-sm text-ink-500">{GFCI_NOTES[w.amendments?.gfciEdition ?? adopted]}</p>
						</div>
						<div>
							<SelectField
								form={form}
								name="amendments.afciEdition"
								id="js-afciEdition"
								label="AFCI list (210.12)"
								empty={`As adopted (NEC ${adopted})`}
								options={amendmentOptions}
								setValueAs={nullIfEmpty}
							/>
							<p className="mt-1 text-sm text-ink-500">{AFCI_NOTES[w.amendments?.afciEdition ?? adopted]}</p>
						</div>
					</div>
				</section>

				<section className="panel-card">
					<h2 className="text-lg font-bold">Permit numbers</h2>
					<div className="mt-3 grid gap-4 sm:grid-cols-2">
						<TextField
							form={form}
							name="permitNumberPattern"
							id="js-permitNumberPattern"
							label="Permit number pattern"
							hint="{YYYY} is the year of approval, {SEQ:n} the running number with n digits (counted per year when the pattern has {YYYY})."
						/>
						<div className="text-sm" data-testid="permit-preview">
							<p className="field-label">Preview</p>
							{patternOk.success ? (
								<p>
									First permit of {year}:{' '}
									<strong className="font-mono">{formatPermitNumber(patternOk.data, year, 1)}</strong>
									<br />
									The 42nd:{' '}
									<strong className="font-mono">{formatPermitNumber(patternOk.data, year, 42)}</strong>
								</p>
							) : (
								<p className="text-ink-500">
									{errorOf(form, 'permitNumberPattern') ?? patternOk.error.issues[0]?.message}
								</p>
							)}
						</div>
					</div>
				</section>
			</fieldset>

			{message && <Notice tone="error">{message}</Notice>}
			{saved && <Notice tone="ok">The settings are saved.</Notice>}
			{conflict && (
				<Notice tone="caution">
					<p className="font-semibold">Someone else changed these settings</p>
					<p className="mt-1">Nothing was saved. Load the current settings, then make your change again.</p>
					<button
						type="button"
						className="btn-quiet mt-3"
						onClick={() => {
							setSettings(conflict);
							setConflict(null);
						}}
					>
						Load the current settings
					</button>
				</Notice>
			)}
			{canEdit && (
				<button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
					{form.formState.isSubmitting ? 'Saving…' : 'Save the settings'}
				</button>
			)}
		</form>
	);
}

function clampCount(text: string, max: number): number {
	const n = Math.floor(Number(text));
	return Number.isFinite(n) ? Math.min(Math.max(n, 0), max) : 0;
}
