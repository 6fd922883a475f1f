import { z } from 'zod';
import { EDITIONS } from '../electrical/schema';

const cents = (what: string) =>
	z
		.number({ error: `${what} must be a number of cents.` })
		.int({ error: `${what} is a whole number of cents.` })
		.min(0, { error: `${what} cannot be negative.` })
		.max(100_000_000, { error: `${what} is at most 1,000,000.00.` });

/** The documents a jurisdiction asks for in a permit packet. */
export const requiredDocumentsSchema = z.strictObject({
	/** A panel schedule for every panel (always printed in the packet; the readiness check needs a circuit on each). */
	panelSchedules: z.boolean({ error: 'Say whether panel schedules are required.' }).default(true),
	/** A load calculation when the service or a feeder changes. */
	loadCalculation: z.boolean({ error: 'Say whether a load calculation is required.' }).default(true),
	/** At least one floor-plan sketch. */
	sketch: z.boolean({ error: 'Say whether a sketch is required.' }).default(false),
});
export type RequiredDocuments = z.infer<typeof requiredDocumentsSchema>;

/** Local amendments expressed as the engine's rule options (only where the engine has an option). */
export const amendmentsSchema = z.strictObject({
	/** Apply the GFCI list (210.8(A)) of this edition instead of the adopted one. */
	gfciEdition: z.enum(EDITIONS, { error: 'Choose 2017, 2020 or 2023.' }).nullable().default(null),
	/** Apply the AFCI list (210.12) of this edition instead of the adopted one. */
	afciEdition: z.enum(EDITIONS, { error: 'Choose 2017, 2020 or 2023.' }).nullable().default(null),
});
export type Amendments = z.infer<typeof amendmentsSchema>;

/**
 * A permit number pattern: literal text with {YYYY} (the year of approval) and {SEQ:n} (the next
 * number of the jurisdiction, n digits, counted per year when the pattern has {YYYY}).
 */
export const permitPatternSchema = z
	.string({ error: 'The permit number pattern must be text.' })
	.trim()
	.min(1, { error: 'Give a permit number pattern, e.g. E{YYYY}-{SEQ:5}.' })
	.max(60, { error: 'The permit number pattern is at most 60 characters.' })
	.regex(/\{SEQ:[1-9]\}/, { error: 'The pattern needs {SEQ:n} (n from 1 to 9) for the running number.' })
	.regex(/^(?:[A-Za-z0-9 ./_-]|\{YYYY\}|\{SEQ:[1-9]\})+$/, {
		error: 'Use letters, digits, spaces, . / _ - and the fields {YYYY} and {SEQ:n} only.',
	});

/** The jurisdiction settings form, as its administrator edits it (fees in cents). */
export const jurisdictionSettingsSchema = z.strictObject({
	version: z.number({ error: 'The version is a number.' }).int().min(1),
	codeEdition: z.enum(EDITIONS, { error: 'Choose the adopted NEC edition: 2017, 2020 or 2023.' }),
	feeBaseCents: cents('The base fee'),
	feePerCircuitCents: cents('The fee per circuit'),
	feePerPanelCents: cents('The fee per panel'),
	feeServiceChangeCents: cents('The service change fee'),
	requiredDocuments: requiredDocumentsSchema,
	amendments: amendmentsSchema,
	permitNumberPattern: permitPatternSchema,
});
export type JurisdictionSettings = z.infer<typeof jurisdictionSettingsSchema>;
