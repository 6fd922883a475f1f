import type { Knex } from 'knex';
import type { CurrentUser, Role } from '../roles';
import { AppError } from '../errors';
import { hashPassword } from '../passwords';
import type { SignUp } from '../schemas/account';

export interface UserRow {
	id: string;
	email: string;
	name: string;
	password_hash: string;
}

/** Finds a user by e-mail, case-insensitively. */
export async function findUserByEmail(knex: Knex, email: string): Promise<UserRow | undefined> {
	return knex<UserRow>('users').whereRaw('lower(email) = lower(?)', [email]).first();
}

/** Loads a user with the roles and links that decide what they may reach. */
export async function loadCurrentUser(knex: Knex, userId: string): Promise<CurrentUser | null> {
	const user = await knex<UserRow>('users').where({ id: userId }).first('id', 'email', 'name');
	if (!user) return null;
	const [firms, jurisdictions, properties, admin] = await Promise.all([
		knex('firm_members as m')
			.join('firms as f', 'f.id', 'm.firm_id')
			.where('m.user_id', userId)
			.orderBy('f.name')
			.select('f.id', 'f.name', 'm.member_role as memberRole'),
		knex('jurisdiction_inspectors as ji')
			.join('jurisdictions as j', 'j.id', 'ji.jurisdiction_id')
			.where('ji.user_id', userId)
			.orderBy('j.name')
			.select('j.id', 'j.name', 'ji.staff_role as staffRole'),
		knex('property_owners').where({ user_id: userId }).pluck('property_id'),
		knex('site_administrators').where({ user_id: userId }).first('user_id'),
	]);
	const roles: Role[] = [];
	if (firms.length) roles.push('contractor');
	if (properties.length) roles.push('homeowner');
	if (jurisdictions.length) roles.push('inspector');
	if (admin) roles.push('administrator');
	return {
		id: user.id,
		email: user.email,
		name: user.name,
		roles,
		firms,
		jurisdictions,
		propertyIds: properties,
	};
}

/** Creates a contractor firm and its owner in one transaction; a taken e-mail is a 409 on the email field. */
export async function createFirmWithOwner(
	knex: Knex,
	input: SignUp,
): Promise<{ userId: string; firmId: string }> {
	const passwordHash = await hashPassword(input.password);
	return knex.transaction(async (trx) => {
		const taken = await findUserByEmail(trx, input.email);
		if (taken) {
			throw new AppError('conflict', 'An account with this e-mail already exists. Sign in instead.', {
				fields: { email: ['An account with this e-mail already exists.'] },
			});
		}
		const [user] = await trx('users')
			.insert({ email: input.email, name: input.name, password_hash: passwordHash })
			.returning('id');
		const [firm] = await trx('firms')
			.insert({ name: input.firmName, licence_number: input.licenceNumber })
			.returning('id');
		await trx('firm_members').insert({ firm_id: firm.id, user_id: user.id, member_role: 'owner' });
		return { userId: user.id as string, firmId: firm.id as string };
	});
}

export interface FirmView {
	id: string;
	name: string;
	licenceNumber: string;
	phone: string | null;
	address: string | null;
	members: { id: string; name: string; email: string; memberRole: 'owner' | 'member' }[];
}

/** A firm with its members, for the contractor start page and the firm API. */
export async function getFirm(knex: Knex, firmId: string): Promise<FirmView | null> {
	const firm = await knex('firms')
		.where({ id: firmId })
		.first('id', 'name', 'licence_number as licenceNumber', 'phone', 'address');
	if (!firm) return null;
	const members = await knex('firm_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.firm_id', firmId)
		.orderBy([{ column: 'm.member_role', order: 'desc' }, 'u.name'])
		.select('u.id', 'u.name', 'u.email', 'm.member_role as memberRole');
	return { ...firm, members };
}

/** Jurisdictions with their inspectors' names, for an inspector's start page. */
export async function getJurisdictions(knex: Knex, ids: string[]) {
	if (!ids.length) return [];
	const rows = await knex('jurisdictions')
		.whereIn('id', ids)
		.orderBy('name')
		.select('id', 'name', 'code_edition as codeEdition', 'address');
	const inspectors = await knex('jurisdiction_inspectors as ji')
		.join('users as u', 'u.id', 'ji.user_id')
		.whereIn('ji.jurisdiction_id', ids)
		.orderBy('u.name')
		.select('ji.jurisdiction_id as jurisdictionId', 'u.name');
	return rows.map((j) => ({
		...j,
		inspectors: inspectors.filter((i) => i.jurisdictionId === j.id).map((i) => i.name as string),
	}));
}

/** The properties a homeowner is linked to, with their jurisdiction. */
export async function getProperties(knex: Knex, ids: string[]) {
	if (!ids.length) return [];
	return knex('properties as p')
		.leftJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
		.whereIn('p.id', ids)
		.orderBy('p.address')
		.select('p.id', 'p.address', 'j.name as jurisdictionName');
}

/** Counts and lists for the administrator's start page. */
export async function getAdminOverview(knex: Knex) {
	const [firms, jurisdictions, users] = await Promise.all([
		knex('firms as f')
			.leftJoin('firm_members as m', 'm.firm_id', 'f.id')
			.groupBy('f.id')
			.orderBy('f.name')
			.select(
				'f.id',
				'f.name',
				'f.licence_number as licenceNumber',
				knex.raw('count(m.user_id)::int as "memberCount"'),
			),
		knex('jurisdictions as j')
			.leftJoin('jurisdiction_inspectors as ji', 'ji.jurisdiction_id', 'j.id')
			.groupBy('j.id')
			.orderBy('j.name')
			.select(
				'j.id',
				'j.name',
				'j.code_edition as codeEdition',
				knex.raw('count(ji.user_id)::int as "inspectorCount"'),
			),
		knex('users').orderBy('name').select('id', 'name', 'email', 'created_at as createdAt'),
	]);
	return { firms, jurisdictions, users };
}
