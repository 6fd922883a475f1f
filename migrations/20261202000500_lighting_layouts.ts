import type { Knex } from 'knex';

/** Recessed-light layouts kept with a job so that the permit packet can draw them to scale. */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('lighting_layouts', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.uuid('room_id').references('rooms.id').onDelete('SET NULL');
		t.string('title', 200).notNullable();
		// The engine's layout input (recessedLayoutInputSchema), validated before it is written.
		t.jsonb('input').notNullable();
		t.uuid('created_by').references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['job_id', 'created_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('lighting_layouts');
}
