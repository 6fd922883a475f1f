import type { Knex } from 'knex';
import type { Edition } from '../electrical/types';

/** A jurisdiction as the job forms offer it: the AHJ a permit is filed with. */
export interface JurisdictionChoice {
	id: string;
	name: string;
	/** The NEC edition the jurisdiction has adopted: the job's default edition. */
	codeEdition: Edition;
}

/** Every jurisdiction on the installation, by name (a short list: one per AHJ served). */
export async function listJurisdictionChoices(knex: Knex): Promise<JurisdictionChoice[]> {
	const rows = await knex('jurisdictions').orderBy('name').limit(1000).select('id', 'name', 'code_edition');
	return rows.map((r) => ({ id: r.id, name: r.name, codeEdition: r.code_edition }));
}
