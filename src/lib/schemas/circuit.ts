import { z } from 'zod';
import { circuitSchema, type BreakerType } from '../electrical/schema';
import { deleteSchema, patchOf, roomIdsSchema, uuidSchema, versionSchema } from './common';
import { circuitLoadItemSchema, loadInputSchema } from './load';

/** How the screens name each breaker type. */
export const BREAKER_TYPE_LABELS: Record<BreakerType, string> = {
	standard: 'Standard',
	afci: 'AFCI',
	gfci: 'GFCI',
	'dual-function': 'Dual-function (AFCI + GFCI)',
	gfpe: 'GFPE (equipment)',
};

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

const loadListSchema = <T extends z.ZodType>(item: T) =>
	z.array(item, { error: 'must be a list of loads' }).max(200, { error: 'must list at most 200 loads' });

/** A new breaker with its loads, written together (POST /api/panels/[id]/circuits). */
export const circuitWithLoadsInputSchema = circuitInputSchema.extend({
	loads: loadListSchema(loadInputSchema).default([]),
});
export type CircuitWithLoadsInput = z.infer<typeof circuitWithLoadsInputSchema>;

/**
 * Saving a circuit and its loads in one go (PUT /api/circuits/[id]/with-loads): the circuit's changed
 * fields and `version`, every load it should keep (saved ones with id and version, new ones without),
 * and the saved loads to delete with the version last read.
 */
export const circuitSaveSchema = circuitPatchSchema
	.extend({
		loads: loadListSchema(circuitLoadItemSchema),
		deleteLoads: z
			.array(deleteSchema.extend({ id: uuidSchema }), { error: 'must be a list of { id, version }' })
			.max(200, { error: 'must list at most 200 loads' })
			.default([]),
	})
	.superRefine((body, ctx) => {
		const seen = new Set<string>();
		body.loads.forEach((l, i) => {
			if (l.id === undefined) return;
			if (seen.has(l.id))
				ctx.addIssue({ code: 'custom', path: ['loads', i, 'id'], message: 'lists this load twice' });
			seen.add(l.id);
		});
		body.deleteLoads.forEach((d, i) => {
			if (seen.has(d.id))
				ctx.addIssue({
					code: 'custom',
					path: ['deleteLoads', i, 'id'],
					message: 'a load cannot be both kept and deleted',
				});
			seen.add(d.id);
		});
	});
export type CircuitSave = z.infer<typeof circuitSaveSchema>;
