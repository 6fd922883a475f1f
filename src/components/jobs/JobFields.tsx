import { useEffect } from 'react';
import { useFormContext } from 'react-hook-form';
import type { z } from 'zod';
import { api } from '../../lib/client/api-client';
import { useResource } from '../../lib/client/use-resource';
import { EDITIONS, VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { STANDARD_RATINGS_A } from '../../lib/electrical/tables';
import type { JurisdictionChoice } from '../../lib/repositories/jurisdiction-choices';
import type { jobCreateSchema } from '../../lib/schemas/job';
import FormField, { fieldAria } from '../auth/FormField';
import { errorOf, NumberField, optionsOf, SelectField, TextAreaField, TextField } from '../ui/fields';

export const VOLTAGE_LABELS: Record<(typeof VOLTAGE_SYSTEMS)[number], string> = {
	'120/240-1ph-3w': '120/240 V single-phase 3-wire',
	'208Y/120-3ph-4w': '208Y/120 V three-phase 4-wire',
};
export const SERVICE_RATINGS = STANDARD_RATINGS_A.filter((a) => a >= 60 && a <= 600);
/** Conductor and terminal temperature ratings (NEC 110.14(C), Table 310.16 columns). */
export const TEMPERATURE_OPTIONS = optionsOf([60, 75, 90], (t) => `${t} °C`);

/** The job fields both job forms share (the create and the edit schema name them alike). */
export type JobFieldValues = Omit<z.input<typeof jobCreateSchema>, 'firmId'>;

/** Names of the fields JobFields shows, for putting the server's messages on them. */
export const JOB_FIELD_NAMES = [
	'name',
	'address',
	'homeownerName',
	'homeownerEmail',
	'jurisdictionId',
	'codeEdition',
	'serviceRatingA',
	'voltageSystem',
	'terminalTemperatureC',
	'floorAreaFt2',
	'existingPeakDemandKW',
	'scopeOfWork',
] as const satisfies readonly (keyof JobFieldValues)[];

interface Props {
	/** Prefix of the controls' ids, so that two forms on one page do not clash. */
	idPrefix: string;
	/** On a new job, choosing the jurisdiction also sets the edition to the one it has adopted. */
	editionFollowsJurisdiction?: boolean;
	/** After the first submission the jurisdiction stays: its revisions went to it. */
	jurisdictionLocked?: boolean;
}

/**
 * The job's own fields, used by the new-job form and the job details form (inside their FormProvider).
 * The status and the permit number are not here: the server sets them along the permit workflow.
 */
export default function JobFields({
	idPrefix,
	editionFollowsJurisdiction = false,
	jurisdictionLocked = false,
}: Props) {
	const form = useFormContext<JobFieldValues>();
	const id = (name: keyof JobFieldValues) => `${idPrefix}-${name}`;
	const choices = useResource(
		() => api<{ jurisdictions: JurisdictionChoice[] }>('/api/jurisdictions').then((r) => r.jurisdictions),
		'jurisdictions',
	);
	// The options arrive after the form's values: show the job's jurisdiction once they are there.
	useEffect(() => {
		if (choices.data) form.setValue('jurisdictionId', form.getValues('jurisdictionId') ?? null);
	}, [choices.data, form]);
	const jurisdictionError = errorOf(form, 'jurisdictionId');
	const jurisdictionHint = choices.error
		? `The list of jurisdictions did not load (${choices.error}).`
		: jurisdictionLocked
			? 'Fixed since the first submission: its revisions went to this jurisdiction.'
			: 'The AHJ the permit is filed with; its adopted NEC edition is the job’s default.';
	return (
		<>
			<TextField
				form={form}
				name="name"
				id={id('name')}
				label="Job name"
				hint="What your crew calls it, e.g. “Kitchen remodel, Penhallow”."
			/>
			<TextField
				form={form}
				name="address"
				id={id('address')}
				label="Property address"
				autoComplete="street-address"
			/>
			<TextField form={form} name="homeownerName" id={id('homeownerName')} label="Homeowner" />
			<TextField
				form={form}
				name="homeownerEmail"
				id={id('homeownerEmail')}
				label="Homeowner’s e-mail"
				type="email"
			/>
			<FormField
				id={id('jurisdictionId')}
				label="Jurisdiction (AHJ)"
				error={jurisdictionError}
				hint={jurisdictionHint}
			>
				<select
					{...form.register('jurisdictionId', {
						setValueAs: (v: unknown) => (v === '' || v === undefined ? null : v),
						onChange: (e: { target: { value: string } }) => {
							if (!editionFollowsJurisdiction) return;
							const chosen = choices.data?.find((j) => j.id === e.target.value);
							if (chosen) form.setValue('codeEdition', chosen.codeEdition, { shouldValidate: true });
						},
					})}
					{...fieldAria(id('jurisdictionId'), jurisdictionError, jurisdictionHint)}
					className="field-input"
					disabled={jurisdictionLocked}
				>
					<option value="">{choices.loading ? 'Loading the jurisdictions…' : 'Not chosen yet'}</option>
					{(choices.data ?? []).map((j) => (
						<option key={j.id} value={j.id}>
							{j.name} (NEC {j.codeEdition})
						</option>
					))}
				</select>
			</FormField>
			<SelectField
				form={form}
				name="codeEdition"
				id={id('codeEdition')}
				label="NEC edition adopted by the AHJ"
				options={optionsOf(EDITIONS, (ed) => `NEC ${ed}`)}
			/>
			<SelectField
				form={form}
				name="voltageSystem"
				id={id('voltageSystem')}
				label="Service voltage system"
				options={optionsOf(VOLTAGE_SYSTEMS, (v) => VOLTAGE_LABELS[v])}
			/>
			<SelectField
				form={form}
				name="serviceRatingA"
				id={id('serviceRatingA')}
				label="Existing service rating (A)"
				options={optionsOf(SERVICE_RATINGS, (a) => `${a} A`)}
				numeric
			/>
			<SelectField
				form={form}
				name="terminalTemperatureC"
				id={id('terminalTemperatureC')}
				label="Terminal temperature rating (NEC 110.14(C))"
				options={TEMPERATURE_OPTIONS}
				numeric
			/>
			<NumberField
				form={form}
				name="floorAreaFt2"
				id={id('floorAreaFt2')}
				label="Dwelling floor area (ft²)"
				hint="Leave empty to add up the rooms."
				emptyIsNull
			/>
			<NumberField
				form={form}
				name="existingPeakDemandKW"
				id={id('existingPeakDemandKW')}
				label="Measured 12-month peak demand (kW, NEC 220.87)"
				hint="Only when the utility's demand record exists."
				emptyIsNull
			/>
			<div className="sm:col-span-2">
				<TextAreaField form={form} name="scopeOfWork" id={id('scopeOfWork')} label="Scope of work" />
			</div>
		</>
	);
}
