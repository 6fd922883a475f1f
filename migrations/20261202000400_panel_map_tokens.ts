import type { Knex } from 'knex';

/**
 * Links to a home's panel map (the QR code on the directory card). The token itself is not stored:
 * its SHA-256 finds the row, and a copy sealed with the app's secret lets the contractor see and
 * print the link again. Revoked rows stay for the record; one live link per job.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('panel_map_tokens', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.string('token_hash', 64).notNullable().unique();
		t.text('token_sealed').notNullable();
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('revoked_at', { useTz: true });
		t.uuid('revoked_by').references('users.id').onDelete('SET NULL');
		t.index(['job_id']);
	});
	await knex.raw(
		`ALTER TABLE panel_map_tokens ADD CONSTRAINT panel_map_tokens_hash_check CHECK (token_hash ~ '^[0-9a-f]{64}$')`,
	);
	await knex.raw(
		'CREATE UNIQUE INDEX panel_map_tokens_one_live ON panel_map_tokens (job_id) WHERE revoked_at IS NULL',
	);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('panel_map_tokens');
}
