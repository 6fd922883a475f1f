import { z } from 'zod';

const caption = z
	.string({ error: 'The caption must be text.' })
	.trim()
	.max(200, { error: 'A caption is at most 200 characters.' });

// A form sends "" for "no room"; the API takes null for the same.
const roomId = z.preprocess(
	(v) => (v === '' ? null : v),
	z.uuid({ error: 'Choose a room from the list (or none).' }).nullable(),
);

/** What an upload may say about its files besides the files themselves. */
export const sketchFieldsSchema = z.object({
	caption: caption.optional().default(''),
	roomId: roomId.optional().default(null),
});
export type SketchFields = z.infer<typeof sketchFieldsSchema>;

/** A change to a sketch's caption or room, with the version the editor last saw. */
export const sketchUpdateSchema = z.object({
	caption: caption.optional(),
	roomId: roomId.optional(),
	version: z.number({ error: 'The version of the sketch you edited is missing.' }).int().positive(),
});
export type SketchUpdate = z.infer<typeof sketchUpdateSchema>;
