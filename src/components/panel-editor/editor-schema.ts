import { z } from 'zod';
import { circuitInputSchema } from '../../lib/schemas/circuit';
import { loadInputSchema } from '../../lib/schemas/load';

/** One row of the loads table: the shared load schema, with the saved record's id and version when it exists. */
export const loadRowSchema = z.object({
	record: z.object({ id: z.string(), version: z.number() }).nullable(),
	load: loadInputSchema,
});

/** The circuit form: the shared circuit schema and its loads, each checked by the shared load schema. */
export const circuitFormSchema = circuitInputSchema.extend({ loads: z.array(loadRowSchema) });
export type CircuitFormInput = z.input<typeof circuitFormSchema>;
export type CircuitFormValues = z.output<typeof circuitFormSchema>;
export type LoadRowInput = z.input<typeof loadRowSchema>;
