import type { z } from 'zod';
import { panelSchema } from '../electrical/schema';
import { patchOf, uuidSchema } from './common';

/** What the panel form sends (the engine's panelboard without its id; the feeder is a circuit id). */
export const panelInputSchema = panelSchema.omit({ id: true }).extend({
	fedFromCircuitId: uuidSchema.nullable().default(null),
});
export type PanelInput = z.infer<typeof panelInputSchema>;

export const panelPatchSchema = patchOf(panelInputSchema);
export type PanelPatch = z.infer<typeof panelPatchSchema>;
