import { z } from 'zod';
import { roomSchema } from '../electrical/schema';
import { patchOf } from './common';

/**
 * What the room form sends (the engine's room without its id). An empty or missing area is worded
 * for the form; the engine's own limits on the number still apply.
 */
export const roomInputSchema = roomSchema.omit({ id: true }).extend({
	areaFt2: z.number({ error: 'Enter the floor area in square feet.' }).pipe(roomSchema.shape.areaFt2),
});
export type RoomInput = z.infer<typeof roomInputSchema>;

export const roomPatchSchema = patchOf(roomInputSchema);
export type RoomPatch = z.infer<typeof roomPatchSchema>;
