import { z } from 'zod';
import {
	EDITIONS,
	existingLoadSchema,
	jobSettingsSchema,
	serviceSchema,
	voltageSystemSchema,
} from '../electrical/schema';
import { JOB_STATUSES } from '../workflow/status';
import { patchOf, uuidSchema } from './common';

// The status is the server's: it moves only through the workflow's transitions (src/lib/workflow/status.ts).
export { JOB_STATUSES, JOB_STATUS_LABELS, type JobStatus } from '../workflow/status';

const text = (max: number, what: string) =>
	z
		.string({ error: `${what} must be text.` })
		.trim()
		.max(max, { error: `${what} is at most ${max} characters.` });

/** What the new-job form sends. */
export const jobCreateSchema = z.strictObject({
	firmId: uuidSchema.optional(),
	name: text(200, 'The job name').min(1, { error: 'Give the job a name.' }),
	address: text(300, 'The address').default(''),
	homeownerName: text(120, 'The homeowner’s name').default(''),
	homeownerEmail: z
		.union(
			[z.literal(''), z.email({ error: 'This does not look like an e-mail address (name@example.com).' })],
			{
				error: 'This does not look like an e-mail address (name@example.com).',
			},
		)
		.default(''),
	jurisdictionId: uuidSchema.nullable().default(null),
	codeEdition: z.enum(EDITIONS, { error: 'Choose the NEC edition the AHJ has adopted: 2017, 2020 or 2023.' }),
	scopeOfWork: text(5000, 'The scope of work').default(''),
	serviceRatingA: serviceSchema.shape.ratingA,
	voltageSystem: voltageSystemSchema,
	terminalTemperatureC: jobSettingsSchema.shape.terminalTemperatureC,
	floorAreaFt2: jobSettingsSchema.shape.floorAreaFt2,
	existingPeakDemandKW: existingLoadSchema.shape.peakDemandKW.nullable().default(null),
});
export type JobCreate = z.infer<typeof jobCreateSchema>;

/** What the job settings form sends: any job field, and the version last read. */
export const jobPatchSchema = patchOf(jobCreateSchema.omit({ firmId: true }));
export type JobPatch = z.infer<typeof jobPatchSchema>;

export const JOB_SORTS = ['updated', 'name', 'created', 'status'] as const;

/** The job list's query string. */
export const jobListQuerySchema = z.object({
	q: z.string().trim().max(200, { error: 'Search text is at most 200 characters.' }).default(''),
	status: z.enum(JOB_STATUSES, { error: `Choose a status: ${JOB_STATUSES.join(', ')}.` }).optional(),
	sort: z.enum(JOB_SORTS, { error: `Sort by one of ${JOB_SORTS.join(', ')}.` }).default('updated'),
	page: z.coerce
		.number({ error: 'The page is a whole number.' })
		.int({ error: 'The page is a whole number.' })
		.min(1, { error: 'The page is 1 or more.' })
		.default(1),
	pageSize: z.coerce
		.number({ error: 'The page size is a whole number.' })
		.int({ error: 'The page size is a whole number.' })
		.min(1, { error: 'The page size is 1 or more.' })
		.max(100, { error: 'The page size is at most 100.' })
		.default(25),
});
export type JobListQuery = z.infer<typeof jobListQuerySchema>;
