import { z } from 'zod';

/** The two site inspections after a permit is issued. */
export const INSPECTION_KINDS = ['rough-in', 'final'] as const;
export type InspectionKind = (typeof INSPECTION_KINDS)[number];

export const INSPECTION_KIND_LABELS: Record<InspectionKind, string> = {
	'rough-in': 'Rough-in inspection',
	final: 'Final inspection',
};

export const INSPECTION_STATUSES = ['requested', 'scheduled', 'passed', 'failed', 'cancelled'] as const;
export type InspectionStatus = (typeof INSPECTION_STATUSES)[number];

export const INSPECTION_STATUS_LABELS: Record<InspectionStatus, string> = {
	requested: 'Requested',
	scheduled: 'Scheduled',
	passed: 'Passed',
	failed: 'Failed',
	cancelled: 'Cancelled',
};

export const MAX_PREFERRED_DATES = 3;
export const MAX_CORRECTION_ITEMS = 50;

/** Today's calendar date (UTC) as YYYY-MM-DD; dates are compared as text in this form. */
export function todayIso(now = new Date()): string {
	return now.toISOString().slice(0, 10);
}

/** The last date an inspection may be asked for or set: one year from today. */
export function lastBookableIso(now = new Date()): string {
	const d = new Date(Date.UTC(now.getUTCFullYear() + 1, now.getUTCMonth(), now.getUTCDate()));
	return d.toISOString().slice(0, 10);
}

const isRealDate = (s: string) => {
	const d = new Date(`${s}T00:00:00Z`);
	return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
};

/** A calendar date from today to one year ahead, written YYYY-MM-DD. */
export const bookableDateSchema = z
	.string({ error: 'Give the date as YYYY-MM-DD.' })
	.regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Give the date as YYYY-MM-DD.' })
	.refine(isRealDate, { error: 'That is not a date on the calendar.' })
	.refine((s) => s >= todayIso(), { error: 'The date is in the past; choose today or a later day.' })
	.refine((s) => s <= lastBookableIso(), { error: 'Choose a date within one year from today.' });

const note = (what: string) =>
	z
		.string({ error: `${what} must be text.` })
		.trim()
		.max(4000, { error: `${what} is at most 4,000 characters.` })
		.default('');

/** The contractor's request for a rough-in or final inspection. */
export const inspectionRequestSchema = z.strictObject({
	kind: z.enum(INSPECTION_KINDS, { error: 'Choose a rough-in or a final inspection.' }),
	preferredDates: z
		.array(bookableDateSchema, { error: 'Give one to three preferred dates.' })
		.min(1, { error: 'Give at least one preferred date.' })
		.max(MAX_PREFERRED_DATES, { error: 'Give at most three preferred dates.' })
		.refine((d) => new Set(d).size === d.length, { error: 'Each preferred date once, please.' }),
	note: note('The note'),
});
export type InspectionRequestInput = z.infer<typeof inspectionRequestSchema>;

/** The inspector's date for the visit. */
export const inspectionScheduleSchema = z.strictObject({
	scheduledFor: bookableDateSchema,
});
export type InspectionScheduleInput = z.infer<typeof inspectionScheduleSchema>;

const itemText = z
	.string({ error: 'A correction item must be text.' })
	.trim()
	.min(1, { error: 'Write the correction item, or remove the empty line.' })
	.max(4000, { error: 'A correction item is at most 4,000 characters.' });

/** The inspector's result: pass, or fail with the correction items the contractor must answer. */
export const inspectionResultSchema = z
	.strictObject({
		result: z.enum(['pass', 'fail'], { error: 'Choose pass or fail.' }),
		notes: note('The notes'),
		items: z
			.array(itemText, { error: 'Correction items are a list of texts.' })
			.max(MAX_CORRECTION_ITEMS, { error: `At most ${MAX_CORRECTION_ITEMS} correction items.` })
			.default([]),
	})
	.superRefine((r, ctx) => {
		if (r.result === 'fail' && r.items.length === 0)
			ctx.addIssue({
				code: 'custom',
				path: ['items'],
				message: 'A failed inspection lists at least one correction item.',
			});
		if (r.result === 'pass' && r.items.length > 0)
			ctx.addIssue({
				code: 'custom',
				path: ['items'],
				message: 'A passed inspection has no correction items.',
			});
	});
export type InspectionResultInput = z.infer<typeof inspectionResultSchema>;

/** The contractor's answer to one correction item. */
export const inspectionItemAnswerSchema = z.strictObject({
	answer: z
		.string({ error: 'The answer must be text.' })
		.trim()
		.min(1, { error: 'Write what was corrected.' })
		.max(4000, { error: 'The answer is at most 4,000 characters.' }),
});
export type InspectionItemAnswerInput = z.infer<typeof inspectionItemAnswerSchema>;

/** A photo's caption, sent beside the files of an upload. */
export const inspectionPhotoFieldsSchema = z.strictObject({
	caption: z
		.string({ error: 'The caption must be text.' })
		.trim()
		.max(200, { error: 'A caption is at most 200 characters.' })
		.default(''),
});
