import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { jobCreateSchema } from '../../lib/schemas/job';
import { SelectField } from '../ui/fields';
import Notice from '../ui/Notice';
import { formErrorMessage } from './form-helpers';
import JobFields, { JOB_FIELD_NAMES } from './JobFields';

type Input = z.input<typeof jobCreateSchema>;
type Output = z.output<typeof jobCreateSchema>;

// A new job starts as a draft; the server owns the status and the permit number.
const FIELDS = ['firmId', ...JOB_FIELD_NAMES];

interface Props {
	firms: { id: string; name: string }[];
	onCreated: (job: JobRecord) => void;
}

/** The new-job form; the same schema checks it here and in POST /api/jobs. */
export default function NewJobForm({ firms, onCreated }: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const form = useForm<Input, unknown, Output>({
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
			jurisdictionId: null,
		},
	});

	const {
		handleSubmit,
		setError,
		formState: { isSubmitting },
	} = form;

	const onSubmit = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const { job } = await api<{ job: JobRecord }>('/api/jobs', { method: 'POST', body: values });
			onCreated(job);
		} catch (err) {
			setMessage(formErrorMessage(err, setError, FIELDS));
		}
	});

	return (
		<FormProvider {...form}>
			<form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-2" aria-label="New job">
				{message && (
					<div className="sm:col-span-2">
						<Notice tone="error">{message}</Notice>
					</div>
				)}
				{firms.length > 1 && (
					<SelectField
						form={form}
						name="firmId"
						id="job-firmId"
						label="Firm"
						empty="Choose the firm…"
						options={firms.map((f) => [f.id, f.name] as const)}
					/>
				)}
				<JobFields idPrefix="job" editionFollowsJurisdiction />
				<div className="sm:col-span-2">
					<button type="submit" className="btn-primary" disabled={isSubmitting}>
						{isSubmitting ? 'Creating…' : 'Create the job'}
					</button>
				</div>
			</form>
		</FormProvider>
	);
}
