import { useFormContext } from 'react-hook-form';
import type { z } from 'zod';
import { EDITIONS, VOLTAGE_SYSTEMS } from '../../lib/electrical/schema';
import { STANDARD_RATINGS_A } from '../../lib/electrical/tables';
import { JOB_STATUSES, JOB_STATUS_LABELS, type jobCreateSchema } from '../../lib/schemas/job';
import { NumberField, optionsOf, SelectField, TextAreaField, TextField } from '../ui/fields';

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
	'status',
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
] as const satisfies readonly (keyof JobFieldValues)[];

interface Props {
	/** Prefix of the controls' ids, so that two forms on one page do not clash. */
	idPrefix: string;
	/** The status is set on an existing job; a new one starts as a draft. */
	withStatus?: boolean;
}

/** The job's own fields, used by the new-job form and the job details form (inside their FormProvider). */
export default function JobFields({ idPrefix, withStatus = false }: Props) {
	const form = useFormContext<JobFieldValues>();
	const id = (name: keyof JobFieldValues) => `${idPrefix}-${name}`;
	return (
		<>
			<TextField
				form={form}
				name="name"
				id={id('name')}
				label="Job name"
				hint="What your crew calls it, e.g. “Kitchen remodel, Penhallow”."
			/>
			{withStatus && (
				<SelectField
					form={form}
					name="status"
					id={id('status')}
					label="Status"
					options={optionsOf(JOB_STATUSES, (s) => JOB_STATUS_LABELS[s])}
				/>
			)}
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
			<TextField form={form} name="permitNumber" id={id('permitNumber')} label="Permit number" />
			<div className="sm:col-span-2">
				<TextAreaField form={form} name="scopeOfWork" id={id('scopeOfWork')} label="Scope of work" />
			</div>
		</>
	);
}
