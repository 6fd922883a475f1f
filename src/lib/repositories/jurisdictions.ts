import type { Knex } from 'knex';
import type { RuleOptions } from '../electrical/schema';
import {
	amendmentsSchema,
	requiredDocumentsSchema,
	type JurisdictionSettings,
} from '../schemas/jurisdiction';
import { bump, inTransaction, lockVersion } from './versioned';

/** A jurisdiction's settings as its administrators edit them, with its id and name. */
export interface JurisdictionSettingsRecord extends JurisdictionSettings {
	id: string;
	name: string;
}

const NO_OPTIONS: RuleOptions = { gfciEdition: null, afciEdition: null };

function settingsFromRow(r: Record<string, unknown>): JurisdictionSettingsRecord {
	// Stored jsonb may predate a field: the schemas' defaults fill it in.
	const docs = requiredDocumentsSchema.safeParse(r.required_documents ?? {});
	const amendments = amendmentsSchema.safeParse(r.amendments ?? {});
	return {
		id: r.id as string,
		name: r.name as string,
		version: Number(r.version),
		codeEdition: r.code_edition as JurisdictionSettings['codeEdition'],
		feeBaseCents: Number(r.fee_base_cents),
		feePerCircuitCents: Number(r.fee_per_circuit_cents),
		feePerPanelCents: Number(r.fee_per_panel_cents),
		feeServiceChangeCents: Number(r.fee_service_change_cents),
		requiredDocuments: docs.success ? docs.data : requiredDocumentsSchema.parse({}),
		amendments: amendments.success ? amendments.data : { ...NO_OPTIONS },
		permitNumberPattern: r.permit_number_pattern as string,
	};
}

/** A jurisdiction's settings, or null when there is no such jurisdiction. */
export async function getJurisdictionSettings(
	knex: Knex,
	id: string,
): Promise<JurisdictionSettingsRecord | null> {
	const row = await knex('jurisdictions').where({ id }).first();
	return row ? settingsFromRow(row) : null;
}

/**
 * Saves a jurisdiction's settings when `input.version` is the current one (409 with the current
 * settings otherwise) and returns them with the next version.
 */
export async function updateJurisdictionSettings(
	knex: Knex,
	id: string,
	input: JurisdictionSettings,
): Promise<JurisdictionSettingsRecord> {
	return inTransaction(knex, async (trx) => {
		await lockVersion(
			trx,
			'jurisdictions',
			id,
			input.version,
			() => getJurisdictionSettings(trx, id),
			'jurisdiction',
		);
		await trx('jurisdictions')
			.where({ id })
			.update({
				code_edition: input.codeEdition,
				fee_base_cents: input.feeBaseCents,
				fee_per_circuit_cents: input.feePerCircuitCents,
				fee_per_panel_cents: input.feePerPanelCents,
				fee_service_change_cents: input.feeServiceChangeCents,
				required_documents: JSON.stringify(input.requiredDocuments),
				amendments: JSON.stringify(input.amendments),
				permit_number_pattern: input.permitNumberPattern,
				...bump(trx),
			});
		return (await getJurisdictionSettings(trx, id))!;
	});
}

/** The engine's rule options from a jurisdiction's local amendments (none without a jurisdiction). */
export async function ruleOptionsForJurisdiction(knex: Knex, id: string | null): Promise<RuleOptions> {
	if (!id) return { ...NO_OPTIONS };
	const row = await knex('jurisdictions').where({ id }).first('amendments');
	const parsed = amendmentsSchema.safeParse(row?.amendments ?? {});
	return parsed.success ? parsed.data : { ...NO_OPTIONS };
}
