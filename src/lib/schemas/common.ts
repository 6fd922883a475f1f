import { z } from 'zod';

/** The version the client last read; a write with an older one is refused with 409. */
export const versionSchema = z
	.int({ error: 'Send the version you last read (a whole number).' })
	.min(1, { error: 'Send the version you last read (1 or more).' });

/** Body of a DELETE: the version the client last read. */
export const deleteSchema = z.strictObject({ version: versionSchema });
export type DeleteInput = z.infer<typeof deleteSchema>;

/** A record id in a URL or a reference field. */
export const uuidSchema = z.uuid({ error: 'must be the id of a record (a UUID)' });

/** Room ids a circuit or load serves: ids of rooms of the same job, each once. */
export const roomIdsSchema = z
	.array(uuidSchema, { error: 'must be a list of room ids' })
	.max(200, { error: 'must list at most 200 rooms' })
	.refine((ids) => new Set(ids).size === ids.length, { error: 'lists a room twice' });

/**
 * A PATCH schema from an entity's input schema: every field optional with no default filled in
 * (a field left out stays as it is), and `version` required.
 */
export function patchOf<Shape extends z.core.$ZodLooseShape>(schema: z.ZodObject<Shape>) {
	const shape: Record<string, z.ZodType> = {};
	for (const [key, field] of Object.entries(schema.shape)) {
		const inner = field instanceof z.ZodDefault ? (field.unwrap() as z.ZodType) : (field as z.ZodType);
		shape[key] = inner.optional();
	}
	return z.strictObject({ ...shape, version: versionSchema }) as unknown as z.ZodObject<
		{ [K in keyof Shape]: z.ZodOptional<z.ZodType<z.output<Shape[K]>, z.input<Shape[K]>>> } & {
			version: typeof versionSchema;
		},
		z.core.$strict
	>;
}
