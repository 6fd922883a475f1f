import { z } from 'zod';
import { WORKFLOW_ACTIONS } from '../workflow/status';

/** The longest note a contractor may give on one finding, and on the submission. */
export const EXPLANATION_MAX = 1000;
export const SUBMISSION_NOTE_MAX = 2000;

/** The contractor's note on one error-level finding left in the submission. */
export const explanationSchema = z.strictObject({
	findingKey: z
		.string({ error: 'Name the finding this note explains.' })
		.trim()
		.min(1, { error: 'Name the finding this note explains.' })
		.max(300, { error: 'A finding key is at most 300 characters.' }),
	note: z
		.string({ error: 'The explanation must be text.' })
		.trim()
		.min(1, { error: 'Explain why this finding is left as it is, or fix it first.' })
		.max(EXPLANATION_MAX, { error: `An explanation is at most ${EXPLANATION_MAX} characters.` }),
});
export type Explanation = z.infer<typeof explanationSchema>;

/** What "Submit for review" and "Resubmit" send. */
export const submissionSchema = z.strictObject({
	explanations: z
		.array(explanationSchema, { error: 'Explanations are a list.' })
		.max(500, { error: 'At most 500 explanations.' })
		.default([])
		.refine((list) => new Set(list.map((e) => e.findingKey)).size === list.length, {
			error: 'Each finding is explained once.',
		}),
	note: z
		.string({ error: 'The note must be text.' })
		.trim()
		.max(SUBMISSION_NOTE_MAX, {
			error: `The note to the reviewer is at most ${SUBMISSION_NOTE_MAX} characters.`,
		})
		.default(''),
});
export type Submission = z.infer<typeof submissionSchema>;

/** The moves the simple transitions endpoint makes; the others have their own endpoints. */
export const SIMPLE_ACTIONS = ['withdraw', 'start-review', 'close'] as const;

/** What POST /api/jobs/[id]/transitions takes. */
export const transitionSchema = z.strictObject({
	action: z.enum(WORKFLOW_ACTIONS, { error: `Choose a move: ${WORKFLOW_ACTIONS.join(', ')}.` }),
	note: z
		.string({ error: 'The note must be text.' })
		.trim()
		.max(EXPLANATION_MAX, { error: `A note is at most ${EXPLANATION_MAX} characters.` })
		.default(''),
});
export type TransitionInput = z.infer<typeof transitionSchema>;
