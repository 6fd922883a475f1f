import { z } from 'zod';
import { circuitSchema } from '../electrical/schema';
import { patchOf, roomIdsSchema, uuidSchema, versionSchema } from './common';

/** What the circuit form sends (the engine's circuit without its id and panel, which the URL gives). */
export const circuitInputSchema = circuitSchema.omit({ id: true, panelId: true }).extend({
	roomIds: roomIdsSchema.default([]),
	multiwireWith: uuidSchema.nullable().default(null),
});
export type CircuitInput = z.infer<typeof circuitInputSchema>;

export const circuitPatchSchema = patchOf(circuitInputSchema);
export type CircuitPatch = z.infer<typeof circuitPatchSchema>;

/** Moving a breaker to another position of its panel. */
export const circuitMoveSchema = z.strictObject({
	position: circuitSchema.shape.position,
	version: versionSchema,
});
export type CircuitMove = z.infer<typeof circuitMoveSchema>;
