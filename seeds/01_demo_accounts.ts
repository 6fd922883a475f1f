import type { Knex } from 'knex';
import bcrypt from 'bcryptjs';
import { DEMO_ACCOUNTS, DEMO_FIRM, DEMO_JURISDICTION, DEMO_PROPERTIES } from './data/demo-accounts.ts';

/** Demo accounts for the invented scenario: a firm, a jurisdiction, three homes, an administrator. */
export async function seed(knex: Knex): Promise<void> {
	if (process.env.NODE_ENV === 'production' && process.env.AMPLEDGER_ALLOW_DEMO !== '1') {
		throw new Error(
			'The demo seed is not for production databases (set AMPLEDGER_ALLOW_DEMO=1 to override).',
		);
	}
	await knex.transaction(async (trx) => {
		await trx.raw(
			'TRUNCATE site_administrators, property_owners, properties, jurisdiction_inspectors, jurisdictions, firm_members, firms, users, sign_in_attempts CASCADE',
		);
		const ids: Record<keyof typeof DEMO_ACCOUNTS, string> = {} as never;
		for (const [key, a] of Object.entries(DEMO_ACCOUNTS) as [
			keyof typeof DEMO_ACCOUNTS,
			(typeof DEMO_ACCOUNTS)[keyof typeof DEMO_ACCOUNTS],
		][]) {
			const [row] = await trx('users')
				.insert({ email: a.email, name: a.name, password_hash: bcrypt.hashSync(a.password, 10) })
				.returning('id');
			ids[key] = row.id;
		}
		const [firm] = await trx('firms')
			.insert({
				name: DEMO_FIRM.name,
				licence_number: DEMO_FIRM.licenceNumber,
				phone: DEMO_FIRM.phone,
				address: DEMO_FIRM.address,
			})
			.returning('id');
		await trx('firm_members').insert([
			{ firm_id: firm.id, user_id: ids.owner, member_role: 'owner' },
			{ firm_id: firm.id, user_id: ids.electrician, member_role: 'member' },
		]);
		const [jurisdiction] = await trx('jurisdictions')
			.insert({
				name: DEMO_JURISDICTION.name,
				code_edition: DEMO_JURISDICTION.codeEdition,
				address: DEMO_JURISDICTION.address,
				fee_base_cents: DEMO_JURISDICTION.fees.baseCents,
				fee_per_circuit_cents: DEMO_JURISDICTION.fees.perCircuitCents,
				fee_per_panel_cents: DEMO_JURISDICTION.fees.perPanelCents,
				fee_service_change_cents: DEMO_JURISDICTION.fees.serviceChangeCents,
				permit_number_pattern: DEMO_JURISDICTION.permitNumberPattern,
			})
			.returning('id');
		// The demo inspector also administers the jurisdiction's settings.
		await trx('jurisdiction_inspectors').insert({
			jurisdiction_id: jurisdiction.id,
			user_id: ids.inspector,
			staff_role: 'administrator',
		});
		const [home1] = await trx('properties')
			.insert({ address: DEMO_PROPERTIES.penhallow, jurisdiction_id: jurisdiction.id })
			.returning('id');
		const [home2] = await trx('properties')
			.insert({ address: DEMO_PROPERTIES.calderwood, jurisdiction_id: jurisdiction.id })
			.returning('id');
		const [home3] = await trx('properties')
			.insert({ address: DEMO_PROPERTIES.brindle, jurisdiction_id: jurisdiction.id })
			.returning('id');
		await trx('property_owners').insert([
			{ property_id: home1.id, user_id: ids.homeowner },
			{ property_id: home2.id, user_id: ids.homeowner2 },
			{ property_id: home3.id, user_id: ids.homeowner3 },
		]);
		await trx('site_administrators').insert({ user_id: ids.admin });
	});
}
