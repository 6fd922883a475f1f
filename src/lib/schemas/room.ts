import type { z } from 'zod';
import { roomSchema } from '../electrical/schema';
import { patchOf } from './common';

/** What the room form sends (the engine's room without its id). */
export const roomInputSchema = roomSchema.omit({ id: true });
export type RoomInput = z.infer<typeof roomInputSchema>;

export const roomPatchSchema = patchOf(roomInputSchema);
export type RoomPatch = z.infer<typeof roomPatchSchema>;
