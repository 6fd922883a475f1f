import type { Knex } from 'knex';

/** The values the audit trail's entity check allows now, read from the database so that this
 * migration adds 'sketch' without restating the list another migration owns. */
async function auditEntities(knex: Knex): Promise<string[]> {
	const { rows } = await knex.raw<{ rows: { def: string }[] }>(
		"SELECT pg_get_constraintdef(oid) AS def FROM pg_constraint WHERE conname = 'audit_entity_check'",
	);
	const def = rows[0]?.def ?? '';
	return [...def.matchAll(/'([a-z_-]+)'/g)].map((m) => m[1]!);
}

async function setAuditEntities(knex: Knex, entities: string[]): Promise<void> {
	const list = entities.map((e) => `'${e}'`).join(', ');
	await knex.raw('ALTER TABLE audit_log DROP CONSTRAINT IF EXISTS audit_entity_check');
	await knex.raw(`ALTER TABLE audit_log ADD CONSTRAINT audit_entity_check CHECK (entity IN (${list}))`);
}

/** Floor-plan sketches uploaded beside a job: the file lives under UPLOADS_DIR/<job id>/<stored name>. */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('sketches', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
		t.uuid('room_id').nullable().references('rooms.id').onDelete('SET NULL');
		t.string('caption', 200).notNullable().defaultTo('');
		t.string('original_name', 255).notNullable();
		t.string('stored_name', 60).notNullable().unique();
		t.string('content_type', 40).notNullable();
		t.integer('size_bytes').notNullable();
		t.string('sha256', 64).notNullable();
		t.integer('width');
		t.integer('height');
		t.integer('page_count');
		t.boolean('has_thumbnail').notNullable().defaultTo(false);
		t.uuid('uploaded_by').nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.integer('version').notNullable().defaultTo(1);
		// Upload order, also between the files of one request (they share created_at).
		t.bigIncrements('seq', { primaryKey: false });
		t.index(['job_id', 'seq']);
		t.index(['room_id']);
	});
	await knex.raw(`
		ALTER TABLE sketches
			ADD CONSTRAINT sketches_size_check CHECK (size_bytes > 0),
			ADD CONSTRAINT sketches_type_check CHECK (content_type IN ('image/png', 'image/jpeg', 'application/pdf')),
			ADD CONSTRAINT sketches_sha256_check CHECK (sha256 ~ '^[0-9a-f]{64}$'),
			ADD CONSTRAINT sketches_stored_name_check CHECK (stored_name ~ '^[0-9a-f-]{36}\\.(png|jpg|pdf)$'),
			ADD CONSTRAINT sketches_dimensions_check CHECK (
				(content_type = 'application/pdf' AND width IS NULL AND height IS NULL)
				OR (content_type <> 'application/pdf' AND width > 0 AND height > 0 AND page_count IS NULL)
			),
			ADD CONSTRAINT sketches_page_count_check CHECK (page_count IS NULL OR page_count > 0),
			ADD CONSTRAINT sketches_version_check CHECK (version > 0)
	`);
	const entities = await auditEntities(knex);
	if (!entities.includes('sketch')) await setAuditEntities(knex, [...entities, 'sketch']);
}

export async function down(knex: Knex): Promise<void> {
	await knex('audit_log').where({ entity: 'sketch' }).delete();
	await setAuditEntities(
		knex,
		(await auditEntities(knex)).filter((e) => e !== 'sketch'),
	);
	await knex.schema.dropTableIfExists('sketches');
}
