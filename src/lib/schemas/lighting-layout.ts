import { z } from 'zod';
import { recessedLayoutInputSchema } from '../electrical';

/** A recessed-light layout kept for the permit packet: a name, the room, and the engine's layout input. */
export const lightingLayoutInputSchema = z.strictObject({
	title: z
		.string({ error: 'must be text' })
		.trim()
		.min(1, { error: 'Give the layout a name, e.g. “Kitchen recessed lights”.' })
		.max(200, { error: 'must be at most 200 characters' }),
	roomId: z.uuid({ error: 'choose one of this job’s rooms' }).nullable().default(null),
	input: recessedLayoutInputSchema,
});
export type LightingLayoutInput = z.input<typeof lightingLayoutInputSchema>;
export type LightingLayoutValues = z.infer<typeof lightingLayoutInputSchema>;
