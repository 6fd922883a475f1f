import { z } from 'zod';
import { JOB_STATUSES, QUEUE_STATUSES, type JobStatus } from '../workflow/status';
import { uuidSchema } from './common';

const body = (what: string) =>
	z
		.string({ error: `${what} must be text.` })
		.trim()
		.min(1, { error: `Write ${what.toLowerCase()}.` })
		.max(4000, { error: `${what} is at most 4,000 characters.` });

const fraction = (axis: string) =>
	z
		.number({ error: `The point's ${axis} is a number from 0 to 1.` })
		.min(0, { error: `The point's ${axis} is at least 0 (the page's edge).` })
		.max(1, { error: `The point's ${axis} is at most 1 (the page's edge).` });

/** Where a review comment points: a sheet of the packet (and a point on it), a panel, a circuit, or the whole job. */
export const COMMENT_TARGETS = ['sheet', 'panel', 'circuit', 'job'] as const;
export type CommentTarget = (typeof COMMENT_TARGETS)[number];

/**
 * A new review comment, as the reviewer writes it on the review screen. The point is a fraction of
 * the page (0..1 from the left and from the top), so it sits at the same place at any zoom.
 */
export const reviewCommentSchema = z
	.strictObject({
		revision: z
			.int({ error: 'The revision is a whole number.' })
			.min(1, { error: 'The revision is 1 or more.' })
			.optional(),
		targetKind: z.enum(COMMENT_TARGETS, {
			error: 'Pin the comment to a sheet, a panel, a circuit or the job.',
		}),
		sheet: z
			.int({ error: 'The sheet is a whole number.' })
			.min(1, { error: 'Sheets are numbered from 1.' })
			.max(2000, { error: 'The packet has at most 2,000 sheets.' })
			.optional(),
		point: z.strictObject({ x: fraction('x'), y: fraction('y') }).optional(),
		panelId: uuidSchema.optional(),
		circuitId: uuidSchema.optional(),
		body: body('The comment'),
	})
	.superRefine((c, ctx) => {
		if (c.targetKind === 'sheet' && c.sheet === undefined)
			ctx.addIssue({ code: 'custom', path: ['sheet'], message: 'Choose the sheet the comment is about.' });
		if (c.targetKind !== 'sheet' && (c.sheet !== undefined || c.point !== undefined))
			ctx.addIssue({
				code: 'custom',
				path: ['sheet'],
				message: 'Only a sheet comment has a sheet and a point.',
			});
		if (c.targetKind === 'panel' && !c.panelId)
			ctx.addIssue({ code: 'custom', path: ['panelId'], message: 'Choose the panel the comment is about.' });
		if (c.targetKind === 'circuit' && !c.circuitId)
			ctx.addIssue({
				code: 'custom',
				path: ['circuitId'],
				message: 'Choose the circuit the comment is about.',
			});
	});
export type ReviewCommentInput = z.infer<typeof reviewCommentSchema>;

export const COMMENT_ACTIONS = ['reply', 'addressed', 'resolved', 'reopened'] as const;
export type CommentAction = (typeof COMMENT_ACTIONS)[number];

/** While the plan review runs, threads take answers and status changes; after the decision to approve they are closed. */
export const THREAD_OPEN_STATUSES: readonly JobStatus[] = [
	'submitted',
	'in-review',
	'corrections',
	'resubmitted',
];

export const COMMENT_STATUSES = ['open', 'addressed', 'resolved'] as const;
export type CommentStatus = (typeof COMMENT_STATUSES)[number];

export const COMMENT_STATUS_LABELS: Record<CommentStatus, string> = {
	open: 'Open',
	addressed: 'Addressed by the contractor',
	resolved: 'Resolved',
};

/** One entry in a comment's thread: an answer, or a change of its status with optional words. */
export const commentEntrySchema = z
	.strictObject({
		action: z.enum(COMMENT_ACTIONS, { error: 'Choose reply, addressed, resolved or reopened.' }),
		body: z
			.string({ error: 'The text must be text.' })
			.trim()
			.max(4000, { error: 'The text is at most 4,000 characters.' })
			.default(''),
	})
	.superRefine((e, ctx) => {
		if (e.action === 'reply' && e.body === '')
			ctx.addIssue({ code: 'custom', path: ['body'], message: 'Write the answer.' });
	});
export type CommentEntryInput = z.infer<typeof commentEntrySchema>;

/** The reviewer's decision on the revision in review. */
export const reviewDecisionSchema = z.strictObject({
	decision: z.enum(['approve', 'request-corrections'], { error: 'Choose approve or request corrections.' }),
	note: z
		.string({ error: 'The note must be text.' })
		.trim()
		.max(4000, { error: 'The note is at most 4,000 characters.' })
		.default(''),
});
export type ReviewDecisionInput = z.infer<typeof reviewDecisionSchema>;

/** The inspector queue's query: a status filter and a page. */
export const queueQuerySchema = z.strictObject({
	status: z
		.enum(JOB_STATUSES, { error: 'Choose one of the queue statuses.' })
		.refine((s) => QUEUE_STATUSES.includes(s), { error: 'Choose one of the queue statuses.' })
		.optional(),
	page: z.coerce
		.number({ error: 'The page is a number.' })
		.int({ error: 'The page is a whole number.' })
		.min(1, { error: 'Pages start at 1.' })
		.max(10_000, { error: 'The page is at most 10,000.' })
		.default(1),
});
export type QueueQuery = z.infer<typeof queueQuerySchema>;
