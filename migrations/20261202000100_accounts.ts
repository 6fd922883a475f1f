import type { Knex } from 'knex';

/** Accounts: people, contractor firms and their members, jurisdictions and their inspectors,
 * properties with their homeowners, site administrators, and the sign-in attempt log. */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('users', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.string('email', 254).notNullable();
		t.string('name', 120).notNullable();
		t.string('password_hash', 100).notNullable();
		t.timestamps(true, true);
	});
	await knex.raw('CREATE UNIQUE INDEX users_email_lower_unique ON users (lower(email))');

	await knex.schema.createTable('firms', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.string('name', 160).notNullable();
		t.string('licence_number', 60).notNullable();
		t.string('phone', 40);
		t.string('address', 300);
		t.timestamps(true, true);
	});

	await knex.schema.createTable('firm_members', (t) => {
		t.uuid('firm_id').notNullable().references('firms.id').onDelete('CASCADE');
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.string('member_role', 10).notNullable().defaultTo('member');
		t.timestamps(true, true);
		t.primary(['firm_id', 'user_id']);
		t.index(['user_id']);
	});
	await knex.raw(
		"ALTER TABLE firm_members ADD CONSTRAINT firm_members_role_check CHECK (member_role IN ('owner', 'member'))",
	);

	await knex.schema.createTable('jurisdictions', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.string('name', 160).notNullable().unique();
		t.string('code_edition', 4).notNullable().defaultTo('2023');
		t.string('address', 300);
		t.timestamps(true, true);
	});
	await knex.raw(
		"ALTER TABLE jurisdictions ADD CONSTRAINT jurisdictions_edition_check CHECK (code_edition IN ('2017', '2020', '2023'))",
	);

	await knex.schema.createTable('jurisdiction_inspectors', (t) => {
		t.uuid('jurisdiction_id').notNullable().references('jurisdictions.id').onDelete('CASCADE');
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamps(true, true);
		t.primary(['jurisdiction_id', 'user_id']);
		t.index(['user_id']);
	});

	await knex.schema.createTable('properties', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.string('address', 300).notNullable();
		t.uuid('jurisdiction_id').references('jurisdictions.id').onDelete('SET NULL');
		t.timestamps(true, true);
	});

	await knex.schema.createTable('property_owners', (t) => {
		t.uuid('property_id').notNullable().references('properties.id').onDelete('CASCADE');
		t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
		t.timestamps(true, true);
		t.primary(['property_id', 'user_id']);
		t.index(['user_id']);
	});

	await knex.schema.createTable('site_administrators', (t) => {
		t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
		t.timestamps(true, true);
	});

	await knex.schema.createTable('sign_in_attempts', (t) => {
		t.bigIncrements('id');
		t.string('email', 254).notNullable();
		t.string('ip', 64).notNullable();
		t.boolean('succeeded').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['email', 'created_at']);
		t.index(['ip', 'created_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const table of [
		'sign_in_attempts',
		'site_administrators',
		'property_owners',
		'properties',
		'jurisdiction_inspectors',
		'jurisdictions',
		'firm_members',
		'firms',
		'users',
	]) {
		await knex.schema.dropTableIfExists(table);
	}
}
