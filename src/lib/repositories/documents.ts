import type { Knex } from 'knex';
import type { FirmInfo, JurisdictionInfo } from '../documents/types';

/** The firm as its documents name it. */
export async function firmForDocuments(knex: Knex, firmId: string): Promise<FirmInfo> {
	const row = await knex('firms').where({ id: firmId }).first('name', 'licence_number', 'phone', 'address');
	return {
		name: row?.name ?? '',
		licenceNumber: row?.licence_number ?? '',
		phone: row?.phone ?? null,
		address: row?.address ?? null,
	};
}

/** The jurisdiction as the documents name it, or null. */
export async function jurisdictionForDocuments(
	knex: Knex,
	jurisdictionId: string | null,
): Promise<JurisdictionInfo | null> {
	if (!jurisdictionId) return null;
	const row = await knex('jurisdictions').where({ id: jurisdictionId }).first('name', 'address');
	return row ? { name: row.name, address: row.address ?? null } : null;
}

/**
 * The revision printed on documents of the live job: the draft of its next submission (rev 1 before
 * the first). A submitted revision's own packet is stored with it and printed "rev N".
 */
export async function documentRevision(
	knex: Knex,
	jobId: string,
): Promise<{ revision: number; draft: true }> {
	const row = await knex('jobs').where({ id: jobId }).first('current_revision');
	return { revision: Number(row?.current_revision ?? 0) + 1, draft: true };
}

/** The jobs at a property, newest change first (a homeowner's home may have had several jobs). */
export async function jobsAtProperty(
	knex: Knex,
	propertyId: string,
): Promise<{ id: string; name: string; updatedAt: string; firmName: string }[]> {
	const rows = await knex('jobs as j')
		.join('firms as f', 'f.id', 'j.firm_id')
		.where({ 'j.property_id': propertyId })
		.whereNull('j.deleted_at')
		.orderBy([{ column: 'j.updated_at', order: 'desc' }, { column: 'j.id' }])
		.select('j.id', 'j.name', 'j.updated_at', 'f.name as firm_name');
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		updatedAt: new Date(r.updated_at).toISOString(),
		firmName: r.firm_name,
	}));
}
