import type { z } from 'zod';
import { loadFieldsSchema } from '../electrical/schema';
import { patchOf, roomIdsSchema, uuidSchema, versionSchema } from './common';

const loadFields = loadFieldsSchema.omit({ id: true, circuitId: true }).extend({
	roomIds: roomIdsSchema.default([]),
});

/** Exactly one of va, watts, hp; spaceHeating only on heating loads (the engine's rules, same messages). */
function loadRules(
	load: {
		va?: number | null;
		watts?: number | null;
		hp?: string | null;
		kind?: string;
		spaceHeating?: string | null;
	},
	ctx: z.RefinementCtx,
) {
	const given = [load.va, load.watts, load.hp].filter((v) => v !== undefined && v !== null).length;
	if (given !== 1) {
		ctx.addIssue({
			code: 'custom',
			path: given === 0 ? ['va'] : [],
			message:
				given === 0
					? 'give the rating: one of va, watts or hp'
					: 'give only one of va, watts or hp, not several',
		});
	}
	if (load.spaceHeating !== null && load.spaceHeating !== undefined && load.kind !== 'hvac-heat') {
		ctx.addIssue({
			code: 'custom',
			path: ['spaceHeating'],
			message: "applies only to loads of kind 'hvac-heat'",
		});
	}
}

/** What the load form sends (the engine's load without its id and circuit, which the URL gives). */
export const loadInputSchema = loadFields.superRefine(loadRules);
export type LoadInput = z.infer<typeof loadInputSchema>;

/** A partial load; the merged record is checked with loadInputSchema before it is written. */
export const loadPatchSchema = patchOf(loadFields);
export type LoadPatch = z.infer<typeof loadPatchSchema>;

/**
 * One load of a circuit saved together with its loads: the whole load (checked like loadInputSchema),
 * with the saved load's `id` and the `version` last read, or neither for a new load.
 */
export const circuitLoadItemSchema = loadFields
	.extend({ id: uuidSchema.optional(), version: versionSchema.optional() })
	.superRefine((load, ctx) => {
		loadRules(load, ctx);
		if (load.id !== undefined && load.version === undefined)
			ctx.addIssue({
				code: 'custom',
				path: ['version'],
				message: 'send the version you last read with the id of a saved load',
			});
		if (load.id === undefined && load.version !== undefined)
			ctx.addIssue({ code: 'custom', path: ['id'], message: 'a version needs the id of the saved load' });
	});
export type CircuitLoadItem = z.infer<typeof circuitLoadItemSchema>;
